import { error } from '@sveltejs/kit';
import { getDb } from '$lib/server/db';
import { can } from '$lib/server/policy';
import { issuesText } from '$lib/server/http';
import { compareSuppliers } from '$lib/server/services/scorecards';
import { listParts } from '$lib/server/services/parts';
import { comparisonQuery, periodOf, periodQuery } from '$lib/schemas/scorecard';
import { CHEMISTRY_CODES } from '$lib/electrochem';
import type { PageServerLoad } from './$types';

const param = (url: URL, name: string) => url.searchParams.get(name) || undefined;

/** Suppliers side by side for one chemistry or one part number, over a period (?chemistry= or ?part_number=, ?period=). */
export const load: PageServerLoad = async ({ locals, url }) => {
	if (!can(locals.user, 'scorecard:read')) error(403, 'Your role may not read supplier scorecards');
	const period = periodQuery.safeParse({ period: param(url, 'period'), from: param(url, 'from'), to: param(url, 'to') });
	if (!period.success) error(400, `The period is not valid — ${issuesText(period.error)}`);
	const match = comparisonQuery.safeParse({ chemistry: param(url, 'chemistry'), part_number: param(url, 'part_number') });
	if (!match.success) error(400, `The comparison is not valid — ${issuesText(match.error)}`);
	const db = getDb();
	const { chemistry, part_number } = match.data;
	const asked = !!(chemistry || part_number);
	const range = periodOf(period.data, new Date());
	const partNumbers = [...new Set((await listParts(db)).map((p) => p.partNumber))].sort();
	return {
		rows: asked ? await compareSuppliers(db, { chemistry, partNumber: part_number }, range) : [],
		asked,
		periodLabel: range?.label ?? null,
		query: {
			chemistry: chemistry ?? '',
			part_number: part_number ?? '',
			period: period.data.period,
			from: period.data.from ?? '',
			to: period.data.to ?? ''
		},
		chemistries: [...CHEMISTRY_CODES],
		partNumbers
	};
};
