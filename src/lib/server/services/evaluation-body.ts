/**
 * The JSON body GET /api/v1/lots/{id}/evaluation serves (and caches): the evaluation without the
 * readings snapshot (the client already has the readings from /readings; the stored evaluations
 * row of a decision keeps the full snapshot) and with per-unit numbers rounded to 1e-6 — 1 µV,
 * 0.0001 % SOC, far below any meter's resolution, as POST /api/v1/ocv/evaluate does. About 30 %
 * fewer bytes than the full form, and the body is most of what each request moves.
 */
import type { UnitResult } from '$lib/electrochem';
import type { LotEvaluation } from './evaluation';

function round6<T extends number | null>(x: T): T {
	return (x === null || !Number.isFinite(x) ? x : Math.round(x * 1e6) / 1e6) as T;
}

/** A unit's numbers rounded to 1e-6 (1 µV, 0.0001 % SOC); the rest as it is. */
export function roundedResult<T extends UnitResult>(u: T): T {
	return {
		...u,
		soc: round6(u.soc),
		soc_sigma: round6(u.soc_sigma),
		soc_low: round6(u.soc_low),
		soc_high: round6(u.soc_high),
		ocv_cell_v: round6(u.ocv_cell_v),
		ocv_at_25c_v: round6(u.ocv_at_25c_v),
		expected_ocv_v: round6(u.expected_ocv_v),
		residual_v: round6(u.residual_v)
	};
}

export type ServedEvaluation = Omit<LotEvaluation, 'inputs'> & { inputs: Omit<LotEvaluation['inputs'], 'readings'> };

export function servedEvaluation(evaluation: LotEvaluation): ServedEvaluation {
	const { readings: _readings, ...inputs } = evaluation.inputs;
	const units = evaluation.units.map((u) => ({ ...roundedResult(u), self_discharge_mv_per_day: round6(u.self_discharge_mv_per_day) }));
	return { ...evaluation, units, inputs };
}
