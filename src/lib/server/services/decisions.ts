/**
 * Dispositions: the engine's decision on submit (and on re-evaluation of a held lot), and the
 * quality manager's e-signed override of a held lot. Each writes the evaluation, the lot status,
 * the decision row, the supplier notice (outbox) and the audit entry in ONE transaction.
 */
import { verify } from '@node-rs/argon2';
import { and, desc, eq, sql } from 'drizzle-orm';
import { getDb, type Tx } from '../db';
import { decisions, evaluations, lots, users } from '../db/schema';
import { Conflict, DomainError, Forbidden, Invalid, NotFound, Throttled } from '../errors';
import { dateTime } from '$lib/format';
import { lotStateInText } from '$lib/status';
import { can } from '../policy';
import { recordAudit } from './audit';
import { queueWebhookEvent } from './webhooks';
import { evaluateLotNow, type LotEvaluation } from './evaluation';
import { queueNotice } from './notices';
import { lockSamplingOfLot, refreshSamplingState } from './sampling-state';
import { checkChallenge, consumeChallenge, lotChanged } from './signature-challenges';
import { signatureManifest } from '../signature-manifest';
import { accountLimit, clearFailures, releaseAttempt, reserveAttempt } from './throttle';
import type { FinalStatus } from '../mail/templates';
import type { SessionUser } from '../../roles';

type LotStatus = (typeof lots.$inferSelect)['status'];
const STATUS_OF = { accept: 'accepted', hold: 'on_hold', reject: 'rejected' } as const satisfies Record<string, FinalStatus>;
const SUBMITTABLE: LotStatus[] = ['in_inspection', 'pending_decision'];

export interface DecisionOutcome {
	lotId: string;
	status: FinalStatus;
	previousStatus: LotStatus;
	evaluationId: number | null;
	decisionId: string | null;
	noticeId: string | null;
	evaluation: Omit<LotEvaluation, 'inputs'> | null;
}

/**
 * Lock the lot row for the rest of the transaction; 404 when the user may not see it. The part's
 * switching-state lock comes first (the order every state writer keeps; see sampling-state.ts).
 */
async function lockLot(tx: Tx, user: SessionUser, lotId: string) {
	await lockSamplingOfLot(tx, lotId);
	const [lot] = await tx.select().from(lots).where(eq(lots.id, lotId)).for('update');
	if (!lot || !can(user, 'lot:read', { supplierId: lot.supplierId })) throw new NotFound('lot');
	return lot;
}

async function storeEvaluation(tx: Tx, user: SessionUser, evaluation: LotEvaluation): Promise<number> {
	const { inputs, plan, ...result } = evaluation;
	const [row] = await tx
		.insert(evaluations)
		.values({
			lotId: evaluation.lot_id,
			modelId: evaluation.model.id,
			modelVersion: evaluation.model.version,
			severity: evaluation.severity,
			plan,
			inputs,
			result,
			disposition: evaluation.status,
			safety: evaluation.safety,
			createdBy: user.id
		})
		.returning({ id: evaluations.id });
	return row.id;
}

const reasonTexts = (e: LotEvaluation) => e.reasons.filter((r) => r.severity !== 'info').map((r) => r.message);
const withoutInputs = ({ inputs: _inputs, ...rest }: LotEvaluation) => rest;

function assertSampleComplete(evaluation: LotEvaluation): asserts evaluation is LotEvaluation & { status: 'accept' | 'hold' | 'reject' } {
	if (evaluation.status !== 'pending') return;
	const why = evaluation.reasons.find((r) => r.code === 'sample_incomplete')?.message;
	throw new Invalid(why ?? `The sample is not complete: ${evaluation.plan.sample_size} units are needed.`, undefined, 'sample_incomplete');
}

/**
 * A lot submitted before its sample was complete (allowed only when the rules already reject it:
 * ISO 2859-1 lets reaching Re end the sample; a safety reject needs no more units): the decision
 * records that it came early, with how many units were measured and why.
 */
function earlySubmission(evaluation: LotEvaluation): string | null {
	const measured = evaluation.units.length;
	if (measured >= evaluation.plan.sample_size) return null;
	const why = evaluation.reasons.filter((r) => r.severity === 'reject').map((r) => r.message);
	return `Submitted early, with ${measured} of ${evaluation.plan.sample_size} sample units measured: ${why.join(' ')}`;
}

