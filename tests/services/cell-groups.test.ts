/**
 * Pack cell-group voltages on the real PostgreSQL: readings accept them when they fit the part (one per
 * cell in series, plausible, adding up to the pack OCV) and refuse them naming the field otherwise;
 * a BMS readout CSV (services/cell-group-import.ts) sets them on each unit's latest reading; the
 * evaluation then judges the weakest group. Thresholds are the NMC library model's min_safe_v (2.5 V,
 * marked "common practice" in the model) and the part's imbalance limit (default 50 mV, common practice).
 */
import { describe, expect, it } from 'vitest';
import type { SessionUser } from '$lib/roles';
import { getDb } from '$lib/server/db';
import { DomainError } from '$lib/server/errors';
import { importCellGroups } from '$lib/server/services/cell-group-import';
import { evaluateLotNow } from '$lib/server/services/evaluation';
import { addReadings, listReadings } from '$lib/server/services/readings';
import { useServiceDatabase } from '../helpers/service-db';

const db = useServiceDatabase('svc_cell_groups');
// The demo's 10s4P NMC pack lot on the bench (invented part VC-EB36-10S4P).
const LOT_CODE = 'L-2026-00024';

async function setUp() {
	const [lot] = await db.sql<{ id: string }>('select id from lots where lot_code = $1', [LOT_CODE]);
	const [u] = await db.sql<{ id: string; email: string }>('select id, email from "user" where email = $1', [
		'inspector@kestrel-mobility.example'
	]);
	const user: SessionUser = { id: u.id, email: u.email, name: null, role: 'inspector', organisationId: null };
	return { lotId: lot.id, user };
}

const tenGroups = (v: number, changes: Record<number, number> = {}) => Array.from({ length: 10 }, (_, i) => changes[i + 1] ?? v);
const sum = (xs: number[]) => xs.reduce((a, x) => a + x, 0);

async function refusal(work: Promise<unknown>): Promise<DomainError> {
	const error = await work.then(
		() => null,
		(e: unknown) => e
	);
	expect(error).toBeInstanceOf(DomainError);
	return error as DomainError;
}

const csv = (text: string) => ({ name: 'bms.csv', bytes: new TextEncoder().encode(text), format: 'csv' as const });

describe('cell-group voltages with readings', () => {
	it('stores groups that fit the part and lists them with the reading', async () => {
		const { lotId, user } = await setUp();
		const groups = tenGroups(3.59);
		await addReadings(
			getDb(),
			user,
			lotId,
			[{ serial: 'VCEB36-024-00101', ocv_v: sum(groups), temperature_c: 22, cell_group_voltages: groups }],
			'api'
		);
		const stored = (await listReadings(getDb(), lotId)).find((r) => r.serial === 'VCEB36-024-00101');
		expect(stored?.cell_group_voltages).toEqual(groups);
	});

	it('refuses a count other than the cells in series, naming the field, and stores nothing', async () => {
		const { lotId, user } = await setUp();
		const nine = tenGroups(3.59).slice(1);
		const error = await refusal(
			addReadings(
				getDb(),
				user,
				lotId,
				[{ serial: 'VCEB36-024-00102', ocv_v: sum(nine), temperature_c: 22, cell_group_voltages: nine }],
				'api'
			)
		);
		expect(error.kind).toBe('invalid');
		expect(error.issues?.[0]).toMatchObject({ path: 'readings.0.cell_group_voltages' });
		expect(error.issues?.[0].message).toContain('expected 10 group voltages');
		expect((await listReadings(getDb(), lotId)).some((r) => r.serial === 'VCEB36-024-00102')).toBe(false);
	});

	it('refuses implausible values (mV typed as V, text) naming the group', async () => {
		const { lotId, user } = await setUp();
		const mv = tenGroups(3.59, { 4: 3590 });
		const error = await refusal(
			addReadings(getDb(), user, lotId, [{ serial: 'VCEB36-024-00103', ocv_v: 35.9, temperature_c: 22, cell_group_voltages: mv }], 'api')
		);
		expect(error.issues?.[0].path).toBe('readings.0.cell_group_voltages.3');
		const text = await refusal(
			addReadings(
				getDb(),
				user,
				lotId,
				[{ serial: 'VCEB36-024-00103', ocv_v: 35.9, temperature_c: 22, cell_group_voltages: ['3.59'] }],
				'api'
			)
		);
		expect(text.issues?.[0].path).toMatch(/^readings\.0\.cell_group_voltages/);
	});
});

