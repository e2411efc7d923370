// Applies the committed SQL migrations in drizzle/ (a second run does nothing), then graphile-worker's
// own migrations (its schema graphile_worker holds the mail outbox's jobs), then the app role's grants
// (scripts/lib/roles.mjs). Run it as the owner role, so the tables and the schema it creates are the
// owner's: the app role cannot create schemas, and the worker in the app only checks they are current.
import { join } from 'node:path';
import { grantAppRole } from './roles.mjs';

export async function migrateDatabase(databaseUrl, root) {
	const { default: pg } = await import('pg');
	const { drizzle } = await import('drizzle-orm/node-postgres');
	const { migrate } = await import('drizzle-orm/node-postgres/migrator');
	// The options quieten "relation already exists, skipping" notices from the migrator's bookkeeping.
	const pool = new pg.Pool({ connectionString: databaseUrl, max: 1, options: '-c client_min_messages=warning' });
	try {
		await migrate(drizzle(pool), { migrationsFolder: join(root, 'drizzle') });
	} finally {
		await pool.end();
	}
	const { runMigrations, Logger } = await import('graphile-worker');
	const quiet = new Logger(() => (level, message) => {
		if (level === 'error') console.error(message);
	});
	await runMigrations({ connectionString: databaseUrl, maxPoolSize: 1, logger: quiet });
	await grantAppRole(databaseUrl);
}
