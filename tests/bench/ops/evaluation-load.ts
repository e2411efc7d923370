/**
 * The lot API under load: 50 concurrent clients for 10 s (autocannon 8, its own process) against
 * GET /api/v1/lots/{id}/evaluation with a bearer token, on a lot holding a full ISO 2859-1 sample
 * (200 readings, code letter L), vs. the same server's smallest authenticated JSON endpoint,
 * GET /api/v1/me, with the same token through the same hooks. Two lines: the throughput ratio
 * (evaluation req/s ÷ me req/s, higher is better) and the endpoint's p99 latency against 50 ms.
 */
import { spawn } from 'node:child_process';
import { join } from 'node:path';
import { ROOT } from '../lib/app';
import { bearer } from '../lib/auth';
import type { BenchContext } from '../lib/context';
import { median, type BenchLine } from '../lib/measure';
import { placed } from '../lib/cpus';

const CONNECTIONS = 50;
const SECONDS = 10;
// Three rounds each (A B B A A B): one run alone varies by a tenth or more on a 2-core machine.
const ROUNDS = 3;

interface CannonResult {
	requestsPerSecond: number;
	p99: number;
	non2xx: number;
	errors: number;
}

function autocannon(url: string, seconds: number, headers: Record<string, string>): Promise<CannonResult> {
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
			resolve({
				requestsPerSecond: json.requests.average,
				p99: json.latency.p99,
				non2xx: json.non2xx,
				errors: json.errors + json.timeouts
			});
		});
	});
}

async function expectOk(url: string, auth: Record<string, string>): Promise<void> {
	const response = await fetch(url, { headers: auth });
	const body = await response.text();
	if (response.status !== 200) throw new Error(`GET ${new URL(url).pathname} answered ${response.status}: ${body.slice(0, 200)}`);
}

export async function benchEvaluationLoad(ctx: BenchContext): Promise<{ lines: BenchLine[]; notes: string[] }> {
	const apiUrl = `${ctx.app.url}/api/v1/lots/${ctx.sampleLotId}/evaluation`;
	const meUrl = `${ctx.app.url}/api/v1/me`;
	const auth = bearer(ctx.token);
	await expectOk(apiUrl, auth); // computes and caches the evaluation once; the load reads the cache
	await expectOk(meUrl, auth);

	await autocannon(apiUrl, 2, auth); // warm-up
	await autocannon(meUrl, 2, auth);
	const api: CannonResult[] = [];
	const floor: CannonResult[] = [];
	for (let r = 0; r < ROUNDS; r++) {
		const order = r % 2 === 0 ? ['api', 'floor'] : ['floor', 'api'];
		for (const which of order) {
			if (which === 'api') api.push(await autocannon(apiUrl, SECONDS, auth));
			else floor.push(await autocannon(meUrl, SECONDS, auth));
		}
	}
	const failed = [...api, ...floor].reduce((n, a) => n + a.non2xx + a.errors, 0);
	if (failed > 0) throw new Error(`${failed} requests failed or were not 2xx under load`);
	const lines: BenchLine[] = [
		{
			name: 'evaluation-api-load',
			value: median(api.map((a) => a.requestsPerSecond)),
			floor: median(floor.map((a) => a.requestsPerSecond)),
			unit: 'req/s',
			target: { op: '>=', value: 0.5 }
		},
		{
			name: 'evaluation-api-p99',
			value: median(api.map((a) => a.p99)),
			floor: median(floor.map((a) => a.p99)),
			unit: 'ms',
			target: { on: 'value', op: '<=', value: 50, unit: 'ms' }
		}
	];
	const each = (runs: CannonResult[]) => runs.map((a) => Math.round(a.requestsPerSecond)).join('/');
	return { lines, notes: [`rounds evaluation-api-load: evaluation ${each(api)} req/s, me ${each(floor)} req/s`] };
}
