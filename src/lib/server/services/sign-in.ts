/**
 * Signing in and out: staff passwords (argon2id), who may ask for an e-mailed supplier link,
 * password-reset and invitation links, and the audit entries for all of it.
 */
import { createHash, randomBytes } from 'node:crypto';
import { hash, verify } from '@node-rs/argon2';
import { and, eq, gt, isNull } from 'drizzle-orm';
import { getDb } from '../db';
import { passwordResets, users } from '../db/schema';
import { createTransport, mailFrom } from '../mail/transport';
import { recordAudit } from './audit';
import { accountKey, addressLimit, clearFailures, releaseAttempt, reserveAttempt, signInLimits, type Limit } from './throttle';
import { endAllSessions } from './sessions';
import { hasSecondFactor } from './second-factor';
import { appOrigin } from '../origin';
import { findUserByEmail, normaliseEmail, toSessionUser } from './users';
import type { SessionUser } from '../../roles';

/** Verified against when the account is unknown, so a miss costs as long as a wrong password. */
const DECOY_HASH = '$argon2id$v=19$m=19456,t=2,p=1$o1XfHbm+j644r4qCYRa8Kg$hxoRiZTVNqP0CDi/uSW9bnW27cWzMwb6ij+66qt1g6c';

export const RESET_MINUTES = 60;
export const INVITE_MINUTES = 3 * 24 * 60;

/** `secondFactor`: the account has a TOTP factor on, so the password alone does not sign in. */
export type PasswordCheck = { ok: true; user: SessionUser; secondFactor: boolean } | { ok: false; reason: 'throttled' | 'invalid' };

/**
 * The whole staff password check: an attempt is reserved under the throttle first (atomically, so
 * parallel guesses queue behind it), then the hash is checked. Only active staff with a password
 * may pass; every refusal looks the same from outside and is counted and audited.
 */
export async function checkStaffPassword(input: { email: string; password: string; address: string }): Promise<PasswordCheck> {
	const email = normaliseEmail(input.email);
	const reservation = await reserveAttempt(signInLimits(email, input.address));
	if (!reservation) {
		await audit('auth.sign_in_throttled', { email, ip: input.address });
		return { ok: false, reason: 'throttled' };
	}
	const user = await findUserByEmail(email);
	const usable = !!user && user.active && user.role !== 'supplier' && !!user.passwordHash;
	const matches = await verify(usable ? user.passwordHash! : DECOY_HASH, input.password).catch(() => false);
	if (!usable || !matches) {
		await audit('auth.sign_in_failed', { email, ip: input.address, userId: user?.id, method: 'password' });
		return { ok: false, reason: 'invalid' };
	}
	await releaseAttempt(reservation);
	// With a second factor the sign-in is complete only after the code; the account's count is
	// cleared then (second-factor.ts), so a known password cannot reset the count of wrong codes.
	const secondFactor = await hasSecondFactor(user.id);
	if (!secondFactor) await clearFailures(accountKey(email));
	return { ok: true, user: toSessionUser(user), secondFactor };
}

/**
 * Sign-in link and reset requests are counted (5 per e-mail address, 20 per client address per
 * 15 minutes), so the forms cannot be used to flood someone's inbox.
 */
export async function linkRequestAllowed(email: string, address: string): Promise<boolean> {
	const limits: Limit[] = [
		{ key: `link:${normaliseEmail(email)}`, kind: 'hard', max: 5, windowMinutes: 15 },
		{ ...addressLimit(address), key: `link-address:${address}` }
	];
	return (await reserveAttempt(limits)) !== null;
}

/** How long sign-in, link and reset answers take at least, whether or not the account exists. */
export const ANSWER_FLOOR_MS = 400;

/**
 * Run `work` and answer no sooner than `floorMs` after it began (also when it throws, as a
 * redirect does), so the time of the answer does not tell whether an account exists. The mail
 * itself leaves in the background (see `sendMailLater`), so SMTP time does not show either.
 */
export async function withAnswerFloor<T>(work: () => Promise<T>, floorMs = ANSWER_FLOOR_MS): Promise<T> {
	const started = performance.now();
	try {
		return await work();
	} finally {
		const left = floorMs - (performance.now() - started);
		if (left > 0) await new Promise((done) => setTimeout(done, left));
	}
}

/** Only active supplier users get e-mailed sign-in links. */
export async function supplierMayUseLink(email: string): Promise<boolean> {
	const user = await findUserByEmail(email);
	return !!user && user.active && user.role === 'supplier';
}

export async function recordSignIn(user: { id: string; email: string }, method: string, ip: string | null) {
	await audit('auth.sign_in', { userId: user.id, email: user.email, ip, method });
}

export async function recordSignOut(user: SessionUser, ip: string | null) {
	await audit('auth.sign_out', { userId: user.id, email: user.email, ip });
}

async function audit(action: string, e: { email: string; ip: string | null; userId?: string; method?: string }) {
	await recordAudit(getDb(), {
		actorId: e.userId ?? null,
		actorEmail: e.email,
		action,
		entityType: 'user',
		entityId: e.userId,
		details: e.method ? { method: e.method } : {},
		ip: e.ip
	});
}

