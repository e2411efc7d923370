/**
 * (1) Evaluate a 2,000-reading lot in-process, as the server does (computeEvaluation: per-unit
 * inversion, statistics, variables check, disposition) vs. a bare loop doing only the same number
 * of model inversions. The floor prepares the model once, like evaluateReadings does: calling the
 * public invertSoc per reading would re-tabulate the curve each time and make the floor look slow.
 */
import { getLibraryModel } from '$lib/electrochem';
import { invertPrepared, prepareModel } from '$lib/electrochem/invert';
import { DEFAULT_METER_ACCURACY_V } from '$lib/electrochem';
import { getDb } from '$lib/server/db';
import { computeEvaluation, evaluateLotNow } from '$lib/server/services/evaluation';
import type { BenchContext } from '../lib/context';
import { interleaved, timeMs, type BenchLine } from '../lib/measure';

export async function benchEvaluateLot(ctx: BenchContext): Promise<BenchLine> {
	const { inputs } = await evaluateLotNow(getDb(), ctx.bigLotId);
	const count = inputs.readings.ocv_v.length;
	if (count !== 2000) throw new Error(`expected 2,000 stored readings, found ${count}`);
	const model = inputs.model ?? getLibraryModel('NMC');
	const cells = inputs.part.cells_in_series;
	const sigma = Math.hypot((inputs.part.meter_accuracy_v ?? DEFAULT_METER_ACCURACY_V) / cells, model.sigma_model_v);
	const { ocv_v, temperature_c } = inputs.readings;

	let sink = 0; // keeps the optimiser from dropping the floor's work
	const op = () => timeMs(() => (sink += computeEvaluation(inputs).nonconforming));
	const floor = () =>
		timeMs(() => {
			const prepared = prepareModel(model);
			for (let i = 0; i < count; i++) sink += invertPrepared(prepared, ocv_v[i] / cells, temperature_c[i], sigma).soc;
		});
	const result = await interleaved(op, floor, { warmup: 10, rounds: 41 });
	if (Number.isNaN(sink)) throw new Error('inversion produced NaN');
	return { name: 'evaluate-lot-2000', value: result.op, floor: result.floor, unit: 'ms', target: { op: '<=', value: 3 } };
}
