// Many readings against one model (a chemistry's library model, a fitted model object, or a stored
// version by model_id) → SOC with interval, expected OCV, residual and flags per reading.
// Validation is split: zod for the small header, a plain loop for the (up to 10,000) readings.
import { json } from '@sveltejs/kit';
import { checkModel, ElectrochemError, evaluateReadings, getLibraryModel, type OcvModel, type ReadingInput } from '$lib/electrochem';
import { getModelVersion } from '$lib/server/services/models';
import { TooLarge } from '$lib/server/errors';
import { api, authorize, notFound, parseWith, readJsonValue, unprocessable } from '$lib/server/http';
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

type Header = ReturnType<typeof evaluateHeader.parse>;

/** Exactly one of chemistry, model and model_id names the model; a bad one is a 422 naming its field. */
async function modelOf(event: Parameters<RequestHandler>[0], header: Header): Promise<OcvModel> {
	const given = (['chemistry', 'model', 'model_id'] as const).filter((k) => header[k] !== undefined);
	if (given.length !== 1) {
		const message = 'Name the model with exactly one of chemistry, model (as /ocv/fit returns it) or model_id';
		throw unprocessable(message, [{ path: given[1] ?? 'chemistry', message }]);
	}
	if (header.chemistry) return getLibraryModel(header.chemistry);
	if (header.model) {
		const checked = checkModel(header.model);
		if (!checked.ok)
			throw unprocessable('The model is not a valid OCV model', [{ path: `model.${checked.error.field}`, message: checked.error.message }]);
		return checked.value;
	}
	authorize(event, 'model:read');
	const stored = await getModelVersion(header.model_id!);
	if (!stored) throw notFound('model version');
	if (!stored.model)
		throw unprocessable('The stored model no longer passes the model check', [{ path: 'model_id', message: 'invalid stored model' }]);
	return stored.model;
}

export const POST: RequestHandler = api(async (event) => {
	authorize(event, 'electrochem:use');
	const body = await readJsonValue(event.request);
	checkCount(body);
	const header = parseWith(evaluateHeader, body, 'The request body');
	const issues = readingsIssues(header.readings);
	if (issues.length > 0) throw unprocessable('Some readings are not valid', issues);
	const model = await modelOf(event, header);
	try {
		const results = evaluateReadings(model, header.readings as ReadingInput[], {
			cells_in_series: header.cells_in_series,
			declared_soc: header.declared_soc,
			meter_accuracy_v: header.meter_accuracy_v
		});
		// Numbers to 1e-6 (1 µV, 0.0001 % SOC), far below any meter's resolution: a third fewer bytes.
		const named = { chemistry: model.chemistry, version: model.version, form: model.form, sigma_model_v: model.sigma_model_v };
		return json({ model: named, results: results.map(roundedResult) });
	} catch (e) {
		if (e instanceof ElectrochemError) throw unprocessable(e.message, [{ path: e.field, message: e.message }]);
		throw e;
	}
});