/** Write the engine's decision (status, decision row, notice, audit) for a finished evaluation. */
async function applyAutomatic(
	tx: Tx,
	user: SessionUser,
	lot: { supplierId: string; partId: string },
	evaluation: LotEvaluation & { status: 'accept' | 'hold' | 'reject' },
	from: LotStatus,
	evaluationId: number,
	reason: string | null
) {
	const status = STATUS_OF[evaluation.status];
	const severity = evaluation.severity;
	await tx
		.update(lots)
		.set({ status, severity, decidedAt: sql`coalesce(${lots.decidedAt}, now())`, updatedAt: new Date() })
		.where(eq(lots.id, evaluation.lot_id));
	const [decision] = await tx
		.insert(decisions)
		.values({ lotId: evaluation.lot_id, evaluationId, kind: 'automatic', fromStatus: from, toStatus: status, reason, decidedBy: user.id })
		.returning({ id: decisions.id });
	await refreshSamplingState(tx, lot.supplierId, lot.partId);
	const noticeId = await queueNotice(tx, {
		lotId: evaluation.lot_id,
		decisionId: decision.id,
		kind: evaluation.status,
		status,
		safety: evaluation.safety,
		reasons: reasonTexts(evaluation),
		decisionReason: null
	});
	await recordAudit(tx, {
		actorId: user.id,
		actorEmail: user.email,
		action: 'lot.decided',
		entityType: 'lot',
		entityId: evaluation.lot_id,
		lotId: evaluation.lot_id,
		details: { kind: 'automatic', from, to: status, evaluationId, safety: evaluation.safety, reason }
	});
	await queueWebhookEvent(tx, 'lot.decided', {
		lot_id: evaluation.lot_id,
		decision_id: decision.id,
		kind: 'automatic',
		from,
		to: status,
		safety: evaluation.safety,
		reason
	});
	return { status, decisionId: decision.id, noticeId };
}

/** Inspector or quality submits a complete sample: the engine decides, all in one transaction. */
export async function submitLot(user: SessionUser, lotId: string): Promise<DecisionOutcome> {
	return getDb().transaction(async (tx) => {
		const lot = await lockLot(tx, user, lotId);
		if (!can(user, 'lot:submit', { supplierId: lot.supplierId })) throw new Forbidden('Your role may not submit lots');
		if (!SUBMITTABLE.includes(lot.status)) {
			throw new Conflict(
				`The lot is ${lotStateInText(lot.status)}; only a lot on the bench or awaiting decision can be submitted for decision`
			);
		}
		const evaluation = await evaluateLotNow(tx, lotId);
		assertSampleComplete(evaluation);
		const evaluationId = await storeEvaluation(tx, user, evaluation);
		const applied = await applyAutomatic(tx, user, lot, evaluation, lot.status, evaluationId, earlySubmission(evaluation));
		return { lotId, previousStatus: lot.status, evaluationId, ...applied, evaluation: withoutInputs(evaluation) };
	});
}

/**
 * Quality re-runs the engine on a held lot after readings were corrected. A new evaluation row is
 * always added (old ones stay); the status changes only when the engine now decides otherwise.
 */
export async function reevaluateLot(user: SessionUser, lotId: string): Promise<DecisionOutcome> {
	return getDb().transaction(async (tx) => {
		const lot = await lockLot(tx, user, lotId);
		if (!can(user, 'lot:decide', { supplierId: lot.supplierId })) throw new Forbidden('Only quality may re-evaluate a held lot');
		if (lot.status !== 'on_hold') throw new Conflict(`The lot is ${lotStateInText(lot.status)}; only a held lot can be re-evaluated`);
		const evaluation = await evaluateLotNow(tx, lotId);
		assertSampleComplete(evaluation);
		const evaluationId = await storeEvaluation(tx, user, evaluation);
		if (STATUS_OF[evaluation.status] === 'on_hold') {
			await recordAudit(tx, {
				actorId: user.id,
				actorEmail: user.email,
				action: 'lot.reevaluated',
				entityType: 'lot',
				entityId: lotId,
				lotId,
				details: { evaluationId, result: 'hold' }
			});
			return {
				lotId,
				previousStatus: lot.status,
				status: 'on_hold',
				evaluationId,
				decisionId: null,
				noticeId: null,
				evaluation: withoutInputs(evaluation)
			};
		}
		const applied = await applyAutomatic(tx, user, lot, evaluation, lot.status, evaluationId, 'Re-evaluated after corrected readings');
		return { lotId, previousStatus: lot.status, evaluationId, ...applied, evaluation: withoutInputs(evaluation) };
	});
}

