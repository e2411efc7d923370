/**
 * Lots: registration, listing (keyset pages), supplier-isolated reads, status transitions and the
 * lot history. All SQL for lots lives here; other services reuse `transitionLot`.
 */
import { personLabel } from '$lib/people';
import { and, asc, desc, eq, getTableColumns, ilike, inArray, or, sql, type SQL } from 'drizzle-orm';
import type { Database, Tx } from '../db';
import { auditEvents, decisions, lots, organisations, parts, readings, users } from '../db/schema';
import type { SessionUser } from '$lib/roles';
import { LOT_FIELD, packingProblem, unNumberProblem, type LotInput, type LotStatus } from '$lib/schemas/lot';
import { recordAudit } from './audit';
import { queueWebhookEvent } from './webhooks';
import { currentSeverity } from './switching';
import { Conflict, invalidFields, Malformed } from '../errors';

/** A status change that lost: the lot was no longer in one of the expected states. */
export class LotConflictError extends Conflict {
	constructor(
		readonly lotId: string,
		readonly expected: readonly LotStatus[],
		readonly actual: LotStatus | null
	) {
		super(actual ? `The lot is ${actual.replace('_', ' ')} now, so this step no longer applies` : 'The lot no longer exists');
	}
}

export type LotRow = typeof lots.$inferSelect;
export interface LotView extends LotRow {
	supplierName: string;
	partNumber: string;
	partDescription: string;
	chemistry: string;
	cellsInSeries: number;
	cellsInParallel: number;
	nominalCapacityAh: number;
}

const viewColumns = {
	...getTableColumns(lots),
	supplierName: organisations.name,
	partNumber: parts.partNumber,
	partDescription: parts.description,
	chemistry: parts.chemistry,
	cellsInSeries: parts.cellsInSeries,
	cellsInParallel: parts.cellsInParallel,
	nominalCapacityAh: parts.nominalCapacityAh
};

function selectViews(db: Database | Tx) {
	return db
		.select(viewColumns)
		.from(lots)
		.innerJoin(organisations, eq(organisations.id, lots.supplierId))
		.innerJoin(parts, eq(parts.id, lots.partId));
}

// ---------------------------------------------------------------- create

/** Check what zod cannot: the supplier and part exist, the part is the supplier's, the UN number fits. */
async function checkReferences(tx: Tx, input: LotInput): Promise<{ chemistry: string }> {
	const [supplier] = await tx
		.select({ id: organisations.id })
		.from(organisations)
		.where(and(eq(organisations.id, input.supplierId), eq(organisations.kind, 'supplier')));
	const [part] = await tx
		.select({ supplierId: parts.supplierId, chemistry: parts.chemistry })
		.from(parts)
		.where(eq(parts.id, input.partId));
	const issues: Array<{ path: string; message: string }> = [];
	if (!supplier) issues.push({ path: LOT_FIELD.supplierId, message: 'No supplier with this id' });
	if (!part) issues.push({ path: LOT_FIELD.partId, message: 'No part with this id' });
	else if (supplier && part.supplierId !== input.supplierId) {
		issues.push({ path: LOT_FIELD.partId, message: 'This part is not supplied by the chosen supplier' });
	}
	const unProblem = part ? unNumberProblem(part.chemistry, input.unNumber) : null;
	if (unProblem) issues.push({ path: LOT_FIELD.unNumber, message: unProblem });
	const packProblem = unProblem ? null : packingProblem(input.unNumber, input.packing);
	if (packProblem) issues.push({ path: LOT_FIELD.packing, message: packProblem });
	if (issues.length > 0) throw invalidFields(issues);
	return { chemistry: part!.chemistry };
}

/**
 * Next human lot code for the year, e.g. L-2026-00042. A transaction-scoped advisory lock
 * serialises code generation, so two registrations never pick the same number (the unique index
 * stays as the last line of defence).
 */
async function nextLotCode(tx: Tx, now: Date): Promise<string> {
	await tx.execute(sql`select pg_advisory_xact_lock(hashtext('restvolt.lot_code'))`);
	const prefix = `L-${now.getUTCFullYear()}-`;
	const [row] = await tx
		.select({ last: sql<string | null>`max(${lots.lotCode})` })
		.from(lots)
		.where(sql`${lots.lotCode} like ${prefix + '%'} and ${lots.lotCode} ~ '^L-[0-9]{4}-[0-9]{5,}$'`);
	const lastNumber = row?.last ? Number(row.last.slice(prefix.length)) : 0;
	return `${prefix}${String(lastNumber + 1).padStart(5, '0')}`;
}

