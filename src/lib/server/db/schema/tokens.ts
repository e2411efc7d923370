import { index, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { users } from './users';

/** API tokens: shown once, stored as sha256, revocable. */
export const apiTokens = pgTable(
	'api_tokens',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		label: text('label').notNull(),
		// What the token may do, within its user's role (token-scopes.ts); 'role' = everything the role may.
		scope: text('scope', { enum: ['role', 'read', 'readings:write', 'webhooks:manage'] })
			.notNull()
			.default('role'),
		// Null only for tokens made before expiry existed and by `npm run token`.
		expiresAt: timestamp('expires_at', { withTimezone: true }),
		tokenHash: text('token_hash').notNull().unique(),
		prefix: text('prefix').notNull(),
		createdBy: text('created_by').references(() => users.id),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		lastUsedAt: timestamp('last_used_at', { withTimezone: true }),
		revokedAt: timestamp('revoked_at', { withTimezone: true })
	},
	(t) => [index('api_tokens_user_idx').on(t.userId)]
);
