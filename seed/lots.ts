/**
 * Seeds the thirty demo lots through the same services the app uses (register, documents,
 * readings, submit, e-signed override), so every verdict in the demo is the engine's own.
 * A lot whose PO number already exists is left alone, which keeps the seed idempotent.
 */
import { asc, eq, sql } from 'drizzle-orm';
import type { Database } from '../src/lib/server/db';
import { auditEvents, decisions, documents, evaluations, lots, notices } from '../src/lib/server/db/schema';
import type { SessionUser } from '../src/lib/roles';
import { cancelLot, createLot, markAwaitingArrival } from '../src/lib/server/services/lots';
import { uploadDocument } from '../src/lib/server/services/uploads';
import { addReadings } from '../src/lib/server/services/readings';
import { evaluateLotNow } from '../src/lib/server/services/evaluation';
import { decideOverride, submitLot } from '../src/lib/server/services/decisions';
import { issueChallenge } from '../src/lib/server/services/signature-challenges';
import { DISPOSITION, asksSupplier, type MaterialDisposition } from '../src/lib/schemas/disposition';
import { dgFamilyOf, unNumberFor } from '../src/lib/inspection/dangerous-goods';
import { demoDocument, type DemoDocumentKind } from './documents';
import { LOTS, type LotSeed } from './lot-plan';
import type { SeededPeople } from './people';
import type { SeededPart } from './parts';
import { demoReadings } from './readings-gen';
import { DEMO_PASSWORD, STAFF, SUPPLIERS } from './scenario';

const DAY = 86_400_000;

function staffUser(people: SeededPeople, role: 'buyer' | 'inspector' | 'quality'): SessionUser {
	const person = STAFF.find((s) => s.role === role)!;
	return { id: people.staff.get(person.email)!, email: person.email, name: person.name, role, organisationId: people.ownId };
}

/** Demo lots travel on their own: the family's 'alone' number; AGM lead-acid blocks as non-spillable (UN2800). */
function unNumberOf(part: SeededPart): string | null {
	const family = dgFamilyOf(part.chemistry);
	if (family) return unNumberFor(family, 'alone');
	return part.chemistry === 'PBACID' ? 'UN2800' : null;
}

async function attachDocuments(db: Database, buyer: SessionUser, lotId: string, spec: LotSeed, part: SeededPart) {
	const supplierName = SUPPLIERS.find((s) => s.key === part.supplier)!.name;
	const kinds = (spec.stage === 'draft' ? ['coc'] : part.requiredDocuments) as DemoDocumentKind[];
	for (const kind of kinds) {
		if (spec.finding === 'documents_missing' && kind === 'un38_3_summary') continue;
		const bytes = await demoDocument(kind, supplierName, part.partNumber, spec.po);
		await uploadDocument(db, buyer, lotId, { kind, fileName: `${kind}-${spec.po}.pdf`, bytes });
	}
}

/** The day of a lot's demo history an audit action belongs to: registration (0), bench (½), decision (1). */
const BENCH_ACTIONS = new Set(['lot.arrival', 'readings.added', 'lot.sample_complete', 'reading.corrected']);
const DECISION_ACTIONS = ['lot.decided', 'lot.review_alerted', 'lot.override_signed', 'lot.reevaluated', 'notice.', 'decision.'];
function historyDay(action: string): number {
	if (BENCH_ACTIONS.has(action)) return 0.5;
	return DECISION_ACTIONS.some((prefix) => action.startsWith(prefix)) ? 1 : 0;
}

/** Move the lot's dates back so the demo has a history (switching rules, scorecard trends). */
async function backdate(db: Database, lotId: string, when: Date) {
	const at = (days: number, step = 0) => new Date(when.getTime() + days * DAY + step * 1000);
	const later = (days: number) => sql`${at(days)}::timestamptz`;
	await db
		.update(lots)
		.set({
			createdAt: when,
			updatedAt: when,
			receivedAt: sql`case when ${lots.receivedAt} is null then null else ${later(0.5)} end`,
			decidedAt: sql`case when ${lots.decidedAt} is null then null else ${later(1)} end`
		})
		.where(eq(lots.id, lotId));
	await db
		.update(decisions)
		.set({ decidedAt: at(1) })
		.where(eq(decisions.lotId, lotId));
	await db
		.update(evaluations)
		.set({ createdAt: at(1) })
		.where(eq(evaluations.lotId, lotId));
	await db
		.update(documents)
		.set({ uploadedAt: at(0, 1) })
		.where(eq(documents.lotId, lotId));
	await db
		.update(notices)
		.set({ createdAt: at(1, 1) })
		.where(eq(notices.lotId, lotId));
	await backdateTrail(db, lotId, at);
}

/**
 * The lot's audit events follow its invented past, in their own order, so its history reads
 * registration → bench → decision. The trail refuses UPDATE (a trigger): only this seed step,
 * in its own transaction, writes it with that trigger off (only the tables' owner role, which
 * seeds, may switch it; the app's role may not. Without it the events keep the seeding time and
 * a note says so).
 */