export interface CreateLotOptions {
	/** Form registrations start as drafts; API registrations are released at once. */
	status: Extract<LotStatus, 'draft' | 'awaiting_arrival'>;
	ip?: string | null;
}

/** The lot's purchase facts as columns: what registration writes and editing (before the bench) may change. */
function purchaseColumns(input: LotInput) {
	return {
		poNumber: input.poNumber,
		supplierId: input.supplierId,
		partId: input.partId,
		quantity: input.quantity,
		declaredSoc: input.declaredSoc,
		transport: input.transport,
		lastDirection: input.lastDirection,
		packing: input.packing,
		unNumber: input.unNumber,
		expectedArrival: input.expectedArrival,
		resubmitted: input.resubmitted
	};
}

export async function createLot(db: Database, actor: SessionUser, input: LotInput, opts: CreateLotOptions): Promise<LotRow> {
	return db.transaction(async (tx) => {
		await checkReferences(tx, input);
		const { severity } = await currentSeverity(tx, input.supplierId, input.partId);
		const now = new Date();
		const [lot] = await tx
			.insert(lots)
			.values({
				lotCode: await nextLotCode(tx, now),
				...purchaseColumns(input),
				status: opts.status,
				severity,
				createdBy: actor.id
			})
			.returning();
		await audit(tx, actor, lot.id, 'lot.create', { lotCode: lot.lotCode, status: lot.status, ...input }, opts.ip);
		await queueWebhookEvent(tx, 'lot.registered', {
			lot_id: lot.id,
			lot_code: lot.lotCode,
			supplier_id: lot.supplierId,
			part_id: lot.partId,
			quantity: lot.quantity,
			status: lot.status
		});
		return lot;
	});
}

// ---------------------------------------------------------------- read

export interface LotListFilter {
	status?: LotStatus;
	supplierId?: string;
	partId?: string;
	search?: string;
	/** Only lots holding a reading of this unit serial (exact). */
	serial?: string;
	limit: number;
	cursor?: string;
}

/** A cursor this server did not hand out (a list page starts over from the top instead). */
export class BadCursorError extends Malformed {}

/** Cursors carry created_at as PG text (microseconds kept) and the id, base64url-encoded. */
export function encodeCursor(createdAtText: string, id: string): string {
	return Buffer.from(`${createdAtText}|${id}`, 'utf8').toString('base64url');
}

function decodeCursor(cursor: string): { at: string; id: string } {
	const [at, id, extra] = Buffer.from(cursor, 'base64url').toString('utf8').split('|');
	const uuid = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
	if (extra !== undefined || !at || !uuid.test(id ?? '') || Number.isNaN(Date.parse(at))) {
		throw new BadCursorError('The cursor is not one this server handed out');
	}
	return { at, id };
}

/** No organisation matches this id: a supplier user without one sees no lots. */
const NO_ORGANISATION = '00000000-0000-0000-0000-000000000000';

function listConditions(db: Database, user: SessionUser, filter: LotListFilter): SQL[] {
	const conditions: SQL[] = [];
	if (user.role === 'supplier') conditions.push(eq(lots.supplierId, user.organisationId ?? NO_ORGANISATION));
	if (filter.status) conditions.push(eq(lots.status, filter.status));
	if (filter.supplierId) conditions.push(eq(lots.supplierId, filter.supplierId));
	if (filter.partId) conditions.push(eq(lots.partId, filter.partId));
	if (filter.search) {
		const like = `%${filter.search.replace(/[\\%_]/g, (c) => '\\' + c)}%`;
		// PO, lot code, part number and supplier by substring; a unit serial exactly (index readings_serial_idx).
		const bySerial = db.select({ lotId: readings.lotId }).from(readings).where(eq(readings.serial, filter.search.trim()));
		conditions.push(
			or(
				ilike(lots.poNumber, like),
				ilike(lots.lotCode, like),
				ilike(parts.partNumber, like),
				ilike(organisations.name, like),
				inArray(lots.id, bySerial)
			)!
		);
	}
	// A serial trace: the lots holding a reading of this unit (index readings_serial_idx).
	if (filter.serial)
		conditions.push(inArray(lots.id, db.select({ lotId: readings.lotId }).from(readings).where(eq(readings.serial, filter.serial))));
	if (filter.cursor) {
		const { at, id } = decodeCursor(filter.cursor);
		conditions.push(sql`(${lots.createdAt}, ${lots.id}) < (${at}::timestamptz, ${id}::uuid)`);
	}
	return conditions;
}