export interface OverrideInput {
	decision: 'accept' | 'reject';
	reason: string;
	password: string;
	/** The server-issued signing challenge for this lot, revision and decision (signature-challenges.ts). */
	challengeId: string;
}

export const SAFETY_RELEASE_REFUSED =
	'This lot was rejected for safety (a unit rested below its minimum voltage). It cannot be released: deep-discharged lithium-ion units must not be recharged or used.';

/**
 * The password check of the e-signature: an attempt is reserved per signer before the hash is
 * checked (parallel guesses queue behind it and back off), failures are kept and audited.
 */
export async function verifySignature(user: SessionUser, password: string, ip: string | null): Promise<void> {
	const key = `signature:${user.id}`;
	const reservation = await reserveAttempt([accountLimit(key)]);
	if (!reservation) throw new Throttled('Too many wrong passwords — wait a few minutes and try again.');
	const [row] = await getDb().select({ hash: users.passwordHash, active: users.active }).from(users).where(eq(users.id, user.id));
	const ok = !!row?.hash && row.active && (await verify(row.hash, password).catch(() => false));
	if (!ok) {
		await recordAudit(getDb(), { actorId: user.id, actorEmail: user.email, action: 'decision.signature_failed', ip });
		throw new Forbidden('The password is not correct; nothing was decided.', 'signature_invalid');
	}
	await releaseAttempt(reservation);
	await clearFailures(key);
}

async function latestEvaluation(tx: Tx, lotId: string) {
	const [row] = await tx.select().from(evaluations).where(eq(evaluations.lotId, lotId)).orderBy(desc(evaluations.id)).limit(1);
	return row ?? null;
}

/** Why a lot is no longer on hold: who moved it and when, for the conflict message. */
async function alreadyDecided(tx: Tx, lotId: string, status: LotStatus): Promise<DomainError> {
	const [last] = await tx
		.select({ at: decisions.decidedAt, by: users.name, email: users.email })
		.from(decisions)
		.leftJoin(users, eq(users.id, decisions.decidedBy))
		.where(eq(decisions.lotId, lotId))
		.orderBy(desc(decisions.decidedAt))
		.limit(1);
	const who = last ? ` by ${last.by ?? last.email ?? 'someone else'} at ${dateTime(last.at, { seconds: true })}` : '';
	return new Conflict(`Another decision was recorded first: the lot is now ${lotStateInText(status)}${who}. Nothing was changed.`);
}

/**
 * Quality releases or rejects a held lot, e-signed by re-entering the password against a
 * single-use challenge bound to the lot, its revision and the decision. The conditional
 * UPDATE … WHERE status = 'on_hold' AND revision = (the challenge's) makes exactly one of two
 * simultaneous overrides win, and none win on a lot that changed since the challenge was issued.
 * The stored manifest follows 21 CFR Part 11, §11.50 and §11.70 (see signature-manifest.ts).
 */
