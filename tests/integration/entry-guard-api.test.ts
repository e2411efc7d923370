/**
 * The entry guard through the real app (`node build`): an OCV far outside the part's window (the
 * invented demo part VC-21700-50G, 3.00–4.18 V per cell) answers 422 `implausible_reading` for typed
 * rows, for a meter file and for a correction, naming each row and storing nothing; a confirmed value
 * is stored. Margins: Restvolt's own choice (src/lib/inspection/entry-guard.ts).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApp, type RunningApp } from '../helpers/app';
import { tokenFor } from '../helpers/auth';
import { freshDatabase, withClient } from '../helpers/db';
import { call, createLot, type Caller } from './readings-fixtures';

let app: RunningApp;
let db: Awaited<ReturnType<typeof freshDatabase>>;
let buyer: Caller;
let inspector: Caller;

beforeAll(async () => {
	db = await freshDatabase('entry_guard_api', { demo: false });
	app = await startApp({ databaseUrl: db.url });
	buyer = { base: app.url, token: await tokenFor(db.url, 'buyer@kestrel-mobility.example') };
	inspector = { base: app.url, token: await tokenFor(db.url, 'inspector@kestrel-mobility.example') };
});

afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

const readingCount = (lotId: string) =>
	withClient(db.url, async (c) => Number((await c.query('select count(*) from readings where lot_id = $1', [lotId])).rows[0].count));

const newLot = () => createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 100, declaredSoc: 0.3 });

describe('entry guard over HTTP', () => {
	it('refuses typed rows with 422 implausible_reading, naming each row, and stores none of the batch', async () => {
		const lot = await newLot();
		const res = await call(inspector, `/api/v1/lots/${lot.id}/readings`, {
			body: {
				readings: [
					{ serial: 'EGA-1', ocv_v: 3.65, temperature_c: 22 },
					{ serial: 'EGA-2', ocv_v: 36.5, temperature_c: 22 }
				]
			}
		});
		expect(res.status).toBe(422);
		expect(res.json.error.code).toBe('implausible_reading');
		expect(res.json.error.issues).toEqual([{ path: 'readings.1.ocv_v', message: expect.stringContaining('Did you mean 3.65 V') }]);
		expect(await readingCount(lot.id)).toBe(0);

		const confirmed = await call(inspector, `/api/v1/lots/${lot.id}/readings`, {
			body: { readings: [{ serial: 'EGA-2', ocv_v: 0.9, temperature_c: 22, confirmed: true }] }
		});
		expect(confirmed.status).toBe(201);
		expect(await readingCount(lot.id)).toBe(1);
	});

	it('refuses a meter file with an implausible row, naming its file row', async () => {
		const lot = await newLot();
		const form = new FormData();
		form.set('file', new Blob(['Serial;OCV (V);Temp (°C)\r\nEGF-1;3,66;22\r\nEGF-2;36,6;22\r\n']), 'meter.csv');
		form.set('mapping', JSON.stringify({ serial: 0, ocv: 1, ocv_unit: 'V', temperature: 2, first_row: 1 }));
		const res = await call(inspector, `/api/v1/lots/${lot.id}/imports`, { form });
		expect(res.status).toBe(422);
		expect(res.json.error.code).toBe('implausible_reading');
		expect(res.json.error.issues).toEqual([{ path: 'row 3.OCV', message: expect.stringContaining('Did you mean 3.66 V') }]);
		expect(await readingCount(lot.id)).toBe(0);
	});

	it('refuses a correction to an implausible value unless it is confirmed', async () => {
		const lot = await newLot();
		const added = await call(inspector, `/api/v1/lots/${lot.id}/readings`, {
			body: { readings: [{ serial: 'EGC-1', ocv_v: 3.64, temperature_c: 22, client_key: 'egc-1-key' }] }
		});
		const id = added.json.stored[0].id;
		const refused = await call(inspector, `/api/v1/lots/${lot.id}/readings/${id}`, {
			method: 'PATCH',
			body: { ocv_v: 364, reason: 'typed again' }
		});
		expect(refused.status).toBe(422);
		expect(refused.json.error.code).toBe('implausible_reading');
		expect(refused.json.error.issues[0].path).toBe('ocv_v');
		const ok = await call(inspector, `/api/v1/lots/${lot.id}/readings/${id}`, {
			method: 'PATCH',
			body: { ocv_v: 1.2, reason: 'the unit really reads 1.2 V', confirmed: true }
		});
		expect(ok.status).toBe(200);
		expect(ok.json).toMatchObject({ ocv_v: 1.2, confirmed_out_of_window: true });
	});
});
