import { api, authorize, readQuery } from '$lib/server/http';
import { getDb } from '$lib/server/db';
import { supplierScorecard } from '$lib/server/services/scorecards';
import { fileHeaders } from '$lib/server/services/report-data';
import { scorecardPdf } from '$lib/server/reports/scorecard-pdf';
import { periodOf, scorecardQuery } from '$lib/schemas/scorecard';
import type { RequestHandler } from './$types';

/** GET /api/v1/suppliers/{id}/scorecard.pdf?part_id=&period=&from=&to= — the scorecard as an A4 PDF. */
export const GET: RequestHandler = api(async (event) => {
	authorize(event, 'scorecard:read');
	const query = readQuery(event.url, scorecardQuery);
	const now = new Date();
	const card = await supplierScorecard(getDb(), event.params.id, query.part_id, periodOf(query, now));
	const pdf = await scorecardPdf(card, now);
	return new Response(new Uint8Array(pdf), { headers: fileHeaders('scorecard.pdf', 'application/pdf', event.url) });
});