export async function decideOverride(
	user: SessionUser,
	lotId: string,
	input: OverrideInput,
	ip: string | null = null
): Promise<DecisionOutcome> {
	const reason = input.reason.trim();
	if (reason.length < 5)
		throw new Invalid('Give a reason for the decision (at least 5 characters)', [{ path: 'reason', message: 'Required' }]);
	const [visible] = await getDb().select({ supplierId: lots.supplierId }).from(lots).where(eq(lots.id, lotId));
	if (!visible || !can(user, 'lot:read', { supplierId: visible.supplierId })) throw new NotFound('lot');
	if (!can(user, 'lot:decide', { supplierId: visible.supplierId })) throw new Forbidden('Only quality managers decide held lots');
	await checkChallenge(getDb(), user, lotId, input.decision, input.challengeId);
	await verifySignature(user, input.password, ip);
	return getDb().transaction(async (tx) => {
		await lockSamplingOfLot(tx, lotId);
		const challenge = await consumeChallenge(tx, user, lotId, input.decision, input.challengeId);
		const latest = await latestEvaluation(tx, lotId);
		if (input.decision === 'accept' && latest?.safety) throw new Conflict(`Rejected for safety: ${SAFETY_RELEASE_REFUSED}`);
		const status: FinalStatus = input.decision === 'accept' ? 'accepted' : 'rejected';
		const [won] = await tx
			.update(lots)
			.set({ status, decidedAt: new Date(), updatedAt: new Date() })
			.where(and(eq(lots.id, lotId), eq(lots.status, 'on_hold'), eq(lots.revision, challenge.revision)))
			.returning({ id: lots.id, partId: lots.partId, lotCode: lots.lotCode });
		if (!won) {
			const [now] = await tx.select({ status: lots.status, revision: lots.revision }).from(lots).where(eq(lots.id, lotId));
			if (now.status !== 'on_hold') throw await alreadyDecided(tx, lotId, now.status);
			throw lotChanged(challenge.revision, now.revision);
		}
		const signedAt = new Date();
		const signed = {
			lot_id: lotId,
			lot_code: won.lotCode,
			revision: challenge.revision,
			decision: input.decision,
			reason,
			evaluation_id: latest?.id ?? null
		};
		const signature = signatureManifest(user, signed, challenge.id, signedAt);
		const [decision] = await tx
			.insert(decisions)
			.values({
				lotId,
				evaluationId: latest?.id ?? null,
				kind: 'override',
				fromStatus: 'on_hold',
				toStatus: status,
				reason,
				signature,
				decidedBy: user.id,
				decidedAt: signedAt
			})
			.returning({ id: decisions.id });
		await refreshSamplingState(tx, visible.supplierId, won.partId);
		const noticeId = await queueNotice(tx, {
			lotId,
			decisionId: decision.id,
			kind: 'override',
			status,
			safety: latest?.safety ?? false,
			reasons: [],
			decisionReason: reason
		});
		await recordAudit(tx, {
			actorId: user.id,
			actorEmail: user.email,
			action: 'lot.override_signed',
			entityType: 'lot',
			entityId: lotId,
			lotId,
			ip,
			details: { from: 'on_hold', to: status, signature }
		});
		await queueWebhookEvent(tx, 'lot.decided', {
			lot_id: lotId,
			lot_code: won.lotCode,
			decision_id: decision.id,
			kind: 'override',
			from: 'on_hold',
			to: status,
			reason
		});
		return {
			lotId,
			previousStatus: 'on_hold' as const,
			status,
			evaluationId: latest?.id ?? null,
			decisionId: decision.id,
			noticeId,
			evaluation: null
		};
	});
}

/** Held lots for the quality queue, oldest decision first, with the latest evaluation's reasons. */
export async function reviewQueue() {
	const rows = await getDb().execute<{
		id: string;
		lot_code: string;
		po_number: string;
		supplier: string;
		part_number: string;
		quantity: number;
		decided_at: Date | string | null;
		result: { reasons?: { code: string; severity: string; message: string }[] } | null;
	}>(sql`
		select l.id, l.lot_code, l.po_number, o.name as supplier, p.part_number, l.quantity, l.decided_at,
		       (select e.result from evaluations e where e.lot_id = l.id order by e.id desc limit 1) as result
		from lots l join organisations o on o.id = l.supplier_id join parts p on p.id = l.part_id
		where l.status = 'on_hold'
		order by l.decided_at asc nulls last, l.created_at asc`);
	return rows.rows.map((r) => ({
		id: r.id,
		lotCode: r.lot_code,
		poNumber: r.po_number,
		supplier: r.supplier,
		partNumber: r.part_number,
		quantity: r.quantity,
		heldSince: r.decided_at ? new Date(r.decided_at).toISOString() : null,
		reasons: (r.result?.reasons ?? []).filter((x) => x.severity !== 'info')
	}));
}
