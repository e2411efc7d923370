// Applies the committed SQL migrations in drizzle/ (a second run does nothing), then the app role's
// grants (scripts/lib/roles.mjs). Run it as the owner role, so the tables it creates are the owner's.
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
	await grantAppRole(databaseUrl);
}
