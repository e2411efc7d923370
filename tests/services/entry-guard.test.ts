/**
 * The entry guard on the real PostgreSQL: an OCV far outside the part's window (36.5 typed for
 * 3.65 V on the demo's invented NMC cell part, window 3.00–4.18 V) is refused with
 * `implausible_reading`, the whole batch with it, naming each row; `confirmed: true` stores it,
 * marked. The same holds for a meter file and for a correction. Margins: Restvolt's own choice
 * (src/lib/inspection/entry-guard.ts).
 */
import { describe, expect, it } from 'vitest';
import type { SessionUser } from '$lib/roles';
import { getDb } from '$lib/server/db';
import { DomainError } from '$lib/server/errors';
import { commitImport } from '$lib/server/services/imports';
import { addReadings, correctReading, listReadings } from '$lib/server/services/readings';
import { useServiceDatabase } from '../helpers/service-db';

const db = useServiceDatabase('svc_entry_guard');
// The demo's NMC cell lot on the bench (invented part VC-21700-50G, window 3.00–4.18 V per cell).
const LOT_CODE = 'L-2026-00022';

async function setUp() {
	const [lot] = await db.sql<{ id: string }>('select id from lots where lot_code = $1', [LOT_CODE]);
	const [u] = await db.sql<{ id: string; email: string }>('select id, email from "user" where email = $1', [
		'inspector@kestrel-mobility.example'
	]);
	const user: SessionUser = { id: u.id, email: u.email, name: null, role: 'inspector', organisationId: null };
	return { lotId: lot.id, user };
}

async function refusal(work: Promise<unknown>): Promise<DomainError> {
	const error = await work.then(
		() => null,
		(e: unknown) => e
	);
	expect(error).toBeInstanceOf(DomainError);
	return error as DomainError;
}

const serials = async (lotId: string) => new Set((await listReadings(getDb(), lotId)).map((r) => r.serial));

describe('entry guard', () => {
	it('refuses the whole batch when one row is implausible, naming the row, and stores nothing', async () => {
		const { lotId, user } = await setUp();
		const error = await refusal(
			addReadings(
				getDb(),
				user,
				lotId,
				[
					{ serial: 'EG-0001', ocv_v: 3.65, temperature_c: 22 },
					{ serial: 'EG-0002', ocv_v: 36.5, temperature_c: 22 },
					{ serial: 'EG-0003', ocv_v: 0.3652, temperature_c: 22 }
				],
				'api'
			)
		);
		expect(error.kind).toBe('invalid');
		expect(error.code).toBe('implausible_reading');
		expect(error.issues?.map((i) => i.path)).toEqual(['readings.1.ocv_v', 'readings.2.ocv_v']);
		expect(error.issues?.[0].message).toContain('Did you mean 3.65 V');
		expect(error.issues?.[1].message).toContain('Did you mean 3.652 V');
		const stored = await serials(lotId);
		expect(['EG-0001', 'EG-0002', 'EG-0003'].some((s) => stored.has(s))).toBe(false);
	});

	it('stores a confirmed out-of-window value and marks it', async () => {
		const { lotId, user } = await setUp();
		await addReadings(
			getDb(),
			user,
			lotId,
			[
				{ serial: 'EG-0010', ocv_v: 0.9, temperature_c: 22, confirmed: true },
				{ serial: 'EG-0011', ocv_v: 3.7, temperature_c: 22, confirmed: true }
			],
			'api'
		);
		const rows = (await listReadings(getDb(), lotId)).filter((r) => r.serial.startsWith('EG-001'));
		expect(rows.map((r) => [r.serial, r.ocv_v, r.confirmed_out_of_window])).toEqual([
			['EG-0010', 0.9, true],
			// An in-window value is not marked, even when sent with confirmed.
			['EG-0011', 3.7, false]
		]);
	});

	it('refuses a meter file with an implausible row, naming its file row', async () => {
		const { lotId, user } = await setUp();
		const text = 'serial,ocv_v,temp\nEG-0020,3.66,22\nEG-0021,36.6,22\n';
		const file = { name: 'meter.csv', bytes: new TextEncoder().encode(text), format: 'csv' as const };
		const error = await refusal(
			commitImport(getDb(), user, lotId, file, { serial: 0, ocv: 1, ocv_unit: 'V', temperature: 2, first_row: 1, skip_invalid: false })
		);
		expect(error.code).toBe('implausible_reading');
		expect(error.issues).toEqual([{ path: 'row 3.OCV', message: expect.stringContaining('Did you mean 3.66 V') }]);
		const imports = await db.sql('select 1 from reading_imports where lot_id = $1 and file_name = $2', [lotId, 'meter.csv']);
		expect(imports).toHaveLength(0);
		expect((await serials(lotId)).has('EG-0020')).toBe(false);
	});

	it('refuses a correction to an implausible value unless confirmed', async () => {
		const { lotId, user } = await setUp();
		const result = await addReadings(
			getDb(),
			user,
			lotId,
			[{ serial: 'EG-0030', ocv_v: 3.64, temperature_c: 22, client_key: 'eg-0030-key' }],
			'api'
		);
		const id = result.stored[0].id;
		const error = await refusal(correctReading(getDb(), user, lotId, id, { ocv_v: 364, reason: 'typed again' }));
		expect(error.code).toBe('implausible_reading');
		expect(error.issues?.[0]).toMatchObject({ path: 'ocv_v' });
		expect((await listReadings(getDb(), lotId)).find((r) => r.id === id)?.ocv_v).toBe(3.64);
		const after = await correctReading(getDb(), user, lotId, id, { ocv_v: 1.2, reason: 'unit really reads 1.2 V', confirmed: true });
		expect([after.ocv_v, after.confirmed_out_of_window]).toEqual([1.2, true]);
	});
});
