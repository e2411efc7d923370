import { auditEvents } from '../db/schema';
import type { Database, Tx } from '../db';

export interface AuditEntry {
	actorId?: string | null;
	actorEmail?: string | null;
	action: string;
	entityType?: string;
	entityId?: string;
	lotId?: string | null;
	details?: Record<string, unknown>;
	ip?: string | null;
}

/** Append to the audit trail (inside the caller's transaction when given one). */
export async function recordAudit(db: Database | Tx, entry: AuditEntry): Promise<void> {
	await db.insert(auditEvents).values({ ...entry, details: entry.details ?? {} });
}
