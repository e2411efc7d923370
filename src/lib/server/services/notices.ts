/**
 * Supplier notices: queued in the decision's transaction (the outbox row), listed for staff and
 * suppliers, acknowledged by suppliers. Sending is the worker's job (mail/worker.ts), whose job is
 * added in the same transaction.
 */
import { and, desc, eq } from 'drizzle-orm';
import type { Database, Tx } from '../db';
import { lots, notices, organisations, parts, supplierContacts, users } from '../db/schema';
import { renderNotice, type FinalStatus, type NoticeKind } from '../mail/templates';
import { enqueueNoticeSend } from '../mail/outbox';
import { NotFound } from '../errors';
import { recordAudit } from './audit';
import { queueWebhookEvent } from './webhooks';
import { appOrigin } from '../origin';
import { noticeFacts } from './notice-facts';
import type { MaterialDisposition } from '$lib/schemas/disposition';
import type { SessionUser } from '../../roles';

type Db = Database | Tx;

const LITHIUM = new Set(['LCO', 'NMC', 'NCA', 'LMO', 'LFP', 'LTO', 'LIMNO2', 'LISOCL2']);
export const isLithium = (chemistry: string) => LITHIUM.has(chemistry.toUpperCase());

export interface QueueNoticeInput {
	lotId: string;
	decisionId: string;
	kind: NoticeKind;
	status: FinalStatus;
	safety: boolean;
	reasons: string[];
	decisionReason: string | null;
	disposition: MaterialDisposition | null;
	dueDate: string | null;
}

/** Who gets notices: the supplier's notice contacts, else its active portal users. */
async function recipientsFor(db: Db, supplierId: string): Promise<string[]> {
	const contacts = await db
		.select({ email: supplierContacts.email })
		.from(supplierContacts)
		.where(and(eq(supplierContacts.organisationId, supplierId), eq(supplierContacts.receivesNotices, true)));
	if (contacts.length) return [...new Set(contacts.map((c) => c.email.toLowerCase()))];
	const portal = await db
		.select({ email: users.email })
		.from(users)
		.where(and(eq(users.organisationId, supplierId), eq(users.role, 'supplier'), eq(users.active, true)));
	return [...new Set(portal.map((u) => u.email.toLowerCase()))];
}

async function ownCompanyName(db: Db): Promise<string> {
	const [own] = await db.select({ name: organisations.name }).from(organisations).where(eq(organisations.kind, 'own')).limit(1);
	return own?.name ?? 'Receiving inspection';
}

/**
 * Write the outbox row for a decision, inside the caller's transaction, so the notice exists
 * exactly when the decision does. Returns null when the supplier has nobody to notify (audited).
 */
export async function queueNotice(tx: Tx, input: QueueNoticeInput): Promise<string | null> {
	const [row] = await tx
		.select({ lot: lots, part: parts, supplierName: organisations.name })
		.from(lots)
		.innerJoin(parts, eq(parts.id, lots.partId))
		.innerJoin(organisations, eq(organisations.id, lots.supplierId))
		.where(eq(lots.id, input.lotId));
	if (!row) throw new NotFound('lot');
	const recipients = await recipientsFor(tx, row.lot.supplierId);
	if (recipients.length === 0) {
		await recordAudit(tx, { action: 'notice.no_recipients', lotId: input.lotId, entityType: 'lot', entityId: input.lotId });
		return null;
	}
	const body = renderNotice({
		...input,
		...(await noticeFacts(tx, input.lotId)),
		companyName: await ownCompanyName(tx),
		supplierName: row.supplierName,
		lotCode: row.lot.lotCode,
		poNumber: row.lot.poNumber,
		partNumber: row.part.partNumber,
		partDescription: row.part.description,
		quantity: row.lot.quantity,
		transport: row.lot.transport,
		lithium: isLithium(row.part.chemistry),
		portalUrl: `${appOrigin()}/portal/lots/${input.lotId}`
	});
	const [notice] = await tx
		.insert(notices)
		.values({
			lotId: input.lotId,
			decisionId: input.decisionId,
			organisationId: row.lot.supplierId,
			kind: input.kind,
			recipients,
			subject: body.subject,
			bodyText: body.text,
			bodyHtml: body.html
		})
		.returning({ id: notices.id });
	await enqueueNoticeSend(tx, notice.id);
	await recordAudit(tx, {
		action: 'notice.queued',
		entityType: 'notice',
		entityId: notice.id,
		lotId: input.lotId,
		details: { kind: input.kind, recipients }
	});
	return notice.id;
}

export interface NoticeSummary {
	id: string;
	lotId: string;
	lotCode: string;
	kind: string;
	subject: string;
	status: 'pending' | 'sent' | 'failed';
	recipients: string[];
	createdAt: string;
	sentAt: string | null;
	acknowledgedAt: string | null;
	reportUrl: string;
}

/** Notices the user may see: suppliers only their organisation's (and the lot filter on top). */
export async function listNotices(db: Db, user: SessionUser, filter: { lotId?: string }): Promise<NoticeSummary[]> {
	const conditions = [];
	if (user.role === 'supplier') conditions.push(eq(notices.organisationId, user.organisationId ?? '00000000-0000-0000-0000-000000000000'));
	if (filter.lotId) conditions.push(eq(notices.lotId, filter.lotId));
	const rows = await db
		.select({ n: notices, lotCode: lots.lotCode })
		.from(notices)
		.innerJoin(lots, eq(lots.id, notices.lotId))
		.where(conditions.length ? and(...conditions) : undefined)
		.orderBy(desc(notices.createdAt))
		.limit(500);
	return rows.map(({ n, lotCode }) => ({
		id: n.id,
		lotId: n.lotId,
		lotCode,
		kind: n.kind,
		subject: n.subject,
		status: n.status,
		recipients: n.recipients,
		createdAt: n.createdAt.toISOString(),
		sentAt: n.sentAt?.toISOString() ?? null,
		acknowledgedAt: n.acknowledgedAt?.toISOString() ?? null,
		reportUrl: `/api/v1/lots/${n.lotId}/report.pdf`
	}));
}

/** One notice, or 404 when it does not exist or belongs to another supplier. */
export async function getNoticeForUser(db: Db, user: SessionUser, id: string) {
	const [n] = await db.select().from(notices).where(eq(notices.id, id));
	if (!n) throw new NotFound('notice');
	if (user.role === 'supplier' && n.organisationId !== user.organisationId) throw new NotFound('notice');
	return n;
}

/** A supplier confirms they read the notice; the first acknowledgement is kept. */
export async function acknowledgeNotice(db: Database, user: SessionUser, id: string) {
	return db.transaction(async (tx) => {
		const n = await getNoticeForUser(tx, user, id);
		if (n.acknowledgedAt) return { id: n.id, acknowledgedAt: n.acknowledgedAt.toISOString(), already: true };
		const [updated] = await tx
			.update(notices)
			.set({ acknowledgedAt: new Date(), acknowledgedBy: user.id })
			.where(eq(notices.id, id))
			.returning({ acknowledgedAt: notices.acknowledgedAt });
		await recordAudit(tx, {
			actorId: user.id,
			actorEmail: user.email,
			action: 'notice.acknowledged',
			entityType: 'notice',
			entityId: id,
			lotId: n.lotId
		});
		await queueWebhookEvent(tx, 'notice.acknowledged', {
			notice_id: id,
			lot_id: n.lotId,
			acknowledged_at: updated.acknowledgedAt!.toISOString()
		});
		return { id, acknowledgedAt: updated.acknowledgedAt!.toISOString(), already: false };
	});
}
