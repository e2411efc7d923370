// Many readings of one chemistry → SOC with interval, expected OCV, residual and flags per reading.
// Validation is split: zod for the small header, a plain loop for the (up to 10,000) readings.
import { json } from '@sveltejs/kit';
import { ElectrochemError, evaluateReadings, getLibraryModel, type ReadingInput } from '$lib/electrochem';
import { TooLarge } from '$lib/server/errors';
import { api, authorize, parseWith, readJsonValue, unprocessable } from '$lib/server/http';
import { roundedResult } from '$lib/server/services/evaluation-body';
import { evaluateHeader, MAX_READINGS, readingsIssues } from '$lib/schemas/electrochem';
import type { RequestHandler } from './$types';

function checkCount(body: unknown): void {
	const readings = (body as { readings?: unknown } | null)?.readings;
	if (Array.isArray(readings) && readings.length > MAX_READINGS) {
		throw new TooLarge(
			`At most ${MAX_READINGS} readings per call; this body has ${readings.length}. Split it into several calls.`,
			'too_many_readings',
			[{ path: 'readings', message: `must hold at most ${MAX_READINGS} readings` }]
		);
	}
}

export const POST: RequestHandler = api(async (event) => {
	authorize(event, 'electrochem:use');
	const body = await readJsonValue(event.request);
	checkCount(body);
	const header = parseWith(evaluateHeader, body, 'The request body');
	const issues = readingsIssues(header.readings);
	if (issues.length > 0) throw unprocessable('Some readings are not valid', issues);
	try {
		const results = evaluateReadings(getLibraryModel(header.chemistry), header.readings as ReadingInput[], {
			cells_in_series: header.cells_in_series,
			declared_soc: header.declared_soc,
			meter_accuracy_v: header.meter_accuracy_v
		});
		// Numbers to 1e-6 (1 µV, 0.0001 % SOC), far below any meter's resolution: a third fewer bytes.
		return json({ results: results.map(roundedResult) });
	} catch (e) {
		if (e instanceof ElectrochemError) throw unprocessable(e.message, [{ path: e.field, message: e.message }]);
		throw e;
	}
});