/** Lots visible to this user, newest first, one keyset page at a time. */
export async function listLots(
	db: Database,
	user: SessionUser,
	filter: LotListFilter
): Promise<{ lots: LotView[]; nextCursor: string | null }> {
	const rows = await db
		// created_at as PG text for the cursor: a JS Date would drop its microseconds.
		.select({ ...viewColumns, cursorAt: sql<string>`${lots.createdAt}::text` })
		.from(lots)
		.innerJoin(organisations, eq(organisations.id, lots.supplierId))
		.innerJoin(parts, eq(parts.id, lots.partId))
		.where(and(...listConditions(db, user, filter)))
		.orderBy(desc(lots.createdAt), desc(lots.id))
		.limit(filter.limit + 1);
	const page = rows.slice(0, filter.limit);
	const last = page.at(-1);
	const nextCursor = rows.length > filter.limit && last ? encodeCursor(last.cursorAt, last.id) : null;
	return { lots: page.map(({ cursorAt: _cursorAt, ...lot }) => lot), nextCursor };
}

/** A lot as this user may see it: another supplier's lot is simply not there (null → 404). */
export async function getLotForUser(db: Database | Tx, user: SessionUser, id: string): Promise<LotView | null> {
	const [row] = await selectViews(db).where(eq(lots.id, id));
	if (!row) return null;
	if (user.role === 'supplier' && row.supplierId !== user.organisationId) return null;
	return row;
}

// ---------------------------------------------------------------- change

/**
 * Move a lot from one of `from` to `to` in a single guarded UPDATE; throws LotConflictError when
 * another request got there first (0 rows). `set` adds columns that change with the step.
 */
export async function transitionLot(
	tx: Database | Tx,
	lotId: string,
	from: readonly LotStatus[],
	to: LotStatus,
	set: Partial<Pick<LotRow, 'receivedAt' | 'decidedAt' | 'severity'>> = {}
): Promise<LotRow> {
	const [row] = await tx
		.update(lots)
		.set({ ...set, status: to, updatedAt: new Date() })
		.where(and(eq(lots.id, lotId), inArray(lots.status, [...from])))
		.returning();
	if (row) return row;
	const [current] = await tx.select({ status: lots.status }).from(lots).where(eq(lots.id, lotId));
	throw new LotConflictError(lotId, from, current?.status ?? null);
}

/** Before the bench: the states in which a buyer may still edit or cancel a lot. */
export const BEFORE_INSPECTION: readonly LotStatus[] = ['draft', 'awaiting_arrival'];

export async function updateLot(db: Database, actor: SessionUser, lotId: string, input: LotInput): Promise<LotRow> {
	return db.transaction(async (tx) => {
		await checkReferences(tx, input);
		const [row] = await tx
			.update(lots)
			.set({
				...purchaseColumns(input),
				updatedAt: new Date()
			})
			.where(and(eq(lots.id, lotId), inArray(lots.status, [...BEFORE_INSPECTION])))
			.returning();
		if (!row) {
			const [current] = await tx.select({ status: lots.status }).from(lots).where(eq(lots.id, lotId));
			throw new LotConflictError(lotId, BEFORE_INSPECTION, current?.status ?? null);
		}
		await audit(tx, actor, lotId, 'lot.update', { ...input });
		return row;
	});
}

async function step(
	db: Database,
	actor: SessionUser,
	lotId: string,
	from: readonly LotStatus[],
	to: LotStatus,
	action: string,
	details: Record<string, unknown> = {},
	set: Parameters<typeof transitionLot>[4] = {}
): Promise<LotRow> {
	return db.transaction(async (tx) => {
		const row = await transitionLot(tx, lotId, from, to, set);
		await audit(tx, actor, lotId, action, { to, ...details });
		return row;
	});
}

/** Buyer: cancel a lot that has not reached the bench. */
export const cancelLot = (db: Database, actor: SessionUser, lotId: string, reason?: string) =>
	step(db, actor, lotId, BEFORE_INSPECTION, 'cancelled', 'lot.cancel', reason ? { reason } : {});

