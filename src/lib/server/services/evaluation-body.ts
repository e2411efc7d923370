/**
 * The JSON body GET /api/v1/lots/{id}/evaluation serves (and caches): the evaluation without the
 * readings snapshot (the client already has the readings from /readings; the stored evaluations
 * row of a decision keeps the full snapshot) and with per-unit numbers rounded to 1e-6 — 1 µV,
 * 0.0001 % SOC, far below any meter's resolution, as POST /api/v1/ocv/evaluate does. Two fifths
 * smaller than the full form at 200 readings, which is most of what each request moves.
 */
import type { LotEvaluation } from './evaluation';

const UNIT_NUMBER_KEYS = ['soc', 'soc_sigma', 'soc_low', 'soc_high', 'ocv_cell_v', 'ocv_at_25c_v', 'expected_ocv_v', 'residual_v', 'self_discharge_mv_per_day'] as const;

const round6 = (x: number | null) => (x === null || !Number.isFinite(x) ? x : Math.round(x * 1e6) / 1e6);

export type ServedEvaluation = Omit<LotEvaluation, 'inputs'> & { inputs: Omit<LotEvaluation['inputs'], 'readings'> };

export function servedEvaluation(evaluation: LotEvaluation): ServedEvaluation {
	const { readings: _readings, ...inputs } = evaluation.inputs;
	const units = evaluation.units.map((unit) => {
		const rounded = { ...unit };
		for (const key of UNIT_NUMBER_KEYS) (rounded as Record<string, number | null>)[key] = round6(unit[key]);
		return rounded;
	});
	return { ...evaluation, units, inputs };
}
