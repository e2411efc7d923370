/**
 * What routes read from the request before calling a service, so services take plain values.
 */
import type { RequestEvent } from '@sveltejs/kit';
import { getDb } from './db';
import { authorize, notFound } from './http';
import { ownOrganisation, type Action, type SessionUser } from './policy';
import { lotForAction } from './services/portal';
import { getLotForUser, type LotView } from './services/lots';

/** 401 when nobody is signed in, then the lot the signed-in person may do `action` on (403/404). */
export async function requireLot(
	event: Pick<RequestEvent, 'locals'>,
	lotId: string,
	action: Action
): Promise<{ user: SessionUser; lot: LotView }> {
	const user = authorize(event, action, ownOrganisation(event.locals.user));
	return { user, lot: await lotForAction(getDb(), user, lotId, action) };
}

/**
 * The lot behind an /api/v1/lots/{id}/… route, for `action`: 401 when nobody is signed in, 403 when
 * the role may not, 404 for a lot that does not exist or belongs to another supplier; the lot's own
 * supplier is checked again after the lookup, not only the lookup's filter.
 */
export async function visibleLot(
	event: Pick<RequestEvent, 'locals'>,
	lotId: string,
	action: Action
): Promise<{ user: SessionUser; lot: LotView }> {
	const user = authorize(event, action, ownOrganisation(event.locals.user));
	const lot = await getLotForUser(getDb(), user, lotId);
	if (!lot) throw notFound('lot');
	authorize(event, action, { supplierId: lot.supplierId });
	return { user, lot };
}
