import { api } from '$lib/server/http';
import { getDb } from '$lib/server/db';
import { lotReadingsXlsx } from '$lib/server/reports';
import { buildReportData, fileHeaders, XLSX_MIME } from '$lib/server/services/report-data';
import { requireLot } from '$lib/server/route-helpers';

import type { RequestHandler } from './$types';

/** GET /api/v1/lots/{id}/readings.xlsx — one row per unit with its result, and a summary sheet. */
export const GET: RequestHandler = api(async (event) => {
	const { lot } = await requireLot(event, event.params.id, 'report:read');
	const xlsx = await lotReadingsXlsx(await buildReportData(getDb(), lot.id));
	return new Response(new Uint8Array(xlsx), { headers: fileHeaders(`readings-${lot.lotCode}.xlsx`, XLSX_MIME, event.url) });
});
