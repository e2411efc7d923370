import { error } from '@sveltejs/kit';
import { can } from '$lib/server/policy';
import { getDb } from '$lib/server/db';
import { listParts } from '$lib/server/services/parts';
import { listSuppliers } from '$lib/server/services/suppliers';
import { partListQuerySchema } from '$lib/schemas/part';
import { issuesText } from '$lib/server/http';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	if (!can(locals.user, 'part:read')) error(403, 'Your role may not read parts');
	const parsed = partListQuerySchema.safeParse(Object.fromEntries(url.searchParams));
	if (!parsed.success) error(400, `The list’s filters are not valid — ${issuesText(parsed.error)}`);
	const filter = parsed.data;
	const db = getDb();
	const [parts, suppliers] = await Promise.all([listParts(db, filter), listSuppliers(db)]);
	return {
		parts: parts.map((p) => ({
			id: p.id,
			partNumber: p.partNumber,
			description: p.description,
			supplierName: p.supplierName,
			chemistry: p.chemistry,
			config: `${p.cellsInSeries}s${p.cellsInParallel}p`,
			capacityAh: p.nominalCapacityAh,
			aql: p.aql,
			level: p.inspectionLevel,
			modelVersion: p.modelVersion
		})),
		suppliers: suppliers.map((s) => ({ id: s.id, name: s.name })),
		filter: { supplier_id: filter.supplier_id ?? '', search: filter.search ?? '' },
		canCreate: can(locals.user, 'part:edit')
	};
};
