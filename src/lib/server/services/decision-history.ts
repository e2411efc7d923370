/**
 * A lot's paper trail for the decision panel and the review page: evaluations (newest first),
 * decisions with who/when/why, notices with delivery and acknowledgement, and supplier replies.
 */
import { personLabel } from '$lib/people';
import type { MaterialDisposition } from '$lib/schemas/disposition';
import { asc, desc, eq, inArray } from 'drizzle-orm';
import type { Database, Tx } from '../db';
import { decisions, documents, evaluations, noticeResponses, notices, users } from '../db/schema';

export interface HistoryEvaluation {
	id: number;
	at: string;
	disposition: 'pending' | 'accept' | 'hold' | 'reject';
	safety: boolean;
	severity: string;
	modelVersion: string;
	reasons: { code: string; severity: string; message: string }[];
	by: string | null;
}

export interface HistoryDecision {
	id: string;
	at: string;
	kind: 'automatic' | 'override';
	fromStatus: string;
	toStatus: string;
	reason: string | null;
	by: string | null;
	signed: boolean;
	/** Quality's material disposition and the supplier's due date (overrides only). */
	disposition: MaterialDisposition | null;
	supplierDueDate: string | null;
}

export interface HistoryReply {
	id: string;
	at: string;
	by: string;
	comment: string;
	document: { id: string; fileName: string; url: string } | null;
}

export interface HistoryNotice {
	id: string;
	kind: string;
	subject: string;
	recipients: string[];
	status: 'pending' | 'sent' | 'failed';
	attempts: number;
	createdAt: string;
	sentAt: string | null;
	acknowledgedAt: string | null;
	acknowledgedBy: string | null;
	replies: HistoryReply[];
}

export interface DecisionTrail {
	lotId: string;
	status: string;
	canSubmit: boolean;
	links: { report: string; quarantineTag: string | null; readings: string };
	evaluations: HistoryEvaluation[];
	decisions: HistoryDecision[];
	notices: HistoryNotice[];
}

type Db = Database | Tx;
const iso = (d: Date | null) => (d ? d.toISOString() : null);

async function userNames(db: Db, ids: (string | null)[]): Promise<Map<string, string>> {
	const wanted = [...new Set(ids.filter((id): id is string => !!id))];
	if (wanted.length === 0) return new Map();
	const rows = await db
		.select({ id: users.id, name: users.name, email: users.email, role: users.role })
		.from(users)
		.where(inArray(users.id, wanted));
	return new Map(rows.map((r) => [r.id, personLabel(r)]));
}

export async function listEvaluations(db: Db, lotId: string): Promise<HistoryEvaluation[]> {
	const rows = await db.select().from(evaluations).where(eq(evaluations.lotId, lotId)).orderBy(desc(evaluations.id));
	const names = await userNames(
		db,
		rows.map((r) => r.createdBy)
	);
	return rows.map((r) => ({
		id: r.id,
		at: r.createdAt.toISOString(),
		disposition: r.disposition,
		safety: r.safety,
		severity: r.severity,
		modelVersion: r.modelVersion,
		reasons: reasonsOf(r.result),
		by: r.createdBy ? (names.get(r.createdBy) ?? null) : null
	}));
}

/** The reasons stored in an evaluation result (shape written by decisions.ts). */
export function reasonsOf(result: unknown): HistoryEvaluation['reasons'] {
	const reasons = (result as { reasons?: unknown })?.reasons;
	if (!Array.isArray(reasons)) return [];
	return reasons.map((r) => ({ code: String(r.code ?? ''), severity: String(r.severity ?? 'info'), message: String(r.message ?? '') }));
}

export async function listDecisions(db: Db, lotId: string): Promise<HistoryDecision[]> {
	const rows = await db.select().from(decisions).where(eq(decisions.lotId, lotId)).orderBy(desc(decisions.decidedAt));
	const names = await userNames(
		db,
		rows.map((r) => r.decidedBy)
	);
	return rows.map((r) => ({
		id: r.id,
		at: r.decidedAt.toISOString(),
		kind: r.kind,
		fromStatus: r.fromStatus,
		toStatus: r.toStatus,
		reason: r.reason,
		by: r.decidedBy ? (names.get(r.decidedBy) ?? null) : null,
		signed: r.signature !== null,
		disposition: r.disposition ?? null,
		supplierDueDate: r.supplierDueDate ?? null
	}));
}

export async function listNoticesWithReplies(db: Db, lotId: string, replyLink: (docId: string) => string): Promise<HistoryNotice[]> {
	const rows = await db.select().from(notices).where(eq(notices.lotId, lotId)).orderBy(desc(notices.createdAt));
	const ids = rows.map((r) => r.id);
	const replies = ids.length
		? await db
				.select({ r: noticeResponses, fileName: documents.fileName })
				.from(noticeResponses)
				.leftJoin(documents, eq(documents.id, noticeResponses.documentId))
				.where(inArray(noticeResponses.noticeId, ids))
				.orderBy(asc(noticeResponses.createdAt))
		: [];
	const names = await userNames(db, [...rows.map((r) => r.acknowledgedBy), ...replies.map((x) => x.r.userId)]);
	return rows.map((n) => ({
		id: n.id,
		kind: n.kind,
		subject: n.subject,
		recipients: n.recipients,
		status: n.status,
		attempts: n.attempts,
		createdAt: n.createdAt.toISOString(),
		sentAt: iso(n.sentAt),
		acknowledgedAt: iso(n.acknowledgedAt),
		acknowledgedBy: n.acknowledgedBy ? (names.get(n.acknowledgedBy) ?? null) : null,
		replies: replies
			.filter((x) => x.r.noticeId === n.id)
			.map(({ r, fileName }) => ({
				id: r.id,
				at: r.createdAt.toISOString(),
				by: names.get(r.userId) ?? 'supplier',
				comment: r.comment,
				document: r.documentId && fileName ? { id: r.documentId, fileName, url: replyLink(r.documentId) } : null
			}))
	}));
}

/** The whole paper trail of a lot the user may see (the caller checked access). */
export async function decisionTrail(db: Database, user: { role: string }, lot: { id: string; status: string }): Promise<DecisionTrail> {
	const base = `/api/v1/lots/${lot.id}`;
	const [evals, decs, notes] = await Promise.all([
		listEvaluations(db, lot.id),
		listDecisions(db, lot.id),
		listNoticesWithReplies(db, lot.id, (docId) => `${base}/documents/${docId}`)
	]);
	const held = lot.status === 'on_hold' || lot.status === 'rejected';
	return {
		lotId: lot.id,
		status: lot.status,
		canSubmit:
			(user.role === 'inspector' || user.role === 'quality') && (lot.status === 'in_inspection' || lot.status === 'pending_decision'),
		links: { report: `${base}/report.pdf`, quarantineTag: held ? `${base}/quarantine-tag.pdf` : null, readings: `${base}/readings.xlsx` },
		evaluations: evals,
		decisions: decs,
		// Staff alerts about the lot are internal: a supplier sees only the notices sent to it.
		notices: user.role === 'supplier' ? notes.filter((n) => n.kind !== 'alert') : notes
	};
}
