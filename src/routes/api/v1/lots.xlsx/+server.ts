import { api, authorize, readQuery } from '$lib/server/http';
import { getDb } from '$lib/server/db';
import { lotListXlsx } from '$lib/server/reports';
import { fileHeaders, lotListRows, XLSX_MIME } from '$lib/server/services/report-data';
import { lotListExportQuery } from '$lib/schemas/decision';
import type { RequestHandler } from './$types';

/** GET /api/v1/lots.xlsx?status=&supplier_id= — the lot list with filters (suppliers: their own lots). */
export const GET: RequestHandler = api(async (event) => {
	const me = event.locals.user;
	const query = readQuery(event.url, lotListExportQuery);
	const supplierId = me?.role === 'supplier' ? (me.organisationId ?? undefined) : query.supplier_id;
	authorize(event, 'report:read', me?.role === 'supplier' ? { supplierId } : undefined);
	const rows = await lotListRows(getDb(), { status: query.status, supplierId });
	const filters: Record<string, string> = {};
	if (query.status) filters.status = query.status;
	if (supplierId) filters.supplier = rows[0]?.supplier ?? supplierId;
	const xlsx = await lotListXlsx(rows, filters);
	return new Response(new Uint8Array(xlsx), { headers: fileHeaders('lots.xlsx', XLSX_MIME, event.url) });
});
