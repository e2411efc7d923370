/**
 * What routes read from the request before calling a service, so services take plain values.
 */
import type { RequestEvent } from '@sveltejs/kit';
import { getDb } from './db';
import { authorize } from './http';
import { ownOrganisation, type Action, type SessionUser } from './policy';
import { lotForAction } from './services/portal';
import type { LotView } from './services/lots';

/** 401 when nobody is signed in, then the lot the signed-in person may do `action` on (403/404). */
export async function requireLot(
	event: Pick<RequestEvent, 'locals'>,
	lotId: string,
	action: Action
): Promise<{ user: SessionUser; lot: LotView }> {
	const user = authorize(event, action, ownOrganisation(event.locals.user));
	return { user, lot: await lotForAction(getDb(), user, lotId, action) };
}