describe('BMS readout import and the weakest group', () => {
	it('a pack read without groups is judged on its average, and the evaluation says so', async () => {
		// The demo's air-shipped pack lot on hold was read without its groups.
		const [held] = await db.sql<{ id: string }>(`select id from lots where lot_code = 'L-2026-00019'`);
		const evaluation = await evaluateLotNow(getDb(), held.id);
		const note = evaluation.reasons.find((r) => r.code === 'cell_groups_not_recorded');
		expect(note?.message).toContain('one dead cell group can hide in the total');
	});

	it('sets the groups of the latest readings from a CSV; one dead group makes deep discharge although the average is fine', async () => {
		const { lotId, user } = await setUp();
		const [unit] = await db.sql<{ ocv_v: number }>(
			`select ocv_v from readings r join lots l on l.id = r.lot_id where l.lot_code = $1 and r.serial = 'VCEB36-024-00003'`,
			[LOT_CODE]
		);
		// Nine groups at the pack's average plus a little, one at 2.1 V: the sum still matches the meter.
		const rest = (unit.ocv_v - 2.1) / 9;
		const weak = tenGroups(rest, { 6: 2.1 });
		const header = ['serial', ...weak.map((_, i) => `group_${i + 1}`)].join(';');
		const row = ['VCEB36-024-00003', ...weak.map((v) => v.toFixed(4).replace('.', ','))].join(';');
		const result = await importCellGroups(getDb(), user, lotId, csv(`${header}\n${row}\n`));
		expect(result.updated).toBe(1);
		expect(result.readings[0]).toMatchObject({ serial: 'VCEB36-024-00003', min_v: 2.1 });

		const evaluation = await evaluateLotNow(getDb(), lotId);
		const packUnit = evaluation.units.find((u) => u.serial === 'VCEB36-024-00003');
		expect(packUnit?.ocv_cell_v).toBeGreaterThan(3.0); // the average cell voltage alone looks fine
		expect(packUnit?.cell_groups).toMatchObject({ weakest_group: 6, deep_discharge_groups: [6] });
		const deep = evaluation.reasons.find((r) => r.code === 'deep_discharge');
		expect(deep && 'units' in deep ? deep.units : null).toEqual(['VCEB36-024-00003']);
		const [audit] = await db.sql<{ details: { count: number } }>(
			`select details from audit_events where action = 'readings.cell_groups_imported' and lot_id = $1`,
			[lotId]
		);
		expect(audit.details.count).toBe(1);
	});

	it('refuses the whole file, naming rows, when a serial has no reading or a value is not a number', async () => {
		const { lotId, user } = await setUp();
		const good = tenGroups(3.59).join(',');
		const file = csv(
			`serial,${tenGroups(0).map((_, i) => `group_${i + 1}`)}\nVCEB36-024-00001,${good}\nNOT-MEASURED,${good}\nVCEB36-024-00002,3.59,abc\n`
		);
		const groupsOf00001 = async () =>
			(
				await db.sql<{ groups: number[] | null }>(
					`select cell_group_voltages as groups from readings r join lots l on l.id = r.lot_id where l.lot_code = $1 and r.serial = 'VCEB36-024-00001'`,
					[LOT_CODE]
				)
			)[0].groups;
		const before = await groupsOf00001();
		const error = await refusal(importCellGroups(getDb(), user, lotId, file));
		const paths = error.issues?.map((i) => i.path);
		expect(paths).toEqual(expect.arrayContaining(['row 3.serial', 'row 4.group_2']));
		expect(await groupsOf00001()).toEqual(before);
	});
});
