/**
 * Signing challenges for quality overrides. The server issues one per signer, lot, lot revision
 * and decision; the override names it, and consumes it in the decision's own transaction. So a
 * signed body cannot be replayed on another held lot, sent twice, used after the lot changed, or
 * turned into the other decision; and the challenge expires after CHALLENGE_MINUTES.
 */
import { and, eq, isNull, sql } from 'drizzle-orm';
import type { SessionUser } from '$lib/roles';
import { lotStateInText } from '$lib/status';
import type { Database, Tx } from '../db';
import { lots, signatureChallenges } from '../db/schema';
import { Conflict, DomainError, Forbidden, Invalid, NotFound } from '../errors';
import { can } from '../policy';
import { MEANING } from '../signature-manifest';

export const CHALLENGE_MINUTES = 30;

export type SignedDecision = 'accept' | 'reject';

export interface IssuedChallenge {
	challengeId: string;
	lotId: string;
	lotCode: string;
	revision: number;
	decision: SignedDecision;
	meaning: string;
	expiresAt: string;
}

/** The held lot a quality manager may decide: 404 when not visible, 403 without the right, 409 when not on hold. */
async function decidableLot(db: Database | Tx, user: SessionUser, lotId: string) {
	const [lot] = await db
		.select({ id: lots.id, lotCode: lots.lotCode, status: lots.status, revision: lots.revision, supplierId: lots.supplierId })
		.from(lots)
		.where(eq(lots.id, lotId));
	if (!lot || !can(user, 'lot:read', { supplierId: lot.supplierId })) throw new NotFound('lot');
	if (!can(user, 'lot:decide', { supplierId: lot.supplierId })) throw new Forbidden('Only quality managers decide held lots');
	if (lot.status !== 'on_hold')
		throw new Conflict(`The lot is ${lotStateInText(lot.status)}; only a lot on hold can be released or rejected`);
	return lot;
}

/** Issue a challenge for signing `decision` on the lot as it stands now (its current revision). */
export async function issueChallenge(db: Database, user: SessionUser, lotId: string, decision: SignedDecision): Promise<IssuedChallenge> {
	const lot = await decidableLot(db, user, lotId);
	const [row] = await db
		.insert(signatureChallenges)
		.values({
			lotId: lot.id,
			lotRevision: lot.revision,
			decision,
			userId: user.id,
			expiresAt: sql`now() + make_interval(mins => ${CHALLENGE_MINUTES})`
		})
		.returning({ id: signatureChallenges.id, expiresAt: signatureChallenges.expiresAt });
	return {
		challengeId: row.id,
		lotId: lot.id,
		lotCode: lot.lotCode,
		revision: lot.revision,
		decision,
		meaning: MEANING[decision],
		expiresAt: row.expiresAt.toISOString()
	};
}

export const challengeJson = (c: IssuedChallenge) => ({
	challenge_id: c.challengeId,
	lot_id: c.lotId,
	lot_code: c.lotCode,
	revision: c.revision,
	decision: c.decision,
	meaning: c.meaning,
	expires_at: c.expiresAt
});

/** A challenge that cannot sign: `invalid` for one that never fits, `conflict` for one that no longer does. */
const refused = (kind: 'conflict' | 'invalid', code: string, message: string) => {
	const issues = [{ path: 'challenge_id', message }];
	return kind === 'conflict' ? new Conflict(message, code, issues) : new Invalid(message, issues, code);
};

type ChallengeRow = typeof signatureChallenges.$inferSelect;

/** Why a challenge cannot sign this decision on this lot now, or null when it can. */
function whyNot(row: ChallengeRow | undefined, user: SessionUser, lotId: string, decision: SignedDecision, now: Date): DomainError | null {
	if (!row || row.userId !== user.id)
		return refused(
			'invalid',
			'challenge_unknown',
			'No signing challenge with this id was issued to you. Ask for one (POST …/decision/challenge) and sign again.'
		);
	if (row.lotId !== lotId)
		return refused('invalid', 'challenge_wrong_lot', 'This signing challenge was issued for another lot; nothing was decided.');
	if (row.decision !== decision)
		return refused(
			'invalid',
			'challenge_wrong_decision',
			`This signing challenge was issued to ${row.decision} the lot, not to ${decision} it; nothing was decided.`
		);
	if (row.usedAt)
		return refused(
			'conflict',
			'challenge_used',
			'This signing challenge has already been used; each signature needs a new one. Nothing was decided.'
		);
	if (row.expiresAt <= now)
		return refused(
			'conflict',
			'challenge_expired',
			`This signing challenge expired (they last ${CHALLENGE_MINUTES} minutes); ask for a new one and sign again. Nothing was decided.`
		);
	return null;
}

/** The lot moved on since the challenge was issued (a reading, a document, a limit changed). */
export const lotChanged = (from: number, to: number) =>
	refused(
		'conflict',
		'lot_changed',
		`The lot changed since the signing challenge was issued (revision ${from}, now ${to}): review it as it stands and sign again. Nothing was decided.`
	);

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** The challenge row; undefined for an id that is not even a UUID (a form sent without one). */
const loadChallenge = async (db: Database | Tx, challengeId: string): Promise<ChallengeRow | undefined> =>
	UUID.test(challengeId) ? (await db.select().from(signatureChallenges).where(eq(signatureChallenges.id, challengeId)))[0] : undefined;

/** Read-only check before the password is verified: refuse a wrong, used, expired or stale challenge early. */
export async function checkChallenge(
	db: Database,
	user: SessionUser,
	lotId: string,
	decision: SignedDecision,
	challengeId: string
): Promise<void> {
	const [row, [lot]] = await Promise.all([
		loadChallenge(db, challengeId),
		db.select({ revision: lots.revision }).from(lots).where(eq(lots.id, lotId))
	]);
	const why = whyNot(row, user, lotId, decision, new Date());
	if (why) throw why;
	if (lot && lot.revision !== row!.lotRevision) throw lotChanged(row!.lotRevision, lot.revision);
}

/**
 * Consume the challenge inside the decision's transaction (one UPDATE … WHERE used_at IS NULL, so
 * two requests with the same challenge cannot both pass) and return the revision it was issued at.
 */
export async function consumeChallenge(
	tx: Tx,
	user: SessionUser,
	lotId: string,
	decision: SignedDecision,
	challengeId: string
): Promise<{ id: string; revision: number }> {
	const [claimed] = await tx
		.update(signatureChallenges)
		.set({ usedAt: sql`now()` })
		.where(
			and(
				eq(signatureChallenges.id, challengeId),
				eq(signatureChallenges.userId, user.id),
				eq(signatureChallenges.lotId, lotId),
				eq(signatureChallenges.decision, decision),
				isNull(signatureChallenges.usedAt),
				sql`${signatureChallenges.expiresAt} > now()`
			)
		)
		.returning({ id: signatureChallenges.id, revision: signatureChallenges.lotRevision });
	if (claimed) return claimed;
	throw (
		whyNot(await loadChallenge(tx, challengeId), user, lotId, decision, new Date()) ??
		refused('conflict', 'challenge_used', 'This signing challenge has already been used. Nothing was decided.')
	);
}
