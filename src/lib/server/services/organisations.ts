/**
 * An organisation's details as the administrator edits them, and their history: every change is
 * audited in the same transaction, with the fields it changed from and to, and the history reads
 * the audit trail (details and notice contacts), newest first.
 */
import { and, asc, desc, eq, ne, or, sql } from 'drizzle-orm';
import type { Database } from '../db';
import { auditEvents, organisations, supplierContacts, users } from '../db/schema';
import { Conflict, NotFound } from '../errors';
import type { OrganisationDetails } from '$lib/schemas/organisation';
import type { Role } from '$lib/roles';
import { recordAudit } from './audit';

export interface OrganisationView {
	id: string;
	name: string;
	kind: 'own' | 'supplier';
	country: string | null;
	address: string | null;
	contacts: { id: string; name: string; email: string; receivesNotices: boolean }[];
}

export async function getOrganisation(db: Database, id: string): Promise<OrganisationView> {
	const [org] = await db
		.select({
			id: organisations.id,
			name: organisations.name,
			kind: organisations.kind,
			country: organisations.country,
			address: organisations.address
		})
		.from(organisations)
		.where(eq(organisations.id, id));
	if (!org) throw new NotFound('organisation');
	const contacts = await db
		.select({
			id: supplierContacts.id,
			name: supplierContacts.name,
			email: supplierContacts.email,
			receivesNotices: supplierContacts.receivesNotices
		})
		.from(supplierContacts)
		.where(eq(supplierContacts.organisationId, id))
		.orderBy(asc(supplierContacts.name));
	return { ...org, contacts };
}

export interface FieldChange {
	field: 'name' | 'country' | 'address';
	from: string | null;
	to: string | null;
}

const blankAsNull = (value: string) => (value.trim() === '' ? null : value.trim());

/** Save name, country and address; audited with each changed field. Nothing changed: nothing recorded. */
export async function updateOrganisation(
	db: Database,
	actor: { id: string; email: string },
	id: string,
	input: OrganisationDetails
): Promise<FieldChange[]> {
	return db.transaction(async (tx) => {
		const [before] = await tx.select().from(organisations).where(eq(organisations.id, id)).for('update');
		if (!before) throw new NotFound('organisation');
		const after = { name: input.name.trim(), country: blankAsNull(input.country), address: blankAsNull(input.address) };
		const [clash] = await tx
			.select({ id: organisations.id })
			.from(organisations)
			.where(and(eq(organisations.name, after.name), ne(organisations.id, id)));
		if (clash)
			throw new Conflict('Another organisation has that name', 'name_taken', [
				{ path: 'name', message: 'Another organisation has this name' }
			]);
		const changes = (['name', 'country', 'address'] as const)
			.filter((field) => before[field] !== after[field])
			.map((field) => ({ field, from: before[field], to: after[field] }));
		if (changes.length === 0) return [];
		await tx.update(organisations).set(after).where(eq(organisations.id, id));
		await recordAudit(tx, {
			actorId: actor.id,
			actorEmail: actor.email,
			action: 'organisation.updated',
			entityType: 'organisation',
			entityId: id,
			details: { changes }
		});
		return changes;
	});
}

export interface HistoryEntry {
	id: number;
	at: Date;
	action: string;
	actor: { name: string | null; email: string; role: Role } | null;
	details: Record<string, unknown>;
}

/** The organisation's own events and its contacts' events, newest first. */
export async function organisationHistory(db: Database, id: string, limit = 100): Promise<HistoryEntry[]> {
	const rows = await db
		.select({
			id: auditEvents.id,
			at: auditEvents.at,
			action: auditEvents.action,
			details: auditEvents.details,
			actorEmail: auditEvents.actorEmail,
			name: users.name,
			email: users.email,
			role: users.role
		})
		.from(auditEvents)
		.leftJoin(users, eq(users.id, auditEvents.actorId))
		.where(
			or(
				and(eq(auditEvents.entityType, 'organisation'), eq(auditEvents.entityId, id)),
				and(eq(auditEvents.entityType, 'supplier_contact'), sql`${auditEvents.details}->>'supplierId' = ${id}`)
			)
		)
		.orderBy(desc(auditEvents.at), desc(auditEvents.id))
		.limit(limit);
	return rows.map((r) => ({
		id: r.id,
		at: r.at,
		action: r.action,
		details: (r.details ?? {}) as Record<string, unknown>,
		actor: r.email && r.role ? { name: r.name, email: r.email, role: r.role } : null
	}));
}
