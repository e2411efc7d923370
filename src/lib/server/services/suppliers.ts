/** Supplier organisations and their notice contacts. All SQL for suppliers lives here. */
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import type { Database, Tx } from '../db';
import { organisations, parts, supplierContacts } from '../db/schema';
import type { SessionUser } from '$lib/roles';
import type { ContactForm } from '$lib/schemas/supplier';
import { recordAudit } from './audit';

export interface SupplierContact {
	id: string;
	name: string;
	email: string;
	receivesNotices: boolean;
}

export interface Supplier {
	id: string;
	name: string;
	country: string | null;
	address: string | null;
	createdAt: Date;
	contacts: SupplierContact[];
	partCount: number;
}

const contactColumns = {
	id: supplierContacts.id,
	name: supplierContacts.name,
	email: supplierContacts.email,
	receivesNotices: supplierContacts.receivesNotices
};

async function contactsByOrg(db: Database | Tx, orgIds: string[]): Promise<Map<string, SupplierContact[]>> {
	const map = new Map<string, SupplierContact[]>();
	if (orgIds.length === 0) return map;
	const rows = await db
		.select({ ...contactColumns, organisationId: supplierContacts.organisationId })
		.from(supplierContacts)
		.where(inArray(supplierContacts.organisationId, orgIds))
		.orderBy(asc(supplierContacts.name));
	for (const { organisationId, ...contact } of rows) {
		map.set(organisationId, [...(map.get(organisationId) ?? []), contact]);
	}
	return map;
}

/**
 * Parts per supplier, as a plain grouped query. (A correlated subquery inside the select rendered
 * the outer column unqualified, so it compared the parts table with itself and counted 0.)
 */
async function partCountsByOrg(db: Database | Tx, orgIds: string[]): Promise<Map<string, number>> {
	if (orgIds.length === 0) return new Map();
	const rows = await db
		.select({ supplierId: parts.supplierId, count: sql<number>`count(*)::int` })
		.from(parts)
		.where(inArray(parts.supplierId, orgIds))
		.groupBy(parts.supplierId);
	return new Map(rows.map((r) => [r.supplierId, r.count]));
}

/** Every supplier organisation with its contacts, by name. */
export async function listSuppliers(db: Database): Promise<Supplier[]> {
	const orgs = await db
		.select({
			id: organisations.id,
			name: organisations.name,
			country: organisations.country,
			address: organisations.address,
			createdAt: organisations.createdAt
		})
		.from(organisations)
		.where(eq(organisations.kind, 'supplier'))
		.orderBy(asc(organisations.name));
	const ids = orgs.map((o) => o.id);
	const contacts = await contactsByOrg(db, ids);
	const partCounts = await partCountsByOrg(db, ids);
	return orgs.map((o) => ({ ...o, contacts: contacts.get(o.id) ?? [], partCount: partCounts.get(o.id) ?? 0 }));
}

/** One supplier organisation (null when the id is not a supplier). */
export async function getSupplier(db: Database, id: string): Promise<Supplier | null> {
	const all = await listSuppliers(db);
	return all.find((s) => s.id === id) ?? null;
}

export class ContactNotFoundError extends Error {}

/** Add a contact, or edit one when `contact_id` is set. */
export async function saveContact(db: Database, actor: SessionUser, supplierId: string, form: ContactForm): Promise<SupplierContact> {
	return db.transaction(async (tx) => {
		const values = { name: form.name, email: form.email.toLowerCase(), receivesNotices: form.receives_notices };
		const [row] = form.contact_id
			? await tx
					.update(supplierContacts)
					.set(values)
					.where(and(eq(supplierContacts.id, form.contact_id), eq(supplierContacts.organisationId, supplierId)))
					.returning(contactColumns)
			: await tx
					.insert(supplierContacts)
					.values({ ...values, organisationId: supplierId })
					.returning(contactColumns);
		if (!row) throw new ContactNotFoundError('That contact does not belong to this supplier');
		await recordAudit(tx, {
			actorId: actor.id,
			actorEmail: actor.email,
			action: form.contact_id ? 'supplier.contact.update' : 'supplier.contact.create',
			entityType: 'supplier_contact',
			entityId: row.id,
			details: { supplierId, email: row.email, receivesNotices: row.receivesNotices }
		});
		return row;
	});
}

/** snake_case JSON for the API. */
export function supplierJson(s: Supplier) {
	return {
		id: s.id,
		name: s.name,
		country: s.country,
		part_count: s.partCount,
		contacts: s.contacts.map((c) => ({ id: c.id, name: c.name, email: c.email, receives_notices: c.receivesNotices }))
	};
}
