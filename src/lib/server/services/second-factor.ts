/**
 * The TOTP second factor of staff accounts: enrolment (a pending secret, confirmed by a first code),
 * turning it off (password + code), and the code step of signing in.
 *
 * Every code check, wherever it happens, goes through `useCode`: under a row lock on the person's
 * factor it accepts a code of ±1 time step only when that step is newer than the last accepted
 * one, and records it, so a code (or an older one) can never be used twice, even by two parallel
 * requests. Every code attempt is reserved under the sign-in throttle first, like a password: a
 * wrong code counts against the account and the client address.
 */
import { createHash, randomBytes } from 'node:crypto';
import { verify } from '@node-rs/argon2';
import { and, eq, gt, isNotNull, isNull, lt, or, sql, TransactionRollbackError } from 'drizzle-orm';
import { getDb, type Tx } from '../db';
import { secondFactors, signInCodeSteps, users } from '../db/schema';
import { recordAudit } from './audit';
import { endAllSessions, endOtherSessions } from './sessions';
import { accountKey, clearFailures, releaseAttempt, reserveAttempt, signInLimits } from './throttle';
import { openSecret, sealSecret } from './second-factor-seal';
import { acceptedStep, groupedForTyping, newTotpSecret, totpUri } from './totp';
import { toSessionUser } from './users';
import type { Role, SessionUser } from '../../roles';

/** How long the code step waits after a right password. */
export const CODE_STEP_MINUTES = 5;

/** Roles the site can oblige to use a second factor (they sign e-records and manage people). */
const REQUIRED_ROLES: readonly Role[] = ['quality', 'admin'];

/** RESTVOLT_REQUIRE_TOTP=on: quality managers and administrators must enrol before anything else. */
export function siteRequiresSecondFactor(role: Role): boolean {
	return process.env.RESTVOLT_REQUIRE_TOTP === 'on' && REQUIRED_ROLES.includes(role);
}

const authSecret = () => process.env.AUTH_SECRET ?? '';
const sha256 = (text: string) => createHash('sha256').update(text).digest('hex');

/** Whether the person has a confirmed second factor (a pending enrolment does not count). */
export async function hasSecondFactor(userId: string): Promise<boolean> {
	const [row] = await getDb()
		.select({ userId: secondFactors.userId })
		.from(secondFactors)
		.where(and(eq(secondFactors.userId, userId), isNotNull(secondFactors.enabledAt)));
	return !!row;
}

export type SecondFactorState =
	{ state: 'on'; enabledAt: Date } | { state: 'pending'; secretGrouped: string; uri: string } | { state: 'off' };

/** What the security page shows: on since when, a pending enrolment (with its secret), or off. */
export async function secondFactorState(user: SessionUser): Promise<SecondFactorState> {
	const [row] = await getDb().select().from(secondFactors).where(eq(secondFactors.userId, user.id));
	if (!row) return { state: 'off' };
	if (row.enabledAt) return { state: 'on', enabledAt: row.enabledAt };
	const secret = openSecret(row.sealedSecret, user.id, authSecret());
	return { state: 'pending', secretGrouped: groupedForTyping(secret), uri: totpUri(secret, user.email) };
}

/** Start (or restart) enrolment with a new secret. False when a confirmed factor is already on. */
export async function beginEnrolment(user: SessionUser, ip: string | null): Promise<boolean> {
	const sealed = sealSecret(newTotpSecret(), user.id, authSecret());
	const written = await getDb()
		.insert(secondFactors)
		.values({ userId: user.id, sealedSecret: sealed })
		.onConflictDoUpdate({
			target: secondFactors.userId,
			set: { sealedSecret: sealed, createdAt: sql`now()`, lastStep: null },
			setWhere: isNull(secondFactors.enabledAt)
		})
		.returning({ userId: secondFactors.userId });
	if (written.length) await audit(user, 'auth.second_factor_setup_started', ip);
	return written.length > 0;
}

/**
 * Accept `code` for this person's factor (`which`: the confirmed one, or a pending enrolment) and
 * record its step. Runs inside the caller's transaction, holding the row lock until it commits.
 */
