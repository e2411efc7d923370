import { api, authorize, readQuery } from '$lib/server/http';
import { getDb } from '$lib/server/db';
import { supplierScorecard } from '$lib/server/services/scorecards';
import { fileHeaders, XLSX_MIME } from '$lib/server/services/report-data';
import { scorecardXlsx } from '$lib/server/reports/scorecard-xlsx';
import { periodOf, scorecardQuery } from '$lib/schemas/scorecard';
import type { RequestHandler } from './$types';

/** GET /api/v1/suppliers/{id}/scorecard.xlsx?part_id=&period=&from=&to= — the scorecard as a workbook. */
export const GET: RequestHandler = api(async (event) => {
	authorize(event, 'scorecard:read');
	const query = readQuery(event.url, scorecardQuery);
	const now = new Date();
	const card = await supplierScorecard(getDb(), event.params.id, query.part_id, periodOf(query, now));
	const xlsx = await scorecardXlsx(card, now);
	return new Response(new Uint8Array(xlsx), { headers: fileHeaders('scorecard.xlsx', XLSX_MIME, event.url) });
});
