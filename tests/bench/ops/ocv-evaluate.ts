/**
 * POST /api/v1/ocv/evaluate with 10,000 readings, end to end (send, parse, validate, invert,
 * serialise, receive) vs. the pure computation the answer needs: `evaluateReadings` over the same
 * 10,000 readings in this process. The ratio is what the HTTP API adds on top of the science.
 */
import { evaluateReadings, getLibraryModel } from '$lib/electrochem';
import { bearer } from '../lib/auth';
import type { BenchContext } from '../lib/context';
import { syntheticReadings } from '../lib/data';
import { interleaved, timeMs, type BenchLine } from '../lib/measure';

const READINGS = 10_000;

export async function benchOcvEvaluate(ctx: BenchContext): Promise<BenchLine> {
	const readings = syntheticReadings(READINGS, 2).map(({ ocv_v, temperature_c }) => ({ ocv_v, temperature_c }));
	const options = { declared_soc: 0.3 };
	// Bytes once, as a client holds them; the answer is read as bytes (decoding 2 MB into a string
	// is the client's cost, not the server's).
	const body = new TextEncoder().encode(JSON.stringify({ chemistry: 'NMC', ...options, readings }));
	const call = async () => {
		const response = await fetch(`${ctx.app.url}/api/v1/ocv/evaluate`, {
			method: 'POST',
			body,
			headers: { ...bearer(ctx.token), 'content-type': 'application/json' }
		});
		const bytes = new Uint8Array(await response.arrayBuffer());
		if (response.status !== 200)
			throw new Error(`POST /api/v1/ocv/evaluate answered ${response.status}: ${new TextDecoder().decode(bytes.subarray(0, 200))}`);
		return bytes;
	};
	const results = (JSON.parse(new TextDecoder().decode(await call())) as { results?: unknown[] }).results;
	if (!Array.isArray(results) || results.length !== READINGS) throw new Error('the answer does not hold one result per reading');

	const model = getLibraryModel('NMC');
	let sink = 0; // keeps the optimiser from dropping the floor's work
	const compute = () => (sink += evaluateReadings(model, readings, options).length);
	const result = await interleaved(
		() => timeMs(call),
		() => timeMs(compute),
		{ warmup: 3, rounds: 20 }
	);
	if (sink === 0) throw new Error('the floor evaluated nothing');
	return { name: 'ocv-evaluate-10000', value: result.op, floor: result.floor, unit: 'ms', target: { op: '<=', value: 5 } };
}
