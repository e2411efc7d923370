import { json } from '@sveltejs/kit';
import { InspectionInputError, samplingPlan, type InspectionErrorCode } from '$lib/inspection';
import { EDITION } from '$lib/inspection/iso2859/tables';
import { planQuerySchema } from '$lib/schemas/readings';
import { api, authorize, badRequest, readQuery } from '$lib/server/http';
import type { RequestHandler } from './$types';

/** The query parameter each core refusal is about, so the 400 names it. */
const PARAMETER: Record<InspectionErrorCode, string> = {
	lot_size_invalid: 'lot_size',
	aql_not_preferred: 'aql',
	level_invalid: 'level',
	severity_invalid: 'severity'
};

/** GET /api/v1/sampling/plan?lot_size=&aql=&level=II&severity=normal — ISO 2859-1:1999 single sampling plan, with its edition. */
export const GET: RequestHandler = api(async (event) => {
	authorize(event, 'part:read');
	const q = readQuery(event.url, planQuerySchema);
	try {
		const plan = samplingPlan({ lotSize: q.lot_size, aql: q.aql, level: q.level, severity: q.severity });
		return json({ ...plan, edition: EDITION, lot_size: q.lot_size, aql: q.aql, level: q.level, severity: q.severity });
	} catch (error) {
		if (error instanceof InspectionInputError) throw badRequest(error.message, [{ path: PARAMETER[error.code], message: error.message }]);
		throw error;
	}
});
