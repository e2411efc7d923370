// Nernst relations for one cell reaction: E, ΔG°, ΔG and K at a temperature in °C.
import { json } from '@sveltejs/kit';
import { cellPotentialReport } from '$lib/electrochem';
import { api, authorize, readJson, unprocessable } from '$lib/server/http';
import { cellPotentialBody } from '$lib/schemas/electrochem';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = api(async (event) => {
	authorize(event, 'electrochem:use');
	const body = await readJson(event.request, cellPotentialBody);
	const report = cellPotentialReport(body);
	if (!report.ok) throw unprocessable(report.error.message, [{ path: report.error.field, message: report.error.message }]);
	return json(report.value);
});
