import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from './schema';
import { isDatabaseUnavailable } from './unavailable';

export type Database = NodePgDatabase<typeof schema>;
export type Tx = Parameters<Parameters<Database['transaction']>[0]>[0];
export { schema };

// One pool per process, created on first use: the only process-wide handle, and it holds no
// business state (several app processes share one PostgreSQL).
let pool: pg.Pool | undefined;
let database: Database | undefined;

export function databaseUrl(): string {
	const url = process.env.DATABASE_URL;
	if (!url) throw new Error('DATABASE_URL is not set (npm start and npm test set it for you)');
	return url;
}

/** Wait before the one retry of a failed connect (a PostgreSQL restart takes about a second; tests widen it). */
const CONNECT_RETRY_MS = Number(process.env.DB_CONNECT_RETRY_MS ?? 1000);
type ConnectCallback = (error: Error | undefined, client: pg.PoolClient | undefined, done: (release?: unknown) => void) => void;

/**
 * A pool that tries a failed connect once more when PostgreSQL is unreachable or still starting:
 * nothing of the query or transaction was sent yet, so the retry is safe for writes too. pg calls
 * connect with a callback itself (pool.query), so both forms are kept.
 */
class RetryingPool extends pg.Pool {
	// eslint-disable-next-line @typescript-eslint/no-explicit-any
	override connect(callback?: ConnectCallback): any {
		const connected = super.connect().catch(async (error: unknown) => {
			if (!isDatabaseUnavailable(error)) throw error;
			await new Promise((resolve) => setTimeout(resolve, CONNECT_RETRY_MS));
			return super.connect();
		});
		if (!callback) return connected;
		connected.then(
			(client) => callback(undefined, client, (release) => client.release(release as boolean | Error | undefined)),
			(error: Error) => callback(error, undefined, () => {})
		);
	}
}

export function getPool(): pg.Pool {
	// allowExitOnIdle: idle connections must not keep a stopping process alive (adapter-node's
	// graceful shutdown ends when the event loop is empty).
	if (!pool) {
		pool = new RetryingPool({ connectionString: databaseUrl(), max: Number(process.env.PG_POOL_MAX ?? 10), allowExitOnIdle: true });
		// A connection dies when PostgreSQL restarts. pg emits 'error' on the pool (idle clients) or on
		// the client itself (checked out, e.g. mid-transaction); an unhandled 'error' event would end
		// the whole process. The failed query still rejects, and the pool discards the dead client.
		pool.on('error', (error) => console.error('[db] an idle database connection was lost:', error.message));
		pool.on('connect', (client) => client.on('error', (error) => console.error('[db] a database connection was lost:', error.message)));
	}
	return pool;
}

export function getDb(): Database {
	database ??= drizzle(getPool(), { schema });
	return database;
}

export async function closeDb(): Promise<void> {
	await pool?.end();
	pool = undefined;
	database = undefined;
}
