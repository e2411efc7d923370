/**
 * Correcting a stored reading from the inspection page (form action ?/correct): the value changes,
 * the reason and both values land in the audit trail, the evaluation follows, bad input is refused
 * with nothing changed, and a role without reading:write cannot do it.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApp, type RunningApp } from '../helpers/app';
import { postForm, signInApi, tokenFor } from '../helpers/auth';
import { freshDatabase, withClient } from '../helpers/db';
import { PART } from './decisions-fixtures';
import { call, createLot, modelReadings, type Caller } from './readings-fixtures';

let app: RunningApp;
let db: Awaited<ReturnType<typeof freshDatabase>>;
let buyer: Caller, inspector: Caller;
let inspectorCookie: string, buyerCookie: string;

beforeAll(async () => {
	db = await freshDatabase('reading_correction', { demo: false });
	app = await startApp({ databaseUrl: db.url });
	buyer = { base: app.url, token: await tokenFor(db.url, 'buyer@kestrel-mobility.example') };
	inspector = { base: app.url, token: await tokenFor(db.url, 'inspector@kestrel-mobility.example') };
	inspectorCookie = await signInApi(app.url, 'inspector@kestrel-mobility.example');
	buyerCookie = await signInApi(app.url, 'buyer@kestrel-mobility.example');
});

afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

/** A lot with five NMC readings at 30 % SOC; returns it and its stored readings. */
async function lotWithReadings() {
	const lot = await createLot(buyer, { partNumber: PART, quantity: 100, declaredSoc: 0.3, documents: ['coc', 'un38_3_summary', 'sds'] });
	const saved = await call(inspector, `/api/v1/lots/${lot.id}/readings`, {
		body: { readings: modelReadings('NMC', 5, 0.3, { prefix: 'FX' }) }
	});
	expect(saved.status).toBe(201);
	const listed = await call(inspector, `/api/v1/lots/${lot.id}/readings`);
	return { lot, readings: listed.json.readings as Array<{ id: number; serial: string; ocv_v: number; temperature_c: number }> };
}

const correct = (lotId: string, fields: Record<string, string>, cookie: string) =>
	postForm(app.url, `/lots/${lotId}/inspect?/correct`, fields, cookie);

const storedReading = (id: number) =>
	withClient(db.url, async (c) => (await c.query('select ocv_v, temperature_c from readings where id = $1', [id])).rows[0]);

describe('correcting a reading on the inspection page', () => {
	it('stores the new value, records both values with the reason, and the evaluation follows', async () => {
		const { lot, readings } = await lotWithReadings();
		const target = readings[2];
		const res = await correct(
			lot.id,
			{ readingId: String(target.id), ocv_v: '2,000', temperature_c: '23.5', reason: 'meter read 2.000 V on re-check' },
			inspectorCookie
		);
		expect(res.status).toBe(200);
		expect(await storedReading(target.id)).toEqual({ ocv_v: 2, temperature_c: 23.5 });
		const audit = await withClient(
			db.url,
			async (c) =>
				(
					await c.query("select actor_email, details from audit_events where action = 'reading.corrected' and entity_id = $1", [
						String(target.id)
					])
				).rows
		);
		expect(audit).toHaveLength(1);
		expect(audit[0].actor_email).toBe('inspector@kestrel-mobility.example');
		expect(audit[0].details.reason).toBe('meter read 2.000 V on re-check');
		expect(audit[0].details.before.ocv_v).toBe(target.ocv_v);
		expect(audit[0].details.after.ocv_v).toBe(2);
		// 2.00 V is below the NMC minimum: the served evaluation now names the deep discharge.
		const evaluation = await call(inspector, `/api/v1/lots/${lot.id}/evaluation`);
		expect(evaluation.json.reasons.map((r: { code: string }) => r.code)).toContain('deep_discharge');
	});

	it('refuses a missing reason or an unreadable number with 400 and changes nothing', async () => {
		const { lot, readings } = await lotWithReadings();
		const target = readings[0];
		const before = await storedReading(target.id);
		for (const fields of [
			{ readingId: String(target.id), ocv_v: '3.61', temperature_c: '22', reason: '' },
			{ readingId: String(target.id), ocv_v: 'three', temperature_c: '22', reason: 'typo' },
			{ readingId: 'x', ocv_v: '3.61', temperature_c: '22', reason: 'typo' },
			{ readingId: String(target.id), ocv_v: '', temperature_c: '', reason: 'nothing to change' }
		]) {
			const res = await correct(lot.id, fields, inspectorCookie);
			expect(res.status, JSON.stringify(fields)).toBe(400);
		}
		expect(await storedReading(target.id)).toEqual(before);
	});

	it('answers 404 for a reading of another lot and 403 for a buyer, changing nothing', async () => {
		const first = await lotWithReadings();
		const second = await lotWithReadings();
		const foreign = second.readings[1];
		const before = await storedReading(foreign.id);
		const crossLot = await correct(
			first.lot.id,
			{ readingId: String(foreign.id), ocv_v: '3.1', temperature_c: '22', reason: 'wrong lot' },
			inspectorCookie
		);
		expect(crossLot.status).toBe(404);
		const asBuyer = await correct(
			second.lot.id,
			{ readingId: String(foreign.id), ocv_v: '3.1', temperature_c: '22', reason: 'not my job' },
			buyerCookie
		);
		expect(asBuyer.status).toBe(403);
		expect(await storedReading(foreign.id)).toEqual(before);
	});
});
