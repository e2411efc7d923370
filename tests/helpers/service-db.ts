/**
 * For the `services` test tier: service functions called directly (no build, no HTTP) against a
 * fresh copy of a template database. The services reach the database through `getDb()`, which
 * reads DATABASE_URL once per process; vitest runs each file in its own process, so a file points
 * it at its own copy before the first query and closes the pool at the end.
 */
import { afterAll, beforeAll } from 'vitest';
import { closeDb } from '$lib/server/db';
import { freshDatabase, withClient } from './db';

export interface ServiceDatabase {
	url: string;
	/** Run SQL for a test's set-up or assertions (a separate connection, as the test's own eyes). */
	sql: <T = Record<string, unknown>>(text: string, values?: unknown[]) => Promise<T[]>;
}

export function useServiceDatabase(label: string, options: { demo?: boolean } = {}): ServiceDatabase {
	let drop: (() => Promise<void>) | undefined;
	const handle: ServiceDatabase = {
		url: '',
		sql: (text, values = []) => withClient(handle.url, async (c) => (await c.query(text, values)).rows)
	};
	beforeAll(async () => {
		const db = await freshDatabase(label, options);
		handle.url = db.url;
		drop = db.drop;
		// The services run with the app's own least-privileged role, as in the running app.
		process.env.DATABASE_URL = db.appUrl;
	});
	afterAll(async () => {
		await closeDb();
		await drop?.();
	});
	return handle;
}