async function useCode(tx: Tx, userId: string, code: string, which: 'on' | 'pending'): Promise<boolean> {
	const [row] = await tx
		.select()
		.from(secondFactors)
		.where(and(eq(secondFactors.userId, userId), which === 'on' ? isNotNull(secondFactors.enabledAt) : isNull(secondFactors.enabledAt)))
		.for('update');
	if (!row) return false;
	let secret: string;
	try {
		secret = openSecret(row.sealedSecret, userId, authSecret());
	} catch (error) {
		// Altered row or a changed AUTH_SECRET: refuse, and say so in the log (the person sees "wrong code").
		console.error(`[second-factor] the stored secret of ${userId} cannot be opened:`, error);
		return false;
	}
	const step = acceptedStep(secret, code, row.lastStep, Date.now());
	if (step === null) return false;
	await tx.update(secondFactors).set({ lastStep: step }).where(eq(secondFactors.userId, userId));
	return true;
}

export type CodeOutcome = 'done' | 'invalid' | 'throttled';

/**
 * Reserve an attempt under the person's sign-in limits, run `attempt` in a transaction, keep the
 * reservation when it fails (a wrong code or password counts), give it back when it succeeds.
 */
async function throttled(user: SessionUser, ip: string | null, attempt: (tx: Tx) => Promise<boolean>): Promise<CodeOutcome> {
	const reservation = await reserveAttempt(signInLimits(user.email, ip ?? 'unknown'));
	if (!reservation) return 'throttled';
	// A refused attempt rolls back whatever it wrote (a step marked used, a code's time step).
	const ok = await getDb()
		.transaction(async (tx) => {
			if (!(await attempt(tx))) tx.rollback();
			return true;
		})
		.catch((error: unknown) => {
			if (error instanceof TransactionRollbackError) return false;
			throw error;
		});
	if (!ok) return 'invalid';
	await releaseAttempt(reservation);
	return 'done';
}

/** Confirm a pending enrolment with a current code: the factor is on, the person's other sessions end. */
export async function confirmEnrolment(
	user: SessionUser,
	input: { password: string; code: string },
	keepSessionId: string | null,
	ip: string | null
): Promise<CodeOutcome> {
	const outcome = await throttled(user, ip, async (tx) => {
		if (!(await passwordMatches(tx, user.id, input.password)) || !(await useCode(tx, user.id, input.code, 'pending'))) return false;
		await tx.update(secondFactors).set({ enabledAt: new Date() }).where(eq(secondFactors.userId, user.id));
		await endOtherSessions(tx, user.id, keepSessionId, 'second_factor_changed');
		await recordAudit(tx, auditEntry(user, 'auth.second_factor_enabled', ip));
		return true;
	});
	if (outcome === 'invalid') await audit(user, 'auth.second_factor_setup_failed', ip);
	return outcome;
}

async function passwordMatches(tx: Tx, userId: string, password: string): Promise<boolean> {
	const [row] = await tx.select({ passwordHash: users.passwordHash }).from(users).where(eq(users.id, userId));
	return !!row?.passwordHash && (await verify(row.passwordHash, password).catch(() => false));
}

/** Turn the factor off: needs the password and a current code; the person's other sessions end. */
export async function turnOffSecondFactor(
	user: SessionUser,
	input: { password: string; code: string },
	keepSessionId: string | null,
	ip: string | null
): Promise<CodeOutcome> {
	const outcome = await throttled(user, ip, async (tx) => {
		// The code is checked (and used up) only after a right password.
		if (!(await passwordMatches(tx, user.id, input.password)) || !(await useCode(tx, user.id, input.code, 'on'))) return false;
		await tx.delete(secondFactors).where(eq(secondFactors.userId, user.id));
		await endOtherSessions(tx, user.id, keepSessionId, 'second_factor_changed');
		await recordAudit(tx, auditEntry(user, 'auth.second_factor_disabled', ip));
		return true;
	});
	if (outcome === 'invalid') await audit(user, 'auth.second_factor_off_failed', ip);
	return outcome;
}

/** The people with a second factor on (for the administrators' list of people). */
export async function peopleWithSecondFactor(): Promise<Set<string>> {
	const rows = await getDb().select({ userId: secondFactors.userId }).from(secondFactors).where(isNotNull(secondFactors.enabledAt));
	return new Set(rows.map((r) => r.userId));
}

/**
 * An administrator removes someone's second factor (a lost or replaced phone), after checking who
 * they are outside Restvolt. Their sessions end; they sign in with the password and set up again.
 * False when the person had none.
 */
