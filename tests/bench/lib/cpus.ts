import { execFileSync } from 'node:child_process';

/**
 * Where the bench's processes run (chosen by scripts/lib/cpus.mjs, passed in BENCH_APP_CPUS and
 * BENCH_REST_CPUS): the app server on its own core, the load generator with PostgreSQL on the rest.
 * Empty: no placement (one core, no taskset, or BENCH_PIN=off).
 */
export function placed(role: 'app' | 'load', command: string, args: string[]): [string, string[]] {
	const cpus = role === 'app' ? process.env.BENCH_APP_CPUS : process.env.BENCH_REST_CPUS;
	return cpus ? ['taskset', ['-c', cpus, command, ...args]] : [command, args];
}

/** For the machine line: `app=0 postgres+load=1`, or `none`. */
export function placement(): string {
	const app = process.env.BENCH_APP_CPUS;
	return app ? `app=${app} postgres+load=${process.env.BENCH_REST_CPUS}` : 'none';
}

/**
 * Move this bench process (all its threads): in-process operations stand in for the app, so they
 * run on the app's core; HTTP operations make it a client, which runs beside the load generator.
 */
export function placeSelf(role: 'app' | 'load'): void {
	const cpus = role === 'app' ? process.env.BENCH_APP_CPUS : process.env.BENCH_REST_CPUS;
	if (cpus) execFileSync('taskset', ['-a', '-p', '-c', cpus, String(process.pid)], { stdio: 'ignore' });
}
