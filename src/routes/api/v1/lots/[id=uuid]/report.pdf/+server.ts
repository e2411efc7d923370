import { api } from '$lib/server/http';
import { getDb } from '$lib/server/db';
import { renderInspectionReport } from '$lib/server/reports';
import { buildReportData, fileHeaders } from '$lib/server/services/report-data';
import { requireLot } from '$lib/server/route-helpers';

import type { RequestHandler } from './$types';

/** GET /api/v1/lots/{id}/report.pdf — the inspection report (suppliers: their own lots only). */
export const GET: RequestHandler = api(async (event) => {
	const { lot } = await requireLot(event, event.params.id, 'report:read');
	const pdf = await renderInspectionReport(await buildReportData(getDb(), lot.id));
	return new Response(new Uint8Array(pdf), { headers: fileHeaders(`inspection-report-${lot.lotCode}.pdf`, 'application/pdf', event.url) });
});
