/**
 * (4) The lot API under load: 50 concurrent clients for 10 s (autocannon 8, its own process) against
 * GET /api/v1/lots/{id}/evaluation with a bearer token, on a lot holding a full ISO 2859-1 sample
 * (200 readings, code letter L), vs. the same server handing out a static file of the same size.
 * Two lines: throughput ratio (requests/s) and the endpoint's p99 latency against 50 ms; then a
 * `ceiling` note (the same route answering 404, no body) for reading the result.
 */
import { spawn } from 'node:child_process';
import { join } from 'node:path';
import { ROOT } from '../lib/app';
import { staticPath, type BenchContext } from '../lib/context';
import { median, type BenchLine } from '../lib/measure';
import { bearer, checkTwin, EVALUATION_TWIN } from '../lib/static-twins';
import { placed } from '../lib/cpus';

const CONNECTIONS = 50;
const SECONDS = 10;
// Three rounds: the static floor alone varies by a third between identical runs on a 2-core machine.
const ROUNDS = 3;

interface CannonResult {
	requestsPerSecond: number;
	p99: number;
	non2xx: number;
	errors: number;
}

function autocannon(url: string, seconds: number, headers: Record<string, string> = {}): Promise<CannonResult> {
	const args = ['-c', String(CONNECTIONS), '-d', String(seconds), '-j', '-n'];
	for (const [k, v] of Object.entries(headers)) args.push('-H', `${k}=${v}`);
	args.push(url);
	return new Promise((resolve, reject) => {
		const [command, argv] = placed('load', process.execPath, [join(ROOT, 'node_modules/autocannon/autocannon.js'), ...args]);
		const child = spawn(command, argv, { stdio: ['ignore', 'pipe', 'pipe'] });
		let out = '';
		let err = '';
		child.stdout.on('data', (d) => (out += d));
		child.stderr.on('data', (d) => (err += d));
		child.on('exit', (code) => {
			if (code !== 0) return reject(new Error(`autocannon exited ${code}: ${err}`));
			const json = JSON.parse(out.trim().split('\n').at(-1) ?? '{}');
			resolve({ requestsPerSecond: json.requests.average, p99: json.latency.p99, non2xx: json.non2xx, errors: json.errors + json.timeouts });
		});
	});
}

/** A lot id no lot has: the same route answers 404 after the same hooks, token check and query, with no body. */
const MISSING_LOT = '00000000-0000-4000-8000-000000000000';

/**
 * For reading the result, not a target: the same route answering 404 for a missing lot — SvelteKit's
 * request handling, the hooks, the token check and the one query, without the evaluation body — as
 * a share of the static floor. The endpoint cannot beat this ceiling on the machine at hand.
 */
async function ceilingNote(ctx: BenchContext, auth: Record<string, string>, endpointRps: number, floorRps: number): Promise<string> {
	const missing = await autocannon(`${ctx.app.url}/api/v1/lots/${MISSING_LOT}/evaluation`, SECONDS, auth);
	if (missing.non2xx === 0) throw new Error('the missing-lot probe did not answer 404');
	const rps = missing.requestsPerSecond;
	return `ceiling evaluation-api-load: the same route answering 404 (no body) ${Math.round(rps)}req/s = ${(rps / floorRps).toFixed(2)} of the floor; the endpoint reaches ${Math.round((endpointRps / rps) * 100)} % of that`;
}

export async function benchEvaluationLoad(ctx: BenchContext): Promise<{ lines: BenchLine[]; notes: string[] }> {
	const apiUrl = `${ctx.app.url}/api/v1/lots/${ctx.sampleLotId}/evaluation`;
	const auth = bearer(ctx.token);
	const response = await fetch(apiUrl, { headers: auth });
	const body = await response.text();
	if (response.status !== 200) throw new Error(`GET evaluation answered ${response.status}: ${body.slice(0, 200)}`);
	const asset = staticPath(ctx, EVALUATION_TWIN);
	await checkTwin(asset.url, Buffer.byteLength(body));

	await autocannon(apiUrl, 2, auth); // warm-up
	await autocannon(asset.url, 2);
	const api: CannonResult[] = [];
	const floor: CannonResult[] = [];
	for (let r = 0; r < ROUNDS; r++) {
		const order = r % 2 === 0 ? ['api', 'floor'] : ['floor', 'api'];
		for (const which of order) {
			if (which === 'api') api.push(await autocannon(apiUrl, SECONDS, auth));
			else floor.push(await autocannon(asset.url, SECONDS));
		}
	}
	const failed = [...api, ...floor].reduce((n, a) => n + a.non2xx + a.errors, 0);
	if (failed > 0) throw new Error(`${failed} requests failed or were not 2xx under load`);
	const rps = median(api.map((a) => a.requestsPerSecond));
	const floorRps = median(floor.map((a) => a.requestsPerSecond));
	const lines: BenchLine[] = [
		{ name: 'evaluation-api-load', value: rps, floor: floorRps, unit: 'req/s', target: { op: '>=', value: 0.3 } },
		{
			name: 'evaluation-api-p99',
			value: median(api.map((a) => a.p99)),
			floor: median(floor.map((a) => a.p99)),
			unit: 'ms',
			target: { on: 'value', op: '<=', value: 50, unit: 'ms' }
		}
	];
	const each = (runs: CannonResult[]) => runs.map((a) => Math.round(a.requestsPerSecond)).join('/');
	const rounds = `rounds evaluation-api-load: endpoint ${each(api)} req/s, static ${each(floor)} req/s`;
	return { lines, notes: [rounds, await ceilingNote(ctx, auth, rps, floorRps)] };
}