/** Buyer: release a draft registration, so receiving expects the goods. */
export const markAwaitingArrival = (db: Database, actor: SessionUser, lotId: string) =>
	step(db, actor, lotId, ['draft'], 'awaiting_arrival', 'lot.release');

/** Goods received: the lot moves onto the bench (inside the caller's transaction when given one). */
export async function recordArrival(tx: Tx, actor: SessionUser, lotId: string): Promise<LotRow> {
	const row = await transitionLot(tx, lotId, ['awaiting_arrival'], 'in_inspection', { receivedAt: new Date() });
	await audit(tx, actor, lotId, 'lot.arrival', { to: 'in_inspection' });
	await queueWebhookEvent(tx, 'lot.arrived', { lot_id: lotId, lot_code: row.lotCode, received_at: row.receivedAt?.toISOString() ?? null });
	return row;
}

function audit(tx: Tx, actor: SessionUser, lotId: string, action: string, details: Record<string, unknown>, ip?: string | null) {
	return recordAudit(tx, {
		actorId: actor.id,
		actorEmail: actor.email,
		action,
		entityType: 'lot',
		entityId: lotId,
		lotId,
		details,
		ip: ip ?? null
	});
}

// ---------------------------------------------------------------- history

export interface HistoryEntry {
	at: Date;
	kind: 'event' | 'decision';
	action: string;
	actor: string | null;
	details: Record<string, unknown>;
}

/** The lot's trail: audit events that name the lot, and its decisions, oldest first. */
export async function lotTimeline(db: Database, lotId: string): Promise<HistoryEntry[]> {
	// People are named by name and role here as in the decision trail (services/decision-history.ts).
	const events = await db
		.select({
			at: auditEvents.at,
			action: auditEvents.action,
			actorEmail: auditEvents.actorEmail,
			person: { name: users.name, email: users.email, role: users.role },
			details: auditEvents.details
		})
		.from(auditEvents)
		.leftJoin(users, eq(users.id, auditEvents.actorId))
		.where(eq(auditEvents.lotId, lotId))
		.orderBy(asc(auditEvents.at), asc(auditEvents.id));
	const decided = await db
		.select({
			at: decisions.decidedAt,
			kind: decisions.kind,
			from: decisions.fromStatus,
			to: decisions.toStatus,
			reason: decisions.reason,
			person: { name: users.name, email: users.email, role: users.role }
		})
		.from(decisions)
		.leftJoin(users, eq(users.id, decisions.decidedBy))
		.where(eq(decisions.lotId, lotId))
		.orderBy(asc(decisions.decidedAt));
	const entries: HistoryEntry[] = [
		...events.map(({ actorEmail, person, ...e }) => ({
			...e,
			kind: 'event' as const,
			actor: person ? personLabel(person) : actorEmail,
			details: (e.details ?? {}) as Record<string, unknown>
		})),
		...decided.map((d) => ({
			at: d.at,
			kind: 'decision' as const,
			action: `decision.${d.kind}`,
			actor: d.person ? personLabel(d.person) : null,
			details: { from: d.from, to: d.to, reason: d.reason }
		}))
	];
	return entries.sort((a, b) => a.at.getTime() - b.at.getTime());
}

// ---------------------------------------------------------------- JSON

const isoDate = (d: Date | null) => (d ? d.toISOString() : null);

/** snake_case JSON for the API. */
export function lotJson(lot: LotRow & Partial<LotView>) {
	return {
		id: lot.id,
		lot_code: lot.lotCode,
		po_number: lot.poNumber,
		supplier_id: lot.supplierId,
		supplier_name: lot.supplierName,
		part_id: lot.partId,
		part_number: lot.partNumber,
		chemistry: lot.chemistry,
		quantity: lot.quantity,
		declared_soc: lot.declaredSoc,
		transport: lot.transport,
		last_direction: lot.lastDirection,
		packing: lot.packing,
		un_number: lot.unNumber,
		expected_arrival: lot.expectedArrival,
		resubmitted: lot.resubmitted,
		received_at: isoDate(lot.receivedAt),
		status: lot.status,
		severity: lot.severity,
		created_at: isoDate(lot.createdAt),
		updated_at: isoDate(lot.updatedAt),
		decided_at: isoDate(lot.decidedAt)
	};
}
