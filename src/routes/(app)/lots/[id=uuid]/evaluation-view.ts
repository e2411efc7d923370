// The JSON of GET /api/v1/lots/{id}/evaluation as the browser reads it (a structural copy of the
// server's LotEvaluation, so no server module is imported into client code).
import type { OcvModel } from '$lib/electrochem';
import type { PartLimits, SamplingPlan, UnitDisposition, VariablesCheck, LotStatistics } from '$lib/inspection';

export interface EvaluationReasonView {
	code: string;
	severity: 'reject' | 'hold' | 'info';
	message: string;
	units?: string[];
}

export interface EvaluationView {
	lot_id: string;
	status: 'pending' | 'accept' | 'hold' | 'reject';
	reasons: EvaluationReasonView[];
	plan: SamplingPlan;
	severity: 'normal' | 'tightened' | 'reduced' | 'discontinued';
	stats: LotStatistics;
	variables: VariablesCheck;
	nonconforming: number;
	nonconforming_serials: string[];
	units?: UnitDisposition[];
	unit_count?: number;
	safety: boolean;
	/** The DG rule applied, e.g. "IATA DGR 67th ed. PI 965"; absent on evaluations stored before the rules table. */
	dg_rule?: string | null;
	reading_count: number;
	model: {
		id: string | null;
		version: string;
		chemistry: string;
		source: 'part' | 'library';
		name?: string;
		form?: string;
		sigma_model_v?: number;
		/** For a chemistry calibrated in SOC: its largest model σ, SOC fraction. */
		sigma_model_soc_max?: number;
	};
	inputs?: {
		lot: { declared_soc: number | null; transport: string; lithium_ion: boolean; quantity: number };
		limits: PartLimits;
		model: OcvModel;
		part: { cells_in_series: number };
	};
	evaluated_at: string;
}

export type FullEvaluation = EvaluationView & Required<Pick<EvaluationView, 'units' | 'inputs'>>;
export const isFull = (e: EvaluationView | null): e is FullEvaluation => !!e && !!e.units && !!e.inputs;
