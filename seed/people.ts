import { eq } from 'drizzle-orm';
import { hash } from '@node-rs/argon2';
import type { Database } from '../src/lib/server/db';
import { organisations, supplierContacts, users } from '../src/lib/server/db/schema';
import { DEMO_PASSWORD, OWN_COMPANY, STAFF, SUPPLIERS } from './scenario';

export interface SeededPeople {
	ownId: string;
	suppliers: Map<string, string>; // key -> organisation id
	staff: Map<string, string>; // role or email -> user id
}

async function upsertOrganisation(db: Database, name: string, kind: 'own' | 'supplier', country: string) {
	const found = await db.query.organisations.findFirst({ where: eq(organisations.name, name) });
	if (found) return found.id;
	const [row] = await db.insert(organisations).values({ name, kind, country }).returning({ id: organisations.id });
	return row.id;
}

async function upsertUser(
	db: Database,
	values: {
		email: string;
		name: string;
		role: 'buyer' | 'inspector' | 'quality' | 'supplier' | 'admin';
		organisationId: string;
		passwordHash: string | null;
	}
) {
	const found = await db.query.users.findFirst({ where: eq(users.email, values.email) });
	if (found) return found.id;
	const [row] = await db
		.insert(users)
		.values({ ...values, emailVerified: new Date() })
		.returning({ id: users.id });
	return row.id;
}

export async function seedPeople(db: Database): Promise<SeededPeople> {
	const ownId = await upsertOrganisation(db, OWN_COMPANY.name, 'own', OWN_COMPANY.country);
	const passwordHash = await hash(DEMO_PASSWORD);
	const staff = new Map<string, string>();
	for (const person of STAFF) {
		const id = await upsertUser(db, { ...person, organisationId: ownId, passwordHash });
		staff.set(person.email, id);
		if (!staff.has(person.role)) staff.set(person.role, id);
	}
	const suppliers = new Map<string, string>();
	for (const supplier of SUPPLIERS) {
		const orgId = await upsertOrganisation(db, supplier.name, 'supplier', supplier.country);
		suppliers.set(supplier.key, orgId);
		const existing = await db.query.supplierContacts.findMany({ where: eq(supplierContacts.organisationId, orgId) });
		for (const contact of supplier.contacts) {
			if (!existing.some((c) => c.email === contact.email)) {
				await db.insert(supplierContacts).values({ organisationId: orgId, ...contact });
			}
		}
		// The first contact also gets a portal sign-in (by e-mailed link; no password).
		const first = supplier.contacts[0];
		await upsertUser(db, { email: first.email, name: first.name, role: 'supplier', organisationId: orgId, passwordHash: null });
	}
	return { ownId, suppliers, staff };
}
