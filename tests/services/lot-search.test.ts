/**
 * Lots list search (services/lots.ts listLots) on the demo scenario: the one box finds lots by PO,
 * lot code, part number, supplier name and a unit serial, as its placeholder promises.
 */
import { describe, expect, it } from 'vitest';
import { getDb } from '$lib/server/db';
import { listLots } from '$lib/server/services/lots';
import type { SessionUser } from '$lib/roles';
import { useServiceDatabase } from '../helpers/service-db';

const db = useServiceDatabase('svc_lot_search');

async function buyer(): Promise<SessionUser> {
	const [u] = await db.sql<SessionUser>(
		`select id, email, name, role, organisation_id as "organisationId" from "user" where email = 'buyer@kestrel-mobility.example'`
	);
	return u;
}

const found = async (search: string) => new Set((await listLots(getDb(), await buyer(), { search, limit: 500 })).lots.map((l) => l.id));

async function expected(sql: string, value: string): Promise<Set<string>> {
	return new Set((await db.sql<{ id: string }>(sql, [value])).map((r) => r.id));
}

describe('lots list search', () => {
	it('finds lots by part number, supplier name and unit serial, exactly the ones the tables say', async () => {
		const [lot] = await db.sql<{ part_number: string; supplier: string; serial: string }>(
			`select p.part_number, o.name as supplier, r.serial
			   from lots l join parts p on p.id = l.part_id join organisations o on o.id = l.supplier_id
			   join readings r on r.lot_id = l.id limit 1`
		);
		expect(lot).toBeDefined();
		const byPart = await expected(
			'select l.id from lots l join parts p on p.id = l.part_id where p.part_number ilike $1',
			`%${lot.part_number}%`
		);
		expect(byPart.size).toBeGreaterThan(0);
		expect(await found(lot.part_number)).toEqual(byPart);

		const supplierWord = lot.supplier.split(' ')[0];
		const bySupplier = await expected(
			'select l.id from lots l join organisations o on o.id = l.supplier_id where o.name ilike $1',
			`%${supplierWord}%`
		);
		expect(await found(supplierWord)).toEqual(bySupplier);

		const bySerial = await expected('select distinct lot_id as id from readings where serial = $1', lot.serial);
		expect(bySerial.size).toBeGreaterThan(0);
		for (const id of bySerial) expect(await found(lot.serial)).toContain(id);
	});

	it('finds nothing for text no lot carries', async () => {
		expect((await found('no-such-thing-zz9')).size).toBe(0);
	});
});