// ---- password links (reset and invitation share one mechanism) ----

const hashLinkToken = (token: string) => createHash('sha256').update(token).digest('hex');

/** A single-use link token; only its sha256 is stored. */
export async function createPasswordLink(userId: string, minutes: number): Promise<string> {
	const token = randomBytes(32).toString('base64url');
	await getDb()
		.insert(passwordResets)
		.values({ tokenHash: hashLinkToken(token), userId, expiresAt: new Date(Date.now() + minutes * 60_000) });
	return token;
}

/** The person a live (unused, unexpired) link belongs to, or null. */
export async function userForPasswordLink(token: string) {
	const [row] = await getDb()
		.select({ id: users.id, email: users.email, name: users.name })
		.from(passwordResets)
		.innerJoin(users, eq(users.id, passwordResets.userId))
		.where(
			and(
				eq(passwordResets.tokenHash, hashLinkToken(token)),
				isNull(passwordResets.usedAt),
				gt(passwordResets.expiresAt, new Date()),
				eq(users.active, true)
			)
		);
	return row ?? null;
}

/** Set the password through a link, once. Returns false if the link is not (or no longer) valid. */
export async function usePasswordLink(token: string, password: string, ip: string | null): Promise<boolean> {
	const passwordHash = await hash(password);
	const tokenHash = hashLinkToken(token);
	const done = await getDb().transaction(async (tx) => {
		const [link] = await tx
			.select({ userId: passwordResets.userId })
			.from(passwordResets)
			.where(and(eq(passwordResets.tokenHash, tokenHash), isNull(passwordResets.usedAt), gt(passwordResets.expiresAt, new Date())))
			.for('update');
		if (!link) return null;
		const [user] = await tx
			.update(users)
			.set({ passwordHash, emailVerified: new Date() })
			.where(and(eq(users.id, link.userId), eq(users.active, true)))
			.returning({ id: users.id, email: users.email });
		if (!user) return null;
		await tx.update(passwordResets).set({ usedAt: new Date() }).where(eq(passwordResets.tokenHash, tokenHash));
		// A new password ends every session signed in with the old one (a stolen cookie too).
		await endAllSessions(tx, user.id, 'password_changed');
		await recordAudit(tx, {
			actorId: user.id,
			actorEmail: user.email,
			action: 'auth.password_set',
			entityType: 'user',
			entityId: user.id,
			ip
		});
		return user;
	});
	if (done) await clearFailures(accountKey(done.email));
	return !!done;
}

/** Mail a reset link to active staff; silently nothing for anyone else (no account enumeration). */
export async function requestPasswordReset(email: string, ip: string | null): Promise<void> {
	const user = await findUserByEmail(email);
	if (!user || !user.active || user.role === 'supplier') return;
	const token = await createPasswordLink(user.id, RESET_MINUTES);
	await audit('auth.password_reset_requested', { userId: user.id, email: user.email, ip });
	sendMailLater(user.email, 'Reset your Restvolt password', [
		`Hello${user.name ? ' ' + user.name : ''},`,
		'',
		'Someone (hopefully you) asked to reset the password of your Restvolt account.',
		`Choose a new password here within ${RESET_MINUTES} minutes (the link works once):`,
		'',
		`${appOrigin()}/signin/reset/${token}`,
		'',
		'If you did not ask for this, ignore this message; your password stays as it is.'
	]);
}

/** Tell a newly invited person how to get in: a set-password link for staff, the portal for suppliers. */
export async function sendInvitation(user: { id: string; email: string; name: string | null; role: string }) {
	const hello = `Hello${user.name ? ' ' + user.name : ''},`;
	if (user.role === 'supplier') {
		await sendMail(user.email, 'Your Restvolt supplier portal access', [
			hello,
			'',
			'You now have access to the Restvolt supplier portal, where you see your lots, reports and notices.',
			'There is no password: open the page below, enter this e-mail address and we e-mail you a sign-in link.',
			'',
			`${appOrigin()}/signin`
		]);
		return;
	}
	const token = await createPasswordLink(user.id, INVITE_MINUTES);
	await sendMail(user.email, 'You are invited to Restvolt', [
		hello,
		'',
		'An administrator created a Restvolt account for you. Choose your password here (the link works once, for 3 days):',
		'',
		`${appOrigin()}/signin/reset/${token}`
	]);
}

export async function sendMail(to: string, subject: string, lines: string[]): Promise<void> {
	await createTransport().sendMail({ from: mailFrom(), to, subject, text: lines.join('\n') });
}

/**
 * Send without waiting: for answers that must not take longer when an account exists (sign-in
 * links, password resets). A failure is logged; the person can ask again.
 */
export function sendMailLater(to: string, subject: string, lines: string[]): void {
	sendMail(to, subject, lines).catch((error: unknown) => console.error(`[mail] "${subject}" to ${to} failed:`, error));
}
