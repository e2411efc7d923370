/**
 * (1) Evaluate a 2,000-reading lot in-process, as the server does (computeEvaluation: per-unit SOC,
 * statistics, variables check, outliers, DG rule, disposition) vs. the SOC step alone on the same
 * readings with the same options (`evaluateReadings`: inversion, uncertainty budget, hysteresis
 * branches). The ratio is what the disposition adds on top of the science it needs.
 */
import { evaluateReadings } from '$lib/electrochem';
import { getDb } from '$lib/server/db';
import { computeEvaluation, evaluateLotNow } from '$lib/server/services/evaluation';
import type { BenchContext } from '../lib/context';
import { interleaved, timeMs, type BenchLine } from '../lib/measure';

export async function benchEvaluateLot(ctx: BenchContext): Promise<BenchLine> {
	const { inputs } = await evaluateLotNow(getDb(), ctx.bigLotId);
	const count = inputs.readings.ocv_v.length;
	if (count !== 2000) throw new Error(`expected 2,000 stored readings, found ${count}`);
	const { ocv_v, temperature_c } = inputs.readings;
	const readings = ocv_v.map((v, i) => ({ ocv_v: v, temperature_c: temperature_c[i] }));
	const options = {
		cells_in_series: inputs.part.cells_in_series,
		declared_soc: inputs.lot.declared_soc,
		meter_accuracy_v: inputs.part.meter_accuracy_v,
		last_direction: inputs.lot.last_direction ?? 'unknown'
	};

	let sink = 0; // keeps the optimiser from dropping the floor's work
	const op = () => timeMs(() => (sink += computeEvaluation(inputs).nonconforming));
	const floor = () => timeMs(() => (sink += evaluateReadings(inputs.model, readings, options).length));
	const result = await interleaved(op, floor, { warmup: 10, rounds: 41 });
	if (Number.isNaN(sink)) throw new Error('the evaluation produced NaN');
	return { name: 'evaluate-lot-2000', value: result.op, floor: result.floor, unit: 'ms', target: { op: '<=', value: 3 } };
}
