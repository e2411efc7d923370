import { error } from '@sveltejs/kit';
import { samplingPlan, type InspectionLevel, type Severity } from '$lib/inspection';
import { getDb } from '$lib/server/db';
import { can } from '$lib/server/policy';
import { benchLots } from '$lib/server/services/readings';
import type { PageServerLoad } from './$types';

/** The plan the lot was registered under; discontinued inspection resumes on tightened (ISO 2859-1 9.4). */
function requiredSample(quantity: number, aql: number, level: string, severity: string | null) {
	const s: Severity = severity === 'tightened' || severity === 'discontinued' ? 'tightened' : severity === 'reduced' ? 'reduced' : 'normal';
	try {
		return samplingPlan({ lotSize: quantity, aql, level: level as InspectionLevel, severity: s }).sample_size;
	} catch {
		return null;
	}
}

export const load: PageServerLoad = async ({ locals }) => {
	const user = locals.user!;
	if (!can(user, 'lot:read')) error(403, 'Your role may not see the receiving bench');
	const lots = await benchLots(getDb());
	return {
		canRecord: can(user, 'reading:write'),
		lots: lots.map((l) => ({ ...l, sample_size: requiredSample(l.quantity, l.aql, l.inspection_level, l.severity) }))
	};
};
