/**
 * API tokens: `rv_` + 32 random bytes (base64url). The plaintext is returned once at creation;
 * only its sha256 is stored. A token acts as its user, with that user's role, while the user is
 * active and the token is not revoked.
 */
import { createHash, randomBytes } from 'node:crypto';
import { and, desc, eq, isNull, sql } from 'drizzle-orm';
import { getDb, getPool } from '../db';
import { apiTokens, users } from '../db/schema';
import { recordAudit } from './audit';
import { findUserByEmail, toSessionUser, type Actor } from './users';
import type { SessionUser } from '../../roles';

export const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');

function generateToken() {
	const token = `rv_${randomBytes(32).toString('base64url')}`;
	return { token, hash: hashToken(token), prefix: token.slice(0, 10) };
}

export interface CreatedToken {
	id: string;
	token: string;
	prefix: string;
}

/** Create a token for a user. `actor` is null when created from the command line. */
export async function createToken(input: { userId: string; label: string; actor: Actor | null }): Promise<CreatedToken> {
	const { token, hash, prefix } = generateToken();
	return getDb().transaction(async (tx) => {
		const [row] = await tx
			.insert(apiTokens)
			.values({ userId: input.userId, label: input.label, tokenHash: hash, prefix, createdBy: input.actor?.id ?? null })
			.returning({ id: apiTokens.id });
		await recordAudit(tx, {
			actorId: input.actor?.id ?? null,
			actorEmail: input.actor?.email ?? 'command line',
			action: 'token.created',
			entityType: 'api_token',
			entityId: row.id,
			details: { userId: input.userId, label: input.label, prefix }
		});
		return { id: row.id, token, prefix };
	});
}

export class UnknownUserError extends Error {}

/** For `npm run token`: a token for an existing, active user found by e-mail. */
export async function createTokenForEmail(email: string, label = 'command line'): Promise<CreatedToken> {
	const user = await findUserByEmail(email);
	if (!user) throw new UnknownUserError(`No user with the e-mail address ${email}`);
	if (!user.active) throw new UnknownUserError(`The user ${email} is deactivated`);
	return createToken({ userId: user.id, label, actor: null });
}

/** Revoke; returns false when there was no such live token. */
export async function revokeToken(actor: Actor, id: string): Promise<boolean> {
	return getDb().transaction(async (tx) => {
		const [row] = await tx
			.update(apiTokens)
			.set({ revokedAt: new Date() })
			.where(and(eq(apiTokens.id, id), isNull(apiTokens.revokedAt)))
			.returning({ id: apiTokens.id, userId: apiTokens.userId, prefix: apiTokens.prefix });
		if (!row) return false;
		await recordAudit(tx, {
			actorId: actor.id,
			actorEmail: actor.email,
			action: 'token.revoked',
			entityType: 'api_token',
			entityId: row.id,
			details: { userId: row.userId, prefix: row.prefix }
		});
		return true;
	});
}

export async function listTokens() {
	return getDb()
		.select({
			id: apiTokens.id,
			label: apiTokens.label,
			prefix: apiTokens.prefix,
			userEmail: users.email,
			userRole: users.role,
			createdAt: apiTokens.createdAt,
			lastUsedAt: apiTokens.lastUsedAt,
			revokedAt: apiTokens.revokedAt
		})
		.from(apiTokens)
		.innerJoin(users, eq(users.id, apiTokens.userId))
		.orderBy(sql`${apiTokens.revokedAt} is not null`, desc(apiTokens.createdAt));
}

/** Columns and joins of a live token's user; `$1` is the token's sha256. Shared by the statements below and in evaluation-cache.ts. */
export const TOKEN_USER_COLUMNS = `t.id as token_id, (t.last_used_at is null or t.last_used_at < now() - interval '1 minute') as stale,
	u.id, u.email, u.name, u.role::text as role, u.organisation_id`;
export const TOKEN_USER_FROM = `api_tokens t join "user" u on u.id = t.user_id and u.active`;
export const LIVE_TOKEN = `t.token_hash = $1 and t.revoked_at is null`;

export interface TokenUserRow {
	token_id: string;
	stale: boolean;
	id: string;
	email: string;
	name: string | null;
	role: SessionUser['role'];
	organisation_id: string | null;
}

/** The user of a row found by LIVE_TOKEN; notes the token's last use at most once a minute. */
export async function tokenUserOf(row: TokenUserRow): Promise<SessionUser> {
	if (row.stale) {
		await getDb()
			.update(apiTokens)
			.set({ lastUsedAt: new Date() })
			.where(and(eq(apiTokens.id, row.token_id), sql`(${apiTokens.lastUsedAt} is null or ${apiTokens.lastUsedAt} < now() - interval '1 minute')`));
	}
	return toSessionUser({ id: row.id, email: row.email, name: row.name, role: row.role, organisationId: row.organisation_id });
}

/**
 * The user a bearer token acts as, or null. One named statement (parsed and planned once per
 * connection) on every API call; the last-use note is a second statement at most once a minute.
 */
export async function userForToken(token: string): Promise<SessionUser | null> {
	const result = await getPool().query<TokenUserRow>({
		name: 'restvolt_user_for_token_v2',
		text: `select ${TOKEN_USER_COLUMNS} from ${TOKEN_USER_FROM} where ${LIVE_TOKEN}`,
		values: [hashToken(token)]
	});
	const row = result.rows[0];
	return row ? tokenUserOf(row) : null;
}
