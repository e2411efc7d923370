/**
 * (2) POST /api/v1/ocv/evaluate with 10,000 readings, end to end (send, validate, invert, serialise,
 * receive) vs. the same server answering a static file with the same response bytes.
 */
import { staticPath, type BenchContext } from '../lib/context';
import { interleaved, timeMs, type BenchLine } from '../lib/measure';
import { bearer, checkTwin, evaluateBody, EVALUATE_TWIN } from '../lib/static-twins';

export async function benchOcvEvaluate(ctx: BenchContext): Promise<BenchLine> {
	// Bytes once, as a client holds them; both sides then read the answer as bytes (decoding 2 MB
	// into a string is the client's cost, not the server's, and the floor does not pay it either).
	const body = new TextEncoder().encode(evaluateBody());
	const call = async () => {
		const response = await fetch(`${ctx.app.url}/api/v1/ocv/evaluate`, {
			method: 'POST',
			body,
			headers: { ...bearer(ctx.token), 'content-type': 'application/json' }
		});
		const bytes = new Uint8Array(await response.arrayBuffer());
		if (response.status !== 200) throw new Error(`POST /api/v1/ocv/evaluate answered ${response.status}: ${new TextDecoder().decode(bytes.subarray(0, 200))}`);
		return bytes;
	};
	const first = await call();
	const results = (JSON.parse(new TextDecoder().decode(first)) as { results?: unknown[] }).results;
	if (!Array.isArray(results) || results.length !== 10_000) throw new Error('the answer does not hold one result per reading');
	const twin = staticPath(ctx, EVALUATE_TWIN);
	await checkTwin(twin.url, first.length);

	const fetchStatic = async () => {
		const response = await fetch(twin.url, { redirect: 'manual' });
		await response.arrayBuffer();
		if (response.status !== 200) throw new Error(`static file answered ${response.status}`);
	};
	const result = await interleaved(
		() => timeMs(call),
		() => timeMs(fetchStatic),
		// Blocks of 5: a 10,000-reading call leaves megabytes of garbage that the server collects
		// during the next request; one static fetch right after each call paid for it (floors of
		// 2–12 ms for a file curl fetches in about 1 ms).
		{ warmup: 3, rounds: 6, block: 5 }
	);
	return { name: 'ocv-evaluate-10000', value: result.op, floor: result.floor, unit: 'ms', target: { op: '<=', value: 5 } };
}
