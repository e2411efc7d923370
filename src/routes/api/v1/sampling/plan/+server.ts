import { json } from '@sveltejs/kit';
import { InspectionInputError, samplingPlan } from '$lib/inspection';
import { planQuerySchema } from '$lib/schemas/readings';
import { api, authorize, badRequest, readQuery } from '$lib/server/http';
import type { RequestHandler } from './$types';

/** GET /api/v1/sampling/plan?lot_size=&aql=&level=II&severity=normal — ISO 2859-1 single sampling plan. */
export const GET: RequestHandler = api(async (event) => {
	authorize(event, 'part:read');
	const q = readQuery(event.url, planQuerySchema);
	try {
		const plan = samplingPlan({ lotSize: q.lot_size, aql: q.aql, level: q.level, severity: q.severity });
		return json({ ...plan, lot_size: q.lot_size, aql: q.aql, level: q.level, severity: q.severity });
	} catch (error) {
		if (error instanceof InspectionInputError) throw badRequest(error.message, [{ path: error.code, message: error.message }]);
		throw error;
	}
});
