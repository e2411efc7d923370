import { error, fail } from '@sveltejs/kit';
import { can } from '$lib/server/policy';
import { getDb } from '$lib/server/db';
import { BadCursorError, listLots } from '$lib/server/services/lots';
import { listSuppliers } from '$lib/server/services/suppliers';
import { lotListQuerySchema } from '$lib/schemas/lot';
import { text } from '$lib/schemas/fields';
import { issuesText } from '$lib/server/http';
import { readPreference, savePreference } from '$lib/server/services/preferences';
import { DEFAULT_LOT_LIST_VIEW, LOT_LIST_VIEW_KEY, lotListViewSchema } from '$lib/schemas/list-view';
import type { Actions, PageServerLoad } from './$types';

// The list's state lives in the URL, so a filtered page can be bookmarked and shared.
const pageQuery = lotListQuerySchema.extend({ trail: text().max(2000).optional() });

export const load: PageServerLoad = async ({ locals, url }) => {
	const user = locals.user!;
	if (!can(user, 'lot:read')) error(403, 'Your role may not read lots');
	const parsed = pageQuery.safeParse(Object.fromEntries(url.searchParams));
	if (!parsed.success) error(400, `The list’s filters are not valid — ${issuesText(parsed.error)}`);
	const query = parsed.data;
	const db = getDb();
	let page;
	try {
		page = await listLots(db, user, {
			status: query.status,
			supplierId: query.supplier_id,
			search: query.search,
			limit: query.limit,
			cursor: query.cursor
		});
	} catch (e) {
		if (!(e instanceof BadCursorError)) throw e;
		page = await listLots(db, user, { ...query, supplierId: query.supplier_id, cursor: undefined });
	}
	const suppliers = can(user, 'supplier:read') ? await listSuppliers(db) : [];
	return {
		rows: page.lots.map((l) => ({
			id: l.id,
			lotCode: l.lotCode,
			poNumber: l.poNumber,
			supplierName: l.supplierName,
			partNumber: l.partNumber,
			chemistry: l.chemistry,
			quantity: l.quantity,
			declaredSocPct: l.declaredSoc === null ? null : l.declaredSoc * 100,
			transport: l.transport,
			status: l.status,
			expectedArrival: l.expectedArrival,
			createdAt: l.createdAt.toISOString()
		})),
		nextCursor: page.nextCursor,
		filters: {
			status: query.status ?? '',
			supplier_id: query.supplier_id ?? '',
			search: query.search ?? '',
			limit: query.limit,
			cursor: query.cursor ?? '',
			trail: query.trail ?? ''
		},
		suppliers: suppliers.map((s) => ({ id: s.id, name: s.name })),
		canCreate: can(user, 'lot:create'),
		view: (await readPreference(db, user.id, LOT_LIST_VIEW_KEY, lotListViewSchema)) ?? DEFAULT_LOT_LIST_VIEW
	};
};

function parseJson(text: string): unknown {
	try {
		return JSON.parse(text);
	} catch {
		return undefined;
	}
}

export const actions: Actions = {
	/** Keep this person's columns and sort for the next visit (sent by the table as it changes). */
	view: async ({ locals, request }) => {
		const user = locals.user!;
		if (!can(user, 'lot:read')) error(403, 'Your role may not read lots');
		const raw = (await request.formData()).get('view');
		const parsed = lotListViewSchema.safeParse(typeof raw === 'string' ? parseJson(raw) : undefined);
		if (!parsed.success) return fail(400, { field: 'view', message: `The list view is not valid — ${issuesText(parsed.error)}` });
		await savePreference(getDb(), user.id, LOT_LIST_VIEW_KEY, parsed.data);
		return { saved: true };
	}
};
