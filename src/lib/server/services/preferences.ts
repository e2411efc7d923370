/** A person's own view settings, one row per person and screen (user_preferences). */
import { and, eq, sql } from 'drizzle-orm';
import type { z } from 'zod';
import type { Database } from '../db';
import { userPreferences } from '../db/schema';

/**
 * The saved value for `key`, checked by `schema`; null when nothing is saved or the saved value
 * no longer fits the schema (the screen then shows its defaults).
 */
export async function readPreference<S extends z.ZodType>(
	db: Database,
	userId: string,
	key: string,
	schema: S
): Promise<z.infer<S> | null> {
	const [row] = await db
		.select({ value: userPreferences.value })
		.from(userPreferences)
		.where(and(eq(userPreferences.userId, userId), eq(userPreferences.key, key)));
	if (!row) return null;
	const parsed = schema.safeParse(row.value);
	return parsed.success ? parsed.data : null;
}

/** Save (or replace) the value for `key`; the caller has checked it with the screen's schema. */
export async function savePreference(db: Database, userId: string, key: string, value: unknown): Promise<void> {
	await db
		.insert(userPreferences)
		.values({ userId, key, value })
		.onConflictDoUpdate({ target: [userPreferences.userId, userPreferences.key], set: { value, updatedAt: sql`now()` } });
}