async function backdateTrail(db: Database, lotId: string, at: (days: number, step?: number) => Date) {
	try {
		await db.transaction(async (tx) => {
			// DDL is transactional: if anything below fails, the rollback switches the trigger back on too.
			await tx.execute(sql`alter table audit_events disable trigger audit_events_no_update_delete`);
			const events = await tx
				.select({ id: auditEvents.id, action: auditEvents.action })
				.from(auditEvents)
				.where(eq(auditEvents.lotId, lotId))
				.orderBy(asc(auditEvents.id));
			for (const [i, event] of events.entries()) {
				await tx
					.update(auditEvents)
					.set({ at: at(historyDay(event.action), i + 1) })
					.where(eq(auditEvents.id, event.id));
			}
			await tx.execute(sql`alter table audit_events enable trigger audit_events_no_update_delete`);
		});
	} catch (error) {
		console.warn(`[seed] lot history keeps today's dates (${error instanceof Error ? error.message : String(error)})`);
	}
}

async function inspect(db: Database, people: SeededPeople, lotId: string, spec: LotSeed, part: SeededPart, index: number, when: Date) {
	const { plan } = await evaluateLotNow(db, lotId);
	const full = Math.min(plan.sample_size, spec.quantity);
	const count = spec.stage === 'in_inspection' ? Math.max(1, Math.floor(full / 2)) : full;
	const rows = demoReadings(part, spec.finding ?? 'as_declared', spec.declaredSoc, count, 1000 + index, new Date(when.getTime() + DAY / 2));
	await addReadings(db, staffUser(people, 'inspector'), lotId, rows, 'import');
}

async function seedOne(db: Database, people: SeededPeople, part: SeededPart, spec: LotSeed, index: number) {
	const buyer = staffUser(people, 'buyer');
	const when = new Date(Date.now() - spec.daysAgo * DAY);
	const lot = await createLot(
		db,
		buyer,
		{
			poNumber: spec.po,
			supplierId: part.supplierId,
			partId: part.id,
			quantity: spec.quantity,
			declaredSoc: spec.declaredSoc,
			transport: spec.transport,
			unNumber: unNumberOf(part),
			// Demo lots are cells and packs bought on their own (DG packing 'alone': UN3480 / PI 965 by air).
			packing: 'alone',
			expectedArrival: new Date(when.getTime() + 7 * DAY).toISOString().slice(0, 10)
		},
		{ status: 'draft' }
	);
	await attachDocuments(db, buyer, lot.id, spec, part);
	if (spec.stage === 'cancelled') await cancelLot(db, buyer, lot.id, 'Order merged into a later PO');
	if (spec.stage !== 'draft' && spec.stage !== 'cancelled') await markAwaitingArrival(db, buyer, lot.id);
	if (['in_inspection', 'pending_decision', 'decided'].includes(spec.stage)) await inspect(db, people, lot.id, spec, part, index, when);
	if (spec.stage === 'decided') {
		const outcome = await submitLot(staffUser(people, 'inspector'), lot.id);
		const override = spec.override ?? confirmedReject(outcome.evaluation);
		if (override && outcome.status === 'on_hold') {
			const quality = staffUser(people, 'quality');
			const { challengeId } = await issueChallenge(db, quality, lot.id, DISPOSITION[override.disposition].decision);
			const dueDate = asksSupplier(override.disposition) ? new Date(Date.now() + 14 * DAY).toISOString().slice(0, 10) : null;
			await decideOverride(quality, lot.id, { ...override, dueDate, password: DEMO_PASSWORD, challengeId });
		}
	}
	await backdate(db, lot.id, when);
}

/**
 * The engine only proposes a reject; in the demo, quality has confirmed each one (scrap after a
 * safety finding, else return to the supplier) unless the plan says otherwise.
 */
function confirmedReject(
	evaluation: { status: string; safety: boolean; reasons: { severity: string; message: string }[] } | null
): { disposition: MaterialDisposition; reason: string } | null {
	if (evaluation?.status !== 'reject') return null;
	const finding = evaluation.reasons.find((r) => r.severity === 'reject')?.message ?? 'the engine’s findings';
	return { disposition: evaluation.safety ? 'scrap' : 'return_to_supplier', reason: `Confirmed the rejection: ${finding}` };
}

export async function seedLots(db: Database, people: SeededPeople, parts: Map<string, SeededPart>): Promise<number> {
	const existing = new Set((await db.select({ po: lots.poNumber }).from(lots)).map((r) => r.po));
	let index = 0;
	for (const spec of LOTS) {
		index += 1;
		if (existing.has(spec.po)) continue;
		await seedOne(db, people, parts.get(spec.part)!, spec, index);
	}
	const [{ n }] = await db.select({ n: sql<number>`count(*)::int` }).from(lots);
	return n;
}
