import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { getDb } from '$lib/server/db';
import { orErrorPage } from '$lib/server/action-errors';
import { can } from '$lib/server/policy';
import { supplierScorecard } from '$lib/server/services/scorecards';
import type { PageServerLoad } from './$types';

const partParam = z.uuid();

/** The scorecard of a supplier (or of one of its parts, ?part=…), computed on the server so its chart renders there. */
export const load: PageServerLoad = async ({ locals, params, url }) => {
	if (!can(locals.user, 'scorecard:read')) error(403, 'Your role may not read supplier scorecards');
	const part = url.searchParams.get('part') || undefined;
	if (part && !partParam.safeParse(part).success) error(400, 'The part in the address is not a valid id');
	return { card: await orErrorPage(supplierScorecard(getDb(), params.id, part)), partId: part ?? '' };
};
