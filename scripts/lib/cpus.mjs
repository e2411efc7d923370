// CPU placement for `npm run bench`. On a small machine the PostgreSQL backend that each query
// wakes runs on the app's own core and preempts it (profiled: most of the app's "writev" time was
// the 187-byte query submit, i.e. waiting for that backend). Deployed, the database has cores of its
// own; the bench gives it the same: the app server on core 0, PostgreSQL and the load generator on
// the others. Applies to every operation and its floor alike. BENCH_PIN=off measures unpinned.
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { join } from 'node:path';

function hasTaskset() {
	try {
		execFileSync('taskset', ['-p', String(process.pid)], { stdio: 'ignore' });
		return true;
	} catch {
		return false;
	}
}

/** `{ app: '0', rest: '1-N' }`, or null (one core, no taskset, or BENCH_PIN=off). */
export function cpuPlan() {
	const cores = availableParallelism();
	if (process.env.BENCH_PIN === 'off' || cores < 2 || !hasTaskset()) return null;
	return { app: '0', rest: cores === 2 ? '1' : `1-${cores - 1}` };
}

function childPids(pid) {
	try {
		return execFileSync('pgrep', ['-P', pid], { encoding: 'utf8' }).split('\n').filter(Boolean);
	} catch {
		return []; // pgrep exits 1 when there are none
	}
}

/** Pin a running PostgreSQL (postmaster and the processes it already forked; new backends inherit). */
export function pinPostgres(dataDir, cpus) {
	const postmaster = readFileSync(join(dataDir, 'postmaster.pid'), 'utf8').split('\n')[0].trim();
	const children = childPids(postmaster);
	for (const pid of [postmaster, ...children]) execFileSync('taskset', ['-a', '-p', '-c', cpus, pid], { stdio: 'ignore' });
}
