import { sql } from 'drizzle-orm';
import { getDb } from '../db';

/** Really asks PostgreSQL, so a dead database shows as such. */
export async function databaseIsUp(): Promise<boolean> {
	try {
		const rows = await getDb().execute(sql`select 1 as ok`);
		return rows.rows[0]?.ok === 1;
	} catch {
		return false;
	}
}
