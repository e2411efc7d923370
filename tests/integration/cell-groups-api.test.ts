/**
 * Pack cell-group voltages through the real app (`node build`) with API tokens: POST readings rows may
 * carry `cell_group_voltages` (422 naming the field when they do not fit the part), GET returns them,
 * and a BMS readout CSV posted to the imports route with kind=cell_groups sets them; the evaluation
 * then reports the weakest group's deep discharge. Threshold: the NMC library model's min_safe_v
 * (2.5 V, "common practice" in the model); the demo lot and its serials are invented.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApp, type RunningApp } from '../helpers/app';
import { tokenFor } from '../helpers/auth';
import { freshDatabase, withClient } from '../helpers/db';
import { call, type Caller } from './readings-fixtures';

let app: RunningApp;
let db: Awaited<ReturnType<typeof freshDatabase>>;
let inspector: Caller;
let lotId: string;

beforeAll(async () => {
	db = await freshDatabase('cell_groups_api');
	app = await startApp({ databaseUrl: db.url });
	inspector = { base: app.url, token: await tokenFor(db.url, 'inspector@kestrel-mobility.example') };
	// The demo's 10s4p NMC pack lot on the bench.
	lotId = await withClient(db.url, async (c) => (await c.query(`select id from lots where lot_code = 'L-2026-00024'`)).rows[0].id);
});

afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

const groups = (v: number, changes: Record<number, number> = {}) => Array.from({ length: 10 }, (_, i) => changes[i + 1] ?? v);
const total = (xs: number[]) => Math.round(xs.reduce((a, x) => a + x, 0) * 10000) / 10000;
const readingsOf = (serial: string) =>
	withClient(
		db.url,
		async (c) => (await c.query('select cell_group_voltages from readings where lot_id = $1 and serial = $2', [lotId, serial])).rows
	);

function bmsForm(text: string): FormData {
	const form = new FormData();
	form.set('kind', 'cell_groups');
	form.set('file', new File([text], 'bms-readout.csv', { type: 'text/csv' }));
	return form;
}

describe('cell_group_voltages on POST/GET /api/v1/lots/{id}/readings', () => {
	it('stores groups that fit the part and returns them', async () => {
		const g = groups(3.6);
		const res = await call(inspector, `/api/v1/lots/${lotId}/readings`, {
			body: { readings: [{ serial: 'PK-API-001', ocv_v: total(g), temperature_c: 23, cell_group_voltages: g }] }
		});
		expect(res.status).toBe(201);
		const list = await call(inspector, `/api/v1/lots/${lotId}/readings`);
		const stored = list.json.readings.find((r: { serial: string }) => r.serial === 'PK-API-001');
		expect(stored.cell_group_voltages).toEqual(g);
	});

	it('answers 422 naming the field for a wrong count or an implausible value, and stores nothing', async () => {
		const nine = groups(3.6).slice(1);
		const count = await call(inspector, `/api/v1/lots/${lotId}/readings`, {
			body: { readings: [{ serial: 'PK-API-002', ocv_v: total(nine), temperature_c: 23, cell_group_voltages: nine }] }
		});
		expect(count.status).toBe(422);
		expect(count.json.error.issues[0]).toMatchObject({ path: 'readings.0.cell_group_voltages' });
		const millivolts = await call(inspector, `/api/v1/lots/${lotId}/readings`, {
			body: { readings: [{ serial: 'PK-API-002', ocv_v: 36, temperature_c: 23, cell_group_voltages: groups(3.6, { 5: 3600 }) }] }
		});
		expect(millivolts.status).toBe(422);
		expect(millivolts.json.error.issues[0].path).toBe('readings.0.cell_group_voltages.4');
		expect(await readingsOf('PK-API-002')).toEqual([]);
	});
});

describe('BMS readout import (kind=cell_groups)', () => {
	it('sets the groups of the latest reading; a dead group shows as deep discharge in the evaluation', async () => {
		const g = groups(3.6);
		await call(inspector, `/api/v1/lots/${lotId}/readings`, {
			body: { readings: [{ serial: 'PK-API-003', ocv_v: total(g), temperature_c: 23 }] }
		});
		const weak = groups(3.77, { 4: 2.0 }); // nine groups a little higher, one at 2.0 V: same total
		const header = ['serial', ...weak.map((_, i) => `group_${i + 1}`)].join(',');
		const res = await call(inspector, `/api/v1/lots/${lotId}/imports`, { form: bmsForm(`${header}\nPK-API-003,${weak.join(',')}\n`) });
		expect(res.status).toBe(200);
		expect(res.json).toMatchObject({ updated: 1, readings: [{ serial: 'PK-API-003', min_v: 2.0, max_v: 3.77 }] });
		const evaluation = await call(inspector, `/api/v1/lots/${lotId}/evaluation`);
		const deep = evaluation.json.reasons.find((r: { code: string }) => r.code === 'deep_discharge');
		expect(deep.units).toContain('PK-API-003');
		expect(deep.message).toContain('PK-API-003 group 4 at 2.000 V');
	});

	it('refuses a file with an unknown serial or a wrong count, naming the rows, and changes nothing', async () => {
		const before = await readingsOf('PK-API-001');
		const ten = groups(3.6).join(',');
		const text = `serial,groups\nPK-API-001,${groups(3.6).slice(2).join(',')}\nNOT-MEASURED,${ten}\n`;
		const res = await call(inspector, `/api/v1/lots/${lotId}/imports`, { form: bmsForm(text) });
		expect(res.status).toBe(422);
		const paths = res.json.error.issues.map((i: { path: string }) => i.path);
		expect(paths).toEqual(expect.arrayContaining(['row 2.cell_group_voltages', 'row 3.serial']));
		expect(await readingsOf('PK-API-001')).toEqual(before);
	});
});
