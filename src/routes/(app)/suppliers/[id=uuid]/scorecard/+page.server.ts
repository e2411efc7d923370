import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { getDb } from '$lib/server/db';
import { orErrorPage } from '$lib/server/action-errors';
import { can } from '$lib/server/policy';
import { supplierScorecard } from '$lib/server/services/scorecards';
import { issuesText } from '$lib/server/http';
import { periodOf, periodQuery } from '$lib/schemas/scorecard';
import type { PageServerLoad } from './$types';

const partParam = z.uuid();

/**
 * The scorecard of a supplier (or of one of its parts, ?part=…) over a period (?period=90d|12m|custom
 * with from and to), computed on the server so its chart renders there.
 */
export const load: PageServerLoad = async ({ locals, params, url }) => {
	if (!can(locals.user, 'scorecard:read')) error(403, 'Your role may not read supplier scorecards');
	const part = url.searchParams.get('part') || undefined;
	if (part && !partParam.safeParse(part).success) error(400, 'The part in the address is not a valid id');
	const parsed = periodQuery.safeParse({
		period: url.searchParams.get('period') || undefined,
		from: url.searchParams.get('from') || undefined,
		to: url.searchParams.get('to') || undefined
	});
	if (!parsed.success) error(400, `The period is not valid — ${issuesText(parsed.error)}`);
	const period = periodOf(parsed.data, new Date());
	return {
		card: await orErrorPage(supplierScorecard(getDb(), params.id, part, period)),
		partId: part ?? '',
		query: { period: parsed.data.period, from: parsed.data.from ?? '', to: parsed.data.to ?? '' }
	};
};
