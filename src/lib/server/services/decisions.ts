/**
 * Dispositions. The engine's result is a proposal: on submit an 'accept' releases the lot at once
 * (when the part allows it) and notifies the supplier; 'hold' and 'reject' put the lot on hold
 * (quarantined at once) in quality's review queue, alert quality staff and tell the supplier
 * nothing. The quality manager's e-signed material disposition decides the lot, and only then is
 * the supplier notified. Each step writes its rows, outbox jobs and audit entry in ONE transaction.
 */
import { verify } from '@node-rs/argon2';
import { and, desc, eq, sql } from 'drizzle-orm';
import { getDb, type Tx } from '../db';
import { decisions, evaluations, lots, parts, users } from '../db/schema';
import { DISPOSITION, SAFETY_DISPOSITIONS, asksSupplier, type MaterialDisposition } from '$lib/schemas/disposition';
import { alertLotInReview } from './staff-alerts';
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

const reasonTexts = (e: Pick<LotEvaluation, 'reasons'>) => e.reasons.filter((r) => r.severity !== 'info').map((r) => r.message);
/** The findings of a stored evaluation row (its result JSON), for the notice. */
const reasonsOfStored = (result: unknown) => reasonTexts({ reasons: (result as Pick<LotEvaluation, 'reasons'> | null)?.reasons ?? [] });
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

/** Whether an engine 'accept' releases lots of this part at once (the part's setting). */
async function releasesOnAccept(tx: Tx, partId: string): Promise<boolean> {
	const [part] = await tx.select({ auto: parts.autoReleaseAccept }).from(parts).where(eq(parts.id, partId));
	return part?.auto ?? true;
}

/** The decision row's reason when the engine's result waits for quality. */
function proposalText(evaluation: LotEvaluation, autoRelease: boolean): string {
	if (evaluation.status === 'accept' && !autoRelease) return 'Engine proposes accept; this part is released only by quality.';
	const why = evaluation.safety ? ' (safety finding: quarantined)' : '';
	return `Engine proposes ${evaluation.status}${why}; waiting for quality's disposition.`;
}

/**
 * Write the engine's result (status, decision row, audit, webhook) for a finished evaluation:
 * a release notifies the supplier; anything else goes on hold for review and alerts quality staff.
 */
