import { api, conflict } from '$lib/server/http';
import { getDb } from '$lib/server/db';
import { renderQuarantineTag } from '$lib/server/reports';
import { buildReportData, fileHeaders, tagDataFrom } from '$lib/server/services/report-data';
import { requireLot } from '$lib/server/route-helpers';
import { lotStateInText } from '$lib/status';

import type { RequestHandler } from './$types';

/** GET /api/v1/lots/{id}/quarantine-tag.pdf — printable tag for a held or rejected lot (409 otherwise). */
export const GET: RequestHandler = api(async (event) => {
	const { lot } = await requireLot(event, event.params.id, 'report:read');
	const tag = tagDataFrom(await buildReportData(getDb(), lot.id));
	if (!tag) throw conflict(`The lot is ${lotStateInText(lot.status)}; a quarantine tag exists only for held or rejected lots`);
	const pdf = await renderQuarantineTag(tag);
	return new Response(new Uint8Array(pdf), { headers: fileHeaders(`quarantine-tag-${lot.lotCode}.pdf`, 'application/pdf', event.url) });
});
