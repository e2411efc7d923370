/** Runs the built app (`node <build>`) the way `npm start` does, for the benchmark. */
import { spawn } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { resolve } from 'node:path';
import { appEnv } from '../../../scripts/lib/env.mjs';
import { freePort, waitForHttp } from '../../../scripts/lib/proc.mjs';
import { APP_ROLE, urlAs } from '../../../scripts/lib/roles.mjs';
import { placed } from './cpus';

export interface BenchApp {
	url: string;
	buildDir: string;
	pid: number;
	output: () => string;
	stop: () => Promise<void>;
}

export const ROOT = resolve(import.meta.dirname, '../../..');

export async function startBenchApp(databaseUrl: string, buildDir: string): Promise<BenchApp> {
	const port: number = await freePort();
	const smtpPort: number = await freePort(); // nobody listens: background mail is off anyway
	const env = appEnv({
		port,
		// As `npm start` runs it: the least-privileged app role.
		databaseUrl: urlAs(databaseUrl, APP_ROLE),
		smtpPort,
		mailHttpPort: undefined,
		secret: randomBytes(32).toString('base64url'),
		// LOG_EVALUATIONS: one log line per evaluation computed, counted by ops/evaluations-per-save.ts.
		extra: { WORKERS: 'off', NODE_ENV: 'production', LOG_EVALUATIONS: 'on' }
	});
	let output = '';
	// Started as `npm start` starts it. BENCH_PROFILE_DIR=/some/dir writes a V8 CPU profile of the app there when it stops (node --cpu-prof).
	const profile = process.env.BENCH_PROFILE_DIR ? ['--cpu-prof', `--cpu-prof-dir=${process.env.BENCH_PROFILE_DIR}`] : [];
	const [command, args] = placed('app', process.execPath, [...profile, buildDir]);
	const child = spawn(command, args, { cwd: ROOT, env, stdio: ['ignore', 'pipe', 'pipe'] });
	child.stdout.on('data', (d) => (output += d));
	child.stderr.on('data', (d) => (output += d));
	const url = `http://127.0.0.1:${port}`;
	const exited = new Promise<void>((r) => child.once('exit', () => r()));
	try {
		await waitForHttp(`${url}/api/v1/health`, { timeoutMs: 30_000 });
	} catch (error) {
		child.kill('SIGKILL');
		throw new Error(`the app did not start: ${String(error)}\n${output}`);
	}
	return {
		url,
		buildDir: resolve(ROOT, buildDir),
		pid: child.pid ?? -1,
		output: () => output,
		stop: async () => {
			if (child.exitCode === null && child.signalCode === null) child.kill('SIGTERM');
			await exited;
		}
	};
}
