/**
 * People and organisations as the admin manages them, and the signed-in person as the app sees
 * them. Role changes, invitations and (de)activations are audited in the same transaction.
 */
import { and, asc, count, eq, sql } from 'drizzle-orm';
import { getDb } from '../db';
import { organisations, supplierContacts, users } from '../db/schema';
import { recordAudit } from './audit';
import { revokeAllAccess } from './sessions';
import type { Role, SessionUser } from '../../roles';
import { Invalid } from '../errors';

export interface Actor {
	id: string;
	email: string;
}

/** A rule about people or organisations that the request breaks (one's own role, a taken address…). */
export class UserRuleError extends Invalid {
	constructor(message: string) {
		super(message, undefined, 'user_rule');
	}
}

type UserRow = typeof users.$inferSelect;

export function toSessionUser(row: Pick<UserRow, 'id' | 'email' | 'name' | 'role' | 'organisationId'>): SessionUser {
	return { id: row.id, email: row.email, name: row.name, role: row.role, organisationId: row.organisationId };
}

export const normaliseEmail = (email: string) => email.trim().toLowerCase();

export async function findUserByEmail(email: string): Promise<UserRow | undefined> {
	return getDb().query.users.findFirst({ where: eq(users.email, normaliseEmail(email)) });
}

/** The signed-in person as stored now (role changes and deactivation take effect at once). */
export async function activeSessionUser(id: string): Promise<SessionUser | null> {
	const row = await getDb().query.users.findFirst({ where: and(eq(users.id, id), eq(users.active, true)) });
	return row ? toSessionUser(row) : null;
}

export async function listUsers() {
	return getDb()
		.select({
			id: users.id,
			email: users.email,
			name: users.name,
			role: users.role,
			active: users.active,
			hasPassword: sql<boolean>`${users.passwordHash} is not null`,
			organisationId: users.organisationId,
			organisationName: organisations.name,
			createdAt: users.createdAt
		})
		.from(users)
		.leftJoin(organisations, eq(organisations.id, users.organisationId))
		.orderBy(asc(organisations.name), asc(users.email));
}

export async function getUser(id: string) {
	return getDb().query.users.findFirst({ where: eq(users.id, id) });
}

/** Staff belong to the receiving company; supplier users to a supplier organisation. */
async function assertRoleFitsOrganisation(role: Role, organisationId: string) {
	const org = await getDb().query.organisations.findFirst({ where: eq(organisations.id, organisationId) });
	if (!org) throw new UserRuleError('That organisation does not exist.');
	const wanted = role === 'supplier' ? 'supplier' : 'own';
	if (org.kind !== wanted) {
		throw new UserRuleError(
			role === 'supplier'
				? 'Supplier users belong to a supplier organisation.'
				: 'Staff roles belong to the receiving company, not to a supplier.'
		);
	}
}

export interface Invitation {
	email: string;
	name: string;
	role: Role;
	organisationId: string;
}

/** Create the person (no password yet); the caller mails them how to sign in. */
export async function inviteUser(actor: Actor, invitation: Invitation): Promise<UserRow> {
	const email = normaliseEmail(invitation.email);
	await assertRoleFitsOrganisation(invitation.role, invitation.organisationId);
	if (await findUserByEmail(email)) throw new UserRuleError('Someone with that e-mail address already has an account.');
	return getDb().transaction(async (tx) => {
		const [row] = await tx
			.insert(users)
			.values({ email, name: invitation.name, role: invitation.role, organisationId: invitation.organisationId })
			.returning();
		await recordAudit(tx, {
			actorId: actor.id,
			actorEmail: actor.email,
			action: 'user.invited',
			entityType: 'user',
			entityId: row.id,
			details: { email, role: row.role, organisationId: row.organisationId }
		});
		return row;
	});
}

export async function changeRole(actor: Actor, userId: string, role: Role): Promise<void> {
	if (userId === actor.id) throw new UserRuleError('You cannot change your own role; ask another administrator.');
	const user = await getUser(userId);
	if (!user) throw new UserRuleError('That person does not exist.');
	if (user.role === role) return;
	if (!user.organisationId) throw new UserRuleError('This person has no organisation.');
	await assertRoleFitsOrganisation(role, user.organisationId);
	await getDb().transaction(async (tx) => {
		await tx.update(users).set({ role }).where(eq(users.id, userId));
		await recordAudit(tx, {
			actorId: actor.id,
			actorEmail: actor.email,
			action: 'user.role_changed',
			entityType: 'user',
			entityId: userId,
			details: { email: user.email, from: user.role, to: role }
		});
	});
}

export async function setActive(actor: Actor, userId: string, active: boolean): Promise<void> {
	if (userId === actor.id) throw new UserRuleError('You cannot deactivate yourself.');
	const user = await getUser(userId);
	if (!user) throw new UserRuleError('That person does not exist.');
	if (user.active === active) return;
	await getDb().transaction(async (tx) => {
		await tx.update(users).set({ active }).where(eq(users.id, userId));
		// Reactivating someone later must not revive what they held before.
		if (!active) await revokeAllAccess(tx, userId, user.email);
		await recordAudit(tx, {
			actorId: actor.id,
			actorEmail: actor.email,
			action: active ? 'user.reactivated' : 'user.deactivated',
			entityType: 'user',
			entityId: userId,
			details: { email: user.email }
		});
	});
}

// ---- organisations (admin) ----

export async function listOrganisations() {
	const db = getDb();
	const orgs = await db
		.select({
			id: organisations.id,
			name: organisations.name,
			kind: organisations.kind,
			country: organisations.country,
			people: count(users.id)
		})
		.from(organisations)
		.leftJoin(users, eq(users.organisationId, organisations.id))
		.groupBy(organisations.id)
		.orderBy(asc(organisations.kind), asc(organisations.name));
	const contacts = await db.select().from(supplierContacts).orderBy(asc(supplierContacts.name));
	return orgs.map((o) => ({ ...o, contacts: contacts.filter((c) => c.organisationId === o.id) }));
}

export async function organisationChoices() {
	return getDb()
		.select({ id: organisations.id, name: organisations.name, kind: organisations.kind })
		.from(organisations)
		.orderBy(asc(organisations.kind), asc(organisations.name));
}

export async function createSupplierOrganisation(actor: Actor, input: { name: string; country?: string | null }) {
	const name = input.name.trim();
	const clash = await getDb().query.organisations.findFirst({ where: eq(organisations.name, name) });
	if (clash) throw new UserRuleError('An organisation with that name already exists.');
	return getDb().transaction(async (tx) => {
		const [row] = await tx
			.insert(organisations)
			.values({ name, kind: 'supplier', country: input.country?.trim() || null })
			.returning();
		await recordAudit(tx, {
			actorId: actor.id,
			actorEmail: actor.email,
			action: 'organisation.created',
			entityType: 'organisation',
			entityId: row.id,
			details: { name }
		});
		return row;
	});
}