async function applyAutomatic(
	tx: Tx,
	user: SessionUser,
	lot: { supplierId: string; partId: string },
	evaluation: LotEvaluation & { status: 'accept' | 'hold' | 'reject' },
	from: LotStatus,
	evaluationId: number,
	given: string | null
) {
	const autoRelease = await releasesOnAccept(tx, lot.partId);
	const releases = evaluation.status === 'accept' && autoRelease;
	const status: FinalStatus = releases ? 'accepted' : 'on_hold';
	const proposal = proposalText(evaluation, autoRelease);
	const reason = releases ? given : given ? `${given}. ${proposal}` : proposal;
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
	const noticeId = releases
		? await queueNotice(tx, {
				lotId: evaluation.lot_id,
				decisionId: decision.id,
				kind: 'accept',
				status,
				safety: evaluation.safety,
				reasons: reasonTexts(evaluation),
				decisionReason: null,
				disposition: null,
				dueDate: null
			})
		: null;
	if (!releases) await alertLotInReview(tx, evaluation.lot_id, evaluation.status, evaluation.safety, reasonTexts(evaluation));
	await recordAudit(tx, {
		actorId: user.id,
		actorEmail: user.email,
		action: 'lot.decided',
		entityType: 'lot',
		entityId: evaluation.lot_id,
		lotId: evaluation.lot_id,
		details: { kind: 'automatic', from, to: status, proposal: evaluation.status, evaluationId, safety: evaluation.safety, reason }
	});
	await queueWebhookEvent(tx, 'lot.decided', {
		lot_id: evaluation.lot_id,
		decision_id: decision.id,
		kind: 'automatic',
		from,
		to: status,
		proposal: evaluation.status,
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
		if (evaluation.status !== 'accept' || !(await releasesOnAccept(tx, lot.partId))) {
			await recordAudit(tx, {
				actorId: user.id,
				actorEmail: user.email,
				action: 'lot.reevaluated',
				entityType: 'lot',
				entityId: lotId,
				lotId,
				details: { evaluationId, result: evaluation.status }
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
	/** The signed decision; when given it must match the disposition's (release and deviation accept, the rest reject). */
	decision?: 'accept' | 'reject';
	/** Null only when nothing was chosen: refused with 422 naming the field. */
	disposition: MaterialDisposition | null;
	/** YYYY-MM-DD: required when the disposition asks something of the supplier, refused for a release. */
	dueDate?: string | null;
	reason: string;
	password: string;
	/** The server-issued signing challenge for this lot, revision and decision (signature-challenges.ts). */
	challengeId: string;
}

export const SAFETY_RELEASE_REFUSED =
	'This lot has a safety finding (a unit rested below its minimum voltage). It cannot be released or used: deep-discharged lithium-ion units must not be recharged or used.';

const today = () => new Date().toISOString().slice(0, 10);

/** The signed decision behind a disposition, and the supplier's due date it needs (422 naming the field). */
function checkDisposition(input: OverrideInput): {
	disposition: MaterialDisposition;
	decision: 'accept' | 'reject';
	dueDate: string | null;
} {
	const disposition = input.disposition;
	if (!disposition || !DISPOSITION[disposition]) throw new Invalid('Choose a disposition', [{ path: 'disposition', message: 'Required' }]);
	const info = DISPOSITION[disposition];
	if (input.decision && input.decision !== info.decision) {
		const message = `The disposition "${info.label}" ${info.decision === 'accept' ? 'accepts' : 'rejects'} the lot; it does not fit decision "${input.decision}"`;
		throw new Invalid(message, [{ path: 'disposition', message }]);
	}
	const due = input.dueDate?.trim() || null;
	if (!asksSupplier(disposition)) {
		if (due)
			throw new Invalid('A release asks nothing of the supplier: leave the due date empty', [{ path: 'due_date', message: 'Not asked' }]);
		return { disposition, decision: info.decision, dueDate: null };
	}
	if (!due || !/^\d{4}-\d{2}-\d{2}$/.test(due) || Number.isNaN(Date.parse(due))) {
		const message = 'Give the date by which the supplier must act (YYYY-MM-DD)';
		throw new Invalid(message, [{ path: 'due_date', message }]);
	}
	if (due < today()) throw new Invalid('The due date is in the past', [{ path: 'due_date', message: 'The due date is in the past' }]);
	return { disposition, decision: info.decision, dueDate: due };
}

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
	const { disposition, decision: verdict, dueDate } = checkDisposition(input);
	const [visible] = await getDb().select({ supplierId: lots.supplierId }).from(lots).where(eq(lots.id, lotId));
	if (!visible || !can(user, 'lot:read', { supplierId: visible.supplierId })) throw new NotFound('lot');
	if (!can(user, 'lot:decide', { supplierId: visible.supplierId })) throw new Forbidden('Only quality managers decide held lots');
	await checkChallenge(getDb(), user, lotId, verdict, input.challengeId);
	await verifySignature(user, input.password, ip);
	return getDb().transaction(async (tx) => {
		await lockSamplingOfLot(tx, lotId);
		const challenge = await consumeChallenge(tx, user, lotId, verdict, input.challengeId);
		const latest = await latestEvaluation(tx, lotId);
		if (latest?.safety && !SAFETY_DISPOSITIONS.includes(disposition))
			throw new Conflict(`Only return to supplier or scrap: ${SAFETY_RELEASE_REFUSED}`, 'safety_disposition', [
				{ path: 'disposition', message: 'Only return to supplier or scrap' }
			]);
		const status: FinalStatus = verdict === 'accept' ? 'accepted' : 'rejected';
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
			decision: verdict,
			disposition,
			due_date: dueDate,
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
				disposition,
				supplierDueDate: dueDate,
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
			reasons: reasonsOfStored(latest?.result),
			decisionReason: reason,
			disposition,
			dueDate
		});
		await recordAudit(tx, {
			actorId: user.id,
			actorEmail: user.email,
			action: 'lot.override_signed',
			entityType: 'lot',
			entityId: lotId,
			lotId,
			ip,
			details: { from: 'on_hold', to: status, disposition, due_date: dueDate, signature }
		});
		await queueWebhookEvent(tx, 'lot.decided', {
			lot_id: lotId,
			lot_code: won.lotCode,
			decision_id: decision.id,
			kind: 'override',
			from: 'on_hold',
			to: status,
			disposition,
			due_date: dueDate,
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

/** How many lots wait for quality's disposition: the count beside "Hold review" in the header. */
export async function reviewCount(): Promise<number> {
	const [row] = await getDb()
		.select({ n: sql<number>`count(*)::int` })
		.from(lots)
		.where(eq(lots.status, 'on_hold'));
	return row?.n ?? 0;
}

/**
 * Lots in material review (on hold: quarantined, the supplier not yet told), oldest first, with the
 * engine's proposal, whether it is a safety finding, and the latest evaluation's reasons.
 */
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
		proposal: 'pending' | 'accept' | 'hold' | 'reject' | null;
		safety: boolean | null;
	}>(sql`
		select l.id, l.lot_code, l.po_number, o.name as supplier, p.part_number, l.quantity, l.decided_at,
		       e.result, e.disposition as proposal, e.safety
		from lots l join organisations o on o.id = l.supplier_id join parts p on p.id = l.part_id
		left join lateral (select result, disposition, safety from evaluations where lot_id = l.id order by id desc limit 1) e on true
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
		proposal: r.proposal,
		safety: r.safety ?? false,
		reasons: (r.result?.reasons ?? []).filter((x) => x.severity !== 'info')
	}));
}
