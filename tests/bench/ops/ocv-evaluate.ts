/**
 * (2) POST /api/v1/ocv/evaluate with 10,000 readings, end to end (send, validate, invert, serialise,
 * receive) vs. the same server answering a static file of the same response size.
 */
import { writeFileSync } from 'node:fs';
import { syntheticReadings } from '../lib/data';
import { staticPath, type BenchContext } from '../lib/context';
import { interleaved, timeMs, type BenchLine } from '../lib/measure';

export async function benchOcvEvaluate(ctx: BenchContext): Promise<BenchLine> {
	const readings = syntheticReadings(10_000, 2).map(({ ocv_v, temperature_c }) => ({ ocv_v, temperature_c }));
	const body = JSON.stringify({ chemistry: 'NMC', declared_soc: 0.3, readings });
	const call = async () => {
		const response = await fetch(`${ctx.app.url}/api/v1/ocv/evaluate`, {
			method: 'POST',
			body,
			headers: { authorization: `Bearer ${ctx.token}`, 'content-type': 'application/json' }
		});
		const text = await response.text();
		if (response.status !== 200) throw new Error(`POST /api/v1/ocv/evaluate answered ${response.status}: ${text.slice(0, 200)}`);
		return text;
	};
	const first = await call();
	const results = (JSON.parse(first) as { results?: unknown[] }).results;
	if (!Array.isArray(results) || results.length !== readings.length) throw new Error('the answer does not hold one result per reading');

	const target = staticPath(ctx, 'bench-evaluate-static.json');
	writeFileSync(target.file, first); // the same bytes, served by sirv
	const fetchStatic = async () => {
		const response = await fetch(target.url);
		await response.arrayBuffer();
		if (response.status !== 200) throw new Error(`static file answered ${response.status}`);
	};
	const result = await interleaved(
		() => timeMs(call),
		() => timeMs(fetchStatic),
		{ warmup: 3, rounds: 15 }
	);
	return { name: 'ocv-evaluate-10000', value: result.op, floor: result.floor, unit: 'ms', target: { op: '<=', value: 5 } };
}
