/**
 * The stored switching state per supplier × part (table sampling_states): the severity for the next
 * lot without replaying the whole decided-lot history on every read. Written in the same
 * transaction as each decision and resumption; the replay (services/switching.ts currentSeverity)
 * stays the source of truth and rebuilds a missing row (after a part's AQL or level changed, or for
 * data written before the table existed).
 *
 * Concurrency: every writer of a part's states takes one transaction-scoped advisory lock per part
 * BEFORE it reads the history (decisions take it before locking their lot row; the parts trigger
 * takes it before touching lots), so a replay always sees the decisions committed before it and no
 * older replay can overwrite a newer one.
 */
import { alertInspectionDiscontinued } from './staff-alerts';
import { sql, type SQL } from 'drizzle-orm';
import type { SwitchingState } from '$lib/inspection';
import type { Database, Tx } from '../db';
import { inspectionResumptions, samplingStates } from '../db/schema';
import { currentSeverity, type SeverityView } from './switching';
import { recordAudit } from './audit';
import { Conflict, NotFound } from '../errors';

const lockKey = (partIdSql: SQL) => sql`hashtext('restvolt.sampling:' || ${partIdSql}::text)`;

/** Serialise state writers of one part (held until the transaction ends; re-entrant). */
export async function lockSamplingOfPart(tx: Tx, partId: string): Promise<void> {
	await tx.execute(sql`select pg_advisory_xact_lock(${lockKey(sql`${partId}`)})`);
}

/** The same lock, found from a lot id; call it before locking the lot row (see the header). */
export async function lockSamplingOfLot(tx: Tx, lotId: string): Promise<void> {
	await tx.execute(sql`select pg_advisory_xact_lock(${lockKey(sql`part_id`)}) from lots where id = ${lotId}`);
}

/** What is stored of a replay: everything but the (long) list of replayed lots. */
function rowOf(supplierId: string, partId: string, view: SeverityView) {
	const { lots, severity, switching_score, ...history } = view;
	return {
		supplierId,
		partId,
		severity,
		switchingScore: switching_score,
		history,
		lastLotDecidedAt: lots.length > 0 ? new Date(lots[lots.length - 1].decided_at) : null,
		updatedAt: new Date()
	};
}

/** Replay now and store the result; inside the transaction that wrote the decision or resumption. */
export async function refreshSamplingState(tx: Tx, supplierId: string, partId: string): Promise<SeverityView> {
	await lockSamplingOfPart(tx, partId);
	const before = await storedRow(tx, supplierId, partId);
	const view = await currentSeverity(tx, supplierId, partId);
	const row = rowOf(supplierId, partId, view);
	const { supplierId: _s, partId: _p, ...changes } = row;
	await tx
		.insert(samplingStates)
		.values(row)
		.onConflictDoUpdate({ target: [samplingStates.supplierId, samplingStates.partId], set: changes });
	// Entering discontinuation (ISO 2859-1 9.4) alerts buyers and quality, in this same transaction.
	const lastLot = view.lots.at(-1);
	if (view.severity === 'discontinued' && before?.severity !== 'discontinued' && lastLot) {
		await alertInspectionDiscontinued(tx, lastLot.lot_id, view);
	}
	return view;
}

/** A missing row: replay under the lock and store it, unless a writer got there first. */
async function rebuildSamplingState(db: Database | Tx, supplierId: string, partId: string): Promise<SwitchingState> {
	return db.transaction(async (tx) => {
		await lockSamplingOfPart(tx, partId);
		const existing = await storedRow(tx, supplierId, partId);
		if (existing) return existing.severity;
		const view = await currentSeverity(tx, supplierId, partId);
		await tx
			.insert(samplingStates)
			.values(rowOf(supplierId, partId, view))
			.onConflictDoNothing();
		return view.severity;
	});
}

async function storedRow(db: Database | Tx, supplierId: string, partId: string) {
	const result = await db.execute<{ severity: SwitchingState }>(
		sql`select severity::text as severity from sampling_states where supplier_id = ${supplierId} and part_id = ${partId}`
	);
	return result.rows[0] ?? null;
}

/** The severity for the next (undecided) lot of this supplier × part. */
export async function nextLotSeverity(db: Database | Tx, supplierId: string, partId: string): Promise<SwitchingState> {
	const row = await storedRow(db, supplierId, partId);
	return row ? row.severity : rebuildSamplingState(db, supplierId, partId);
}

export interface ResumptionInput {
	supplierId: string;
	partId: string;
	reason: string;
	resumedBy: string | null;
}

/** Quality resumes discontinued inspection (ISO 2859-1 9.4): the resumption and the new state together. */
export async function recordResumption(tx: Tx, input: ResumptionInput): Promise<SeverityView> {
	await lockSamplingOfPart(tx, input.partId);
	await tx
		.insert(inspectionResumptions)
		.values({ supplierId: input.supplierId, partId: input.partId, reason: input.reason, resumedBy: input.resumedBy });
	return refreshSamplingState(tx, input.supplierId, input.partId);
}

/**
 * Quality resumes discontinued inspection after accepting the supplier's corrective action
 * (ISO 2859-1 9.4); the next lots are inspected on tightened inspection.
 */
export async function resumeInspection(
	db: Database,
	user: { id: string; email: string },
	partId: string,
	reason: string
): Promise<SeverityView> {
	return db.transaction(async (tx) => {
		const [part] = (await tx.execute<{ supplier_id: string }>(sql`select supplier_id from parts where id = ${partId}`)).rows;
		if (!part) throw new NotFound('part');
		await lockSamplingOfPart(tx, partId);
		const now = await currentSeverity(tx, part.supplier_id, partId);
		if (now.severity !== 'discontinued')
			throw new Conflict(`Inspection of this part is ${now.severity}, not discontinued; there is nothing to resume.`);
		const view = await recordResumption(tx, { supplierId: part.supplier_id, partId, reason, resumedBy: user.id });
		await recordAudit(tx, {
			actorId: user.id,
			actorEmail: user.email,
			action: 'inspection.resumed',
			entityType: 'part',
			entityId: partId,
			details: { reason, severity: view.severity }
		});
		return view;
	});
}
