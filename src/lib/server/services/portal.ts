/**
 * Supplier isolation for lot-scoped reads and the supplier portal's queries. A supplier asking
 * for another organisation's lot, report or notice gets 404, as if it did not exist.
 */
import { and, asc, desc, eq, inArray } from 'drizzle-orm';
import type { Database } from '../db';
import { documents, lots, noticeResponses, notices, parts } from '../db/schema';
import type { IncomingFile } from '$lib/uploads/rules';
import { Forbidden, Invalid, NotFound } from '../errors';
import { can, type Action } from '../policy';
import { recordAudit } from './audit';
import { acceptUpload, storeLotFile } from './uploads';
import { getLotForUser, type LotView } from './lots';
import { getNoticeForUser } from './notices';
import type { SessionUser } from '../../roles';

/**
 * The lot `user` may do `action` on: Forbidden when the role may not do it at all, NotFound for a
 * lot they may not see (another supplier's), Forbidden when they see it but may not do this to it.
 */
export async function lotForAction(db: Database, user: SessionUser, lotId: string, action: Action): Promise<LotView> {
	const own = user.role === 'supplier' ? { supplierId: user.organisationId } : undefined;
	if (!can(user, action, own)) throw new Forbidden('Your role may not do this');
	const lot = await getLotForUser(db, user, lotId);
	if (!lot) throw new NotFound('lot');
	if (!can(user, action, { supplierId: lot.supplierId })) throw new Forbidden('Your role may not do this');
	return lot;
}

/** The supplier's lots that have reached a decision or are being inspected, newest first. */
export async function portalLots(db: Database, user: SessionUser) {
	if (user.role !== 'supplier' || !user.organisationId) return [];
	const rows = await db
		.select({
			id: lots.id,
			lotCode: lots.lotCode,
			poNumber: lots.poNumber,
			status: lots.status,
			quantity: lots.quantity,
			decidedAt: lots.decidedAt,
			createdAt: lots.createdAt,
			partNumber: parts.partNumber
		})
		.from(lots)
		.innerJoin(parts, eq(parts.id, lots.partId))
		.where(eq(lots.supplierId, user.organisationId))
		.orderBy(desc(lots.createdAt))
		.limit(500);
	const ids = rows.map((r) => r.id);
	const open = ids.length
		? await db
				.select({ lotId: notices.lotId, ack: notices.acknowledgedAt })
				.from(notices)
				// Only notices sent to this supplier: staff alerts about its lots are internal.
				.where(and(inArray(notices.lotId, ids), eq(notices.organisationId, user.organisationId)))
		: [];
	return rows.map((r) => ({
		...r,
		decidedAt: r.decidedAt?.toISOString() ?? null,
		createdAt: r.createdAt.toISOString(),
		unacknowledged: open.filter((n) => n.lotId === r.id && !n.ack).length
	}));
}

export interface ReplyInput {
	comment: string;
	file: IncomingFile | null;
}

/**
 * A supplier's reply to a notice: a comment, and optionally a file (PDF, PNG, JPEG, XLSX, CSV or
 * text; services/uploads.ts) stored on the lot as a corrective action and linked from the reply.
 * A file whose bytes the lot already holds (say, the buyer's own CoC sent back) is linked as it
 * is: the existing document keeps its name, kind and uploader.
 */
export async function replyToNotice(db: Database, user: SessionUser, noticeId: string, input: ReplyInput) {
	const comment = input.comment.trim();
	if (comment.length < 2) throw new Invalid('Write a comment', [{ path: 'comment', message: 'Required' }]);
	return db.transaction(async (tx) => {
		const notice = await getNoticeForUser(tx, user, noticeId);
		const file = input.file ? acceptUpload('supplier_reply', input.file) : null;
		const stored = file ? await storeLotFile(tx, user, notice.lotId, 'corrective_action', file, 'supplier_reply') : null;
		const documentId = stored?.document.id ?? null;
		const [reply] = await tx
			.insert(noticeResponses)
			.values({ noticeId, userId: user.id, comment, documentId })
			.returning({ id: noticeResponses.id, createdAt: noticeResponses.createdAt });
		await recordAudit(tx, {
			actorId: user.id,
			actorEmail: user.email,
			action: 'notice.replied',
			entityType: 'notice',
			entityId: noticeId,
			lotId: notice.lotId,
			details: { replyId: reply.id, documentId, ...(stored?.existing ? { sameBytesAsExistingDocument: true } : {}) }
		});
		return { id: reply.id, documentId, createdAt: reply.createdAt.toISOString() };
	});
}

/** Replies to one notice, oldest first, for the portal. */
export async function repliesFor(db: Database, noticeIds: string[]) {
	if (!noticeIds.length) return [];
	return db
		.select({ r: noticeResponses, fileName: documents.fileName })
		.from(noticeResponses)
		.leftJoin(documents, eq(documents.id, noticeResponses.documentId))
		.where(inArray(noticeResponses.noticeId, noticeIds))
		.orderBy(asc(noticeResponses.createdAt));
}

export interface PortalNotice {
	id: string;
	kind: string;
	subject: string;
	bodyText: string;
	createdAt: string;
	sentAt: string | null;
	acknowledgedAt: string | null;
	replies: { id: string; at: string; comment: string; document: { id: string; fileName: string } | null; mine: boolean }[];
}

/** The notices of one lot the supplier may see (404 for another organisation's lot), with replies. */
export async function portalNotices(db: Database, user: SessionUser, lotId: string): Promise<PortalNotice[]> {
	const lot = await getLotForUser(db, user, lotId);
	if (!lot) throw new NotFound('lot');
	// Only notices sent to the lot's supplier: staff alerts about the lot are internal.
	const rows = await db
		.select()
		.from(notices)
		.where(and(eq(notices.lotId, lot.id), eq(notices.organisationId, lot.supplierId)))
		.orderBy(desc(notices.createdAt));
	const replies = await repliesFor(
		db,
		rows.map((n) => n.id)
	);
	return rows.map((n) => ({
		id: n.id,
		kind: n.kind,
		subject: n.subject,
		bodyText: n.bodyText,
		createdAt: n.createdAt.toISOString(),
		sentAt: n.sentAt?.toISOString() ?? null,
		acknowledgedAt: n.acknowledgedAt?.toISOString() ?? null,
		replies: replies
			.filter(({ r }) => r.noticeId === n.id)
			.map(({ r, fileName }) => ({
				id: r.id,
				at: r.createdAt.toISOString(),
				comment: r.comment,
				document: r.documentId && fileName ? { id: r.documentId, fileName } : null,
				mine: r.userId === user.id
			}))
	}));
}
