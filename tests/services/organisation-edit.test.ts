/**
 * Organisations edited by an administrator (services/organisations.ts) on a real PostgreSQL: the
 * change is saved and audited with each field's before and after, a name another organisation
 * holds is refused naming `name` and changes nothing, and the history lists the changes (and the
 * contacts' changes) newest first with the person who made them.
 */
import { describe, expect, it } from 'vitest';
import { getDb } from '$lib/server/db';
import { getOrganisation, organisationHistory, updateOrganisation } from '$lib/server/services/organisations';
import { getSupplier, saveContact } from '$lib/server/services/suppliers';
import { Conflict } from '$lib/server/errors';
import type { SessionUser } from '$lib/roles';
import { useServiceDatabase } from '../helpers/service-db';

const db = useServiceDatabase('svc_org_edit', { demo: false });

async function admin(): Promise<SessionUser> {
	const [u] = await db.sql<SessionUser>(
		`select id, email, name, role, organisation_id as "organisationId" from "user" where email = 'admin@kestrel-mobility.example'`
	);
	return u;
}

describe('editing an organisation', () => {
	it('saves name, country and address, audits each change and shows it in the history', async () => {
		const actor = await admin();
		const [a, b] = await db.sql<{ id: string; name: string; country: string | null }>(
			`select id, name, country from organisations where kind = 'supplier' order by name limit 2`
		);
		const before = await getOrganisation(getDb(), a.id);
		const changes = await updateOrganisation(getDb(), actor, a.id, {
			name: `${a.name} GmbH`,
			country: before.country ?? '',
			address: 'Unit 4, Harbour Lane\nPortmere 4410'
		});
		expect(changes.map((c) => c.field)).toEqual(['name', 'address']);
		const [row] = await db.sql<{ name: string; address: string }>('select name, address from organisations where id = $1', [a.id]);
		expect(row).toEqual({ name: `${a.name} GmbH`, address: 'Unit 4, Harbour Lane\nPortmere 4410' });
		const [audit] = await db.sql<{ action: string; actor_id: string; details: { changes: unknown[] } }>(
			`select action, actor_id, details from audit_events where entity_type = 'organisation' and entity_id = $1 order by id desc limit 1`,
			[a.id]
		);
		expect(audit.action).toBe('organisation.updated');
		expect(audit.actor_id).toBe(actor.id);
		expect(audit.details.changes).toEqual([
			{ field: 'name', from: a.name, to: `${a.name} GmbH` },
			{ field: 'address', from: null, to: 'Unit 4, Harbour Lane\nPortmere 4410' }
		]);

		// The supplier page (getSupplier) shows the new address.
		expect((await getSupplier(getDb(), a.id))?.address).toBe('Unit 4, Harbour Lane\nPortmere 4410');

		// Saving the same values again records nothing.
		expect(
			await updateOrganisation(getDb(), actor, a.id, {
				name: `${a.name} GmbH`,
				country: before.country ?? '',
				address: 'Unit 4, Harbour Lane\nPortmere 4410'
			})
		).toEqual([]);

		// Another organisation's name is refused on the name field, and nothing changes.
		const refused = await updateOrganisation(getDb(), actor, a.id, { name: b.name, country: '', address: '' }).catch((e) => e);
		expect(refused).toBeInstanceOf(Conflict);
		expect(refused.issues).toEqual([{ path: 'name', message: 'Another organisation has this name' }]);
		expect((await getOrganisation(getDb(), a.id)).name).toBe(`${a.name} GmbH`);

		await saveContact(getDb(), actor, a.id, { contact_id: '', name: 'Mira Okafor', email: 'mira@orders.example', receives_notices: true });
		const history = await organisationHistory(getDb(), a.id);
		expect(history.map((h) => h.action).slice(0, 2)).toEqual(['supplier.contact.create', 'organisation.updated']);
		expect(history[1].actor).toMatchObject({ email: actor.email, role: 'admin' });
		const updates = await db.sql<{ n: number }>(
			`select count(*)::int as n from audit_events where entity_type = 'organisation' and entity_id = $1 and action = 'organisation.updated'`,
			[a.id]
		);
		expect(updates[0].n).toBe(1);
	});
});
