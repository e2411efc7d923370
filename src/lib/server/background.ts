/**
 * Background work that runs inside every app process (the mail outbox's graphile-worker runner).
 * Jobs are claimed in PostgreSQL with SKIP LOCKED, so running several processes is safe.
 * Registered workers are started once per process; tests can switch them off with WORKERS=off.
 */
import { startOutboxWorker } from './mail/worker';

export function startBackgroundWork(): void {
	if (process.env.WORKERS === 'off') return;
	const key = Symbol.for('restvolt.background');
	const g = globalThis as Record<symbol, unknown>;
	if (g[key]) return; // vite dev re-imports hooks on change
	g[key] = true;
	startOutboxWorker();
}
