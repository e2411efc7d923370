import { InspectionInputError, samplingPlan, type InspectionLevel, type SamplingPlan } from '$lib/inspection';
import { EDITION } from '$lib/inspection/iso2859/tables';

export type SeverityName = 'normal' | 'tightened' | 'reduced' | 'discontinued';

export interface SamplingView {
	severity: SeverityName;
	aql: number;
	level: string;
	/** The standard and edition the plan comes from, shown with it. */
	edition: string;
	plan: SamplingPlan | null;
	problem: string | null;
}

/** The ISO 2859-1:1999 single sampling plan for this lot, or why there is none. */
export function samplingView(lotSize: number, aql: number, level: string, severity: SeverityName): SamplingView {
	const base = { severity, aql, level, edition: EDITION };
	if (severity === 'discontinued') {
		return { ...base, plan: null, problem: 'Sampling inspection is discontinued for this supplier and part until quality resumes it.' };
	}
	try {
		return { ...base, plan: samplingPlan({ lotSize, aql, level: level as InspectionLevel, severity }), problem: null };
	} catch (e) {
		if (e instanceof InspectionInputError) return { ...base, plan: null, problem: e.message };
		throw e;
	}
}
