/**
 * API tokens: `rv_` + 32 random bytes (base64url). The plaintext is returned once at creation;
 * only its sha256 is stored. A token acts as its user, with that user's role narrowed by its scope
 * (token-scopes.ts), while the user is active and the token is neither revoked nor expired.
 */
import { createHash, randomBytes } from 'node:crypto';
import { and, desc, eq, gt, isNull, or, sql } from 'drizzle-orm';
import { getDb } from '../db';
import { apiTokens, users } from '../db/schema';
import { recordAudit } from './audit';
import { findUserByEmail, toSessionUser, type Actor } from './users';
import type { SessionUser } from '../../roles';
import type { TokenScope } from '../token-scopes';

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
export async function createToken(input: {
	userId: string;
	label: string;
	actor: Actor | null;
	scope?: TokenScope;
	expiresAt?: Date | null;
}): Promise<CreatedToken> {
	const scope = input.scope ?? 'role';
	const expiresAt = input.expiresAt ?? null;
	const { token, hash, prefix } = generateToken();
	return getDb().transaction(async (tx) => {
		const [row] = await tx
			.insert(apiTokens)
			.values({ userId: input.userId, label: input.label, tokenHash: hash, prefix, scope, expiresAt, createdBy: input.actor?.id ?? null })
			.returning({ id: apiTokens.id });
		await recordAudit(tx, {
			actorId: input.actor?.id ?? null,
			actorEmail: input.actor?.email ?? 'command line',
			action: 'token.created',
			entityType: 'api_token',
			entityId: row.id,
			details: { userId: input.userId, label: input.label, prefix, scope, expiresAt: expiresAt?.toISOString() ?? null }
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
			scope: apiTokens.scope,
			expiresAt: apiTokens.expiresAt,
			createdAt: apiTokens.createdAt,
			lastUsedAt: apiTokens.lastUsedAt,
			revokedAt: apiTokens.revokedAt
		})
		.from(apiTokens)
		.innerJoin(users, eq(users.id, apiTokens.userId))
		.orderBy(sql`${apiTokens.revokedAt} is not null`, desc(apiTokens.createdAt));
}

/** A note of the token's last use is written at most once a minute (not on every API call). */
const lastUseIsStale = sql<boolean>`(${apiTokens.lastUsedAt} is null or ${apiTokens.lastUsedAt} < now() - interval '1 minute')`;

/** The user a bearer token acts as, or null (see tokenGrant). */
export async function userForToken(token: string): Promise<SessionUser | null> {
	return (await tokenGrant(token))?.user ?? null;
}

/**
 * The user a bearer token acts as and the token's scope, or null: the token's hash is stored, not
 * revoked, not expired, and its user is active. Notes the token's last use (at most once a minute).
 */
export async function tokenGrant(token: string): Promise<{ user: SessionUser; scope: TokenScope } | null> {
	const db = getDb();
	const [row] = await db
		.select({
			tokenId: apiTokens.id,
			scope: apiTokens.scope,
			stale: lastUseIsStale,
			id: users.id,
			email: users.email,
			name: users.name,
			role: users.role,
			organisationId: users.organisationId
		})
		.from(apiTokens)
		.innerJoin(users, and(eq(users.id, apiTokens.userId), eq(users.active, true)))
		.where(
			and(
				eq(apiTokens.tokenHash, hashToken(token)),
				isNull(apiTokens.revokedAt),
				or(isNull(apiTokens.expiresAt), gt(apiTokens.expiresAt, sql`now()`))
			)
		);
	if (!row) return null;
	if (row.stale)
		await db
			.update(apiTokens)
			.set({ lastUsedAt: new Date() })
			.where(and(eq(apiTokens.id, row.tokenId), lastUseIsStale));
	return { user: toSessionUser(row), scope: row.scope };
}
