import { bigint, boolean, index, integer, jsonb, pgTable, primaryKey, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { roleEnum } from './enums';
import { organisations } from './organisations';

// Table and column names follow @auth/drizzle-adapter's pg tables so the adapter can use them,
// extended with Restvolt's role, organisation and password hash.
export const users = pgTable(
	'user',
	{
		id: text('id')
			.primaryKey()
			.$defaultFn(() => crypto.randomUUID()),
		name: text('name'),
		email: text('email').notNull().unique(),
		emailVerified: timestamp('emailVerified', { mode: 'date', withTimezone: true }),
		image: text('image'),
		role: roleEnum('role').notNull().default('supplier'),
		organisationId: uuid('organisation_id').references(() => organisations.id),
		passwordHash: text('password_hash'),
		active: boolean('active').notNull().default(true),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('user_org_idx').on(t.organisationId)]
);

export const accounts = pgTable(
	'account',
	{
		userId: text('userId')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		type: text('type').notNull(),
		provider: text('provider').notNull(),
		providerAccountId: text('providerAccountId').notNull(),
		refresh_token: text('refresh_token'),
		access_token: text('access_token'),
		expires_at: integer('expires_at'),
		token_type: text('token_type'),
		scope: text('scope'),
		id_token: text('id_token'),
		session_state: text('session_state')
	},
	(t) => [primaryKey({ columns: [t.provider, t.providerAccountId] })]
);

export const sessions = pgTable('session', {
	sessionToken: text('sessionToken').primaryKey(),
	userId: text('userId')
		.notNull()
		.references(() => users.id, { onDelete: 'cascade' }),
	expires: timestamp('expires', { mode: 'date', withTimezone: true }).notNull()
});

export const verificationTokens = pgTable(
	'verificationToken',
	{
		identifier: text('identifier').notNull(),
		token: text('token').notNull(),
		expires: timestamp('expires', { mode: 'date', withTimezone: true }).notNull()
	},
	(t) => [primaryKey({ columns: [t.identifier, t.token] })]
);

/** Password-reset links for staff: only the sha256 of the token is stored. */
export const passwordResets = pgTable('password_resets', {
	tokenHash: text('token_hash').primaryKey(),
	userId: text('user_id')
		.notNull()
		.references(() => users.id, { onDelete: 'cascade' }),
	expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
	usedAt: timestamp('used_at', { withTimezone: true })
});

/** Failed sign-ins, counted over a sliding window per account and per address (throttle lives in PG). */
export const signInFailures = pgTable(
	'sign_in_failures',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		throttleKey: text('throttle_key').notNull(),
		at: timestamp('at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('sign_in_failures_key_at_idx').on(t.throttleKey, t.at)]
);

/**
 * One row per signed-in browser session. The session cookie (an Auth.js JWT) names its row, and
 * every request checks the row: sign-out, a password change, deactivation, the absolute lifetime
 * and the idle timeout end a session on the server, so a copied cookie stops working too.
 */
export const userSessions = pgTable(
	'user_sessions',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		method: text('method').notNull(),
		ip: text('ip'),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		lastSeenAt: timestamp('last_seen_at', { withTimezone: true }).notNull().defaultNow(),
		expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
		endedAt: timestamp('ended_at', { withTimezone: true }),
		endedReason: text('ended_reason')
	},
	(t) => [index('user_sessions_user_idx').on(t.userId)]
);

/**
 * A staff member's TOTP second factor (RFC 6238). The shared secret is stored sealed with
 * AES-256-GCM under a key derived from AUTH_SECRET (services/second-factor-seal.ts), bound to the
 * user id. `enabledAt` is null while enrolment is pending (a secret was shown but no code has
 * confirmed it yet): such a row does not count as a second factor. `lastStep` is the newest time
 * step whose code was accepted; a code of that step or an earlier one is refused (no replay).
 */
export const secondFactors = pgTable('second_factors', {
	userId: text('user_id')
		.primaryKey()
		.references(() => users.id, { onDelete: 'cascade' }),
	sealedSecret: text('sealed_secret').notNull(),
	createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
	enabledAt: timestamp('enabled_at', { withTimezone: true }),
	lastStep: bigint('last_step', { mode: 'number' })
});

/**
 * "Password verified, code still to come": made when a person with a second factor typed the right
 * password, and used once by the code step. The browser holds the token in an HttpOnly cookie;
 * only its sha256 is stored. `passwordDigest` (sha256 of the password hash at that moment) voids
 * the step when the password changes before the code is entered.
 */
export const signInCodeSteps = pgTable(
	'sign_in_code_steps',
	{
		tokenHash: text('token_hash').primaryKey(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		passwordDigest: text('password_digest').notNull(),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
		usedAt: timestamp('used_at', { withTimezone: true })
	},
	(t) => [index('sign_in_code_steps_user_idx').on(t.userId)]
);

/**
 * A person's own view settings (e.g. the lots list's columns and sort), one row per person and
 * screen, so they follow the person from one browser or reload to the next. The value is checked
 * by the screen's own zod schema when it is read.
 */
export const userPreferences = pgTable(
	'user_preferences',
	{
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		key: text('key').notNull(),
		value: jsonb('value').notNull(),
		updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [primaryKey({ columns: [t.userId, t.key] })]
);