export async function removeSecondFactor(actor: { id: string; email: string }, userId: string, ip: string | null): Promise<boolean> {
	return getDb().transaction(async (tx) => {
		const removed = await tx.delete(secondFactors).where(eq(secondFactors.userId, userId)).returning({ userId: secondFactors.userId });
		if (!removed.length) return false;
		await endAllSessions(tx, userId, 'second_factor_changed');
		await tx.delete(signInCodeSteps).where(eq(signInCodeSteps.userId, userId));
		await recordAudit(tx, {
			actorId: actor.id,
			actorEmail: actor.email,
			action: 'auth.second_factor_removed',
			entityType: 'user',
			entityId: userId,
			ip
		});
		return true;
	});
}

// ---- the code step of signing in ----

/**
 * After a right password, for a person with the factor on: a single-use step token for the
 * browser (kept in an HttpOnly cookie by the sign-in page). Older steps of the person end.
 */
export async function startCodeStep(userId: string): Promise<string> {
	const token = randomBytes(32).toString('base64url');
	await getDb().transaction(async (tx) => {
		const [user] = await tx.select({ passwordHash: users.passwordHash }).from(users).where(eq(users.id, userId));
		await tx.delete(signInCodeSteps).where(or(eq(signInCodeSteps.userId, userId), lt(signInCodeSteps.expiresAt, sql`now()`)));
		await tx.insert(signInCodeSteps).values({
			tokenHash: sha256(token),
			userId,
			passwordDigest: sha256(user?.passwordHash ?? ''),
			expiresAt: sql`now() + make_interval(mins => ${CODE_STEP_MINUTES})`
		});
	});
	return token;
}

/** The person a live code step belongs to (for the page: "signing in as …"), or null. */
export async function codeStepPerson(token: string): Promise<SessionUser | null> {
	const [row] = await getDb()
		.select({ user: users, passwordDigest: signInCodeSteps.passwordDigest })
		.from(signInCodeSteps)
		.innerJoin(users, eq(users.id, signInCodeSteps.userId))
		.where(
			and(
				eq(signInCodeSteps.tokenHash, sha256(token)),
				isNull(signInCodeSteps.usedAt),
				gt(signInCodeSteps.expiresAt, sql`now()`),
				eq(users.active, true)
			)
		);
	// A password changed since the step began voids it.
	if (!row || row.passwordDigest !== sha256(row.user.passwordHash ?? '')) return null;
	return toSessionUser(row.user);
}

export type CodeStepCheck = { ok: true; user: SessionUser } | { ok: false; reason: 'throttled' | 'invalid' | 'expired' };

/**
 * The second half of a sign-in: the step token from the cookie and a current code. The step is
 * used up only by a right code; a wrong one counts against the throttle and the step stays until
 * it expires.
 */
export async function checkSignInCode(input: { token: string; code: string; address: string }): Promise<CodeStepCheck> {
	const user = await codeStepPerson(input.token);
	if (!user) return { ok: false, reason: 'expired' };
	const outcome = await throttled(user, input.address, async (tx) => {
		const used = await tx
			.update(signInCodeSteps)
			.set({ usedAt: new Date() })
			.where(
				and(eq(signInCodeSteps.tokenHash, sha256(input.token)), isNull(signInCodeSteps.usedAt), gt(signInCodeSteps.expiresAt, sql`now()`))
			)
			.returning({ userId: signInCodeSteps.userId });
		return used.length === 1 && (await useCode(tx, user.id, input.code, 'on'));
	});
	if (outcome === 'throttled') {
		await audit(user, 'auth.sign_in_throttled', input.address);
		return { ok: false, reason: 'throttled' };
	}
	if (outcome === 'invalid') {
		await recordAudit(getDb(), { ...auditEntry(user, 'auth.sign_in_failed', input.address), details: { method: 'code' } });
		return { ok: false, reason: 'invalid' };
	}
	// Only now is the sign-in complete: the account's count of failures starts afresh.
	await clearFailures(accountKey(user.email));
	return { ok: true, user };
}

/** "Start again" on the sign-in page: the step ends at once. */
export async function endCodeStep(token: string): Promise<void> {
	await getDb()
		.delete(signInCodeSteps)
		.where(eq(signInCodeSteps.tokenHash, sha256(token)));
}

function auditEntry(user: SessionUser, action: string, ip: string | null) {
	return { actorId: user.id, actorEmail: user.email, action, entityType: 'user', entityId: user.id, ip };
}

async function audit(user: SessionUser, action: string, ip: string | null) {
	await recordAudit(getDb(), auditEntry(user, action, ip));
}
