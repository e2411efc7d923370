/**
 * Readings, evaluation, meter imports and the sampling-plan API through the real app (`node build`)
 * on a fresh copy of the seeded database, with API tokens.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import XlsxPopulate from 'xlsx-populate';
import { startApp, type RunningApp } from '../helpers/app';
import { tokenFor } from '../helpers/auth';
import { freshDatabase, withClient } from '../helpers/db';
import { call, createLot, modelReadings, VC21_MODEL, type Caller } from './readings-fixtures';

const LI_DOCS = ['coc', 'un38_3_summary', 'sds'] as const; // the seeded lithium parts require all three
let app: RunningApp;
let db: Awaited<ReturnType<typeof freshDatabase>>;
let inspector: Caller;
let buyer: Caller;
let voltariaSupplier: Caller;
let ferrolithSupplier: Caller;

beforeAll(async () => {
	db = await freshDatabase('readings_api', { demo: false });
	app = await startApp({ databaseUrl: db.url });
	const as = async (email: string) => ({ base: app.url, token: await tokenFor(db.url, email) });
	[inspector, buyer, voltariaSupplier, ferrolithSupplier] = await Promise.all([
		as('inspector@kestrel-mobility.example'),
		as('buyer@kestrel-mobility.example'),
		as('supplier@voltaria-cells.example'),
		as('supplier@ferrolith.example')
	]);
});

afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

const readingCount = (lotId: string) =>
	withClient(db.url, async (c) => Number((await c.query('select count(*) from readings where lot_id = $1', [lotId])).rows[0].count));
const lotStatus = (lotId: string) =>
	withClient(db.url, async (c) => (await c.query('select status, received_at from lots where id = $1', [lotId])).rows[0]);

describe('POST/GET /api/v1/lots/{id}/readings', () => {
	it('records the arrival, stores readings, and lists them', async () => {
		const lot = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 100, declaredSoc: 0.3 });
		expect((await lotStatus(lot.id)).status).toBe('awaiting_arrival');
		const res = await call(inspector, `/api/v1/lots/${lot.id}/readings`, { body: { readings: modelReadings(VC21_MODEL, 3, 0.3) } });
		expect(res.status).toBe(201);
		expect(res.json).toMatchObject({ inserted: 3, lot_status: 'in_inspection' });
		const after = await lotStatus(lot.id);
		expect(after.status).toBe('in_inspection');
		expect(after.received_at).not.toBeNull();
		const list = await call(inspector, `/api/v1/lots/${lot.id}/readings`);
		expect(list.status).toBe(200);
		expect(list.json.readings.map((r: { serial: string }) => r.serial)).toEqual(['SN-00001', 'SN-00002', 'SN-00003']);
		expect(list.json.readings[0]).toMatchObject({ temperature_c: 25, source: 'api' });
	});

	it('moves the lot to "awaiting decision" when the sample is complete, and still takes readings', async () => {
		// Lot of 100 at AQL 1.0, level II: MIL-STD-105E Table I letter F; Table II-A's arrow at F / 1.0
		// points up to letter E: n 13, Ac 0, Re 1.
		const lot = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 100, declaredSoc: 0.3 });
		const plan = (await call(inspector, `/api/v1/lots/${lot.id}/evaluation`)).json.plan;
		expect(plan).toMatchObject({ code_letter: 'F', plan_code_letter: 'E', sample_size: 13 });
		const rows = modelReadings(VC21_MODEL, 14, 0.3);
		const first = await call(inspector, `/api/v1/lots/${lot.id}/readings`, { body: { readings: rows.slice(0, 12) } });
		expect(first.json.lot_status).toBe('in_inspection');
		const last = await call(inspector, `/api/v1/lots/${lot.id}/readings`, { body: { readings: rows.slice(12, 13) } });
		expect(last.json.lot_status).toBe('pending_decision');
		expect((await lotStatus(lot.id)).status).toBe('pending_decision');
		const extra = await call(inspector, `/api/v1/lots/${lot.id}/readings`, { body: { readings: rows.slice(13) } });
		expect(extra.status).toBe(201);
		expect(extra.json.lot_status).toBe('pending_decision');
	});

	it('is all or nothing: one bad row (NaN as a string, negative OCV) stores nothing', async () => {
		const lot = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 100, declaredSoc: 0.3 });
		const good = modelReadings(VC21_MODEL, 5, 0.3);
		const bad = [...good.slice(0, 4), { serial: 'SN-BAD', ocv_v: -3.6, temperature_c: 25 }];
		const res = await call(inspector, `/api/v1/lots/${lot.id}/readings`, { body: { readings: bad } });
		expect(res.status).toBe(422);
		expect(res.json.error.issues[0].path).toBe('readings.4.ocv_v');
		const wrongType = await call(inspector, `/api/v1/lots/${lot.id}/readings`, {
			body: { readings: [{ serial: 'X1', ocv_v: 'NaN', temperature_c: 25 }] }
		});
		expect(wrongType.status).toBe(422);
		expect(await readingCount(lot.id)).toBe(0);
		// The refused batch must not have moved the lot either.
		expect((await lotStatus(lot.id)).status).toBe('awaiting_arrival');
	});

	it('refuses 10,001 readings with 413 and takes exactly 10,000 quickly', async () => {
		const lot = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 20000, declaredSoc: 0.3 });
		const many = modelReadings(VC21_MODEL, 10_001, 0.3, { halfWidth: 0.02 });
		const refused = await call(inspector, `/api/v1/lots/${lot.id}/readings`, { body: { readings: many } });
		expect(refused.status).toBe(413);
		expect(await readingCount(lot.id)).toBe(0);
		const ok = await call(inspector, `/api/v1/lots/${lot.id}/readings`, { body: { readings: many.slice(0, 10_000) } });
		expect(ok.status).toBe(201);
		expect(ok.json.inserted).toBe(10_000);
		const ev = await call(inspector, `/api/v1/lots/${lot.id}/evaluation`);
		expect(ev.status).toBe(200);
		expect(ev.json.units).toHaveLength(10_000);
		// Server-Timing names the time spent in evaluateLotNow; its speed is measured by npm run bench.
		const again = await call(inspector, `/api/v1/lots/${lot.id}/evaluation?detail=summary`);
		expect(again.headers.get('server-timing') ?? '').toMatch(/evaluate;dur=[\d.]+/);
		expect(again.json.units).toBeUndefined();
	});

	it('is idempotent by client_key (a retried save is not stored twice)', async () => {
		const lot = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 100, declaredSoc: 0.3 });
		const rows = modelReadings(VC21_MODEL, 2, 0.3).map((r, i) => ({ ...r, client_key: `key-${lot.id}-${i}` }));
		const first = await call(inspector, `/api/v1/lots/${lot.id}/readings`, { body: { readings: rows } });
		const retry = await call(inspector, `/api/v1/lots/${lot.id}/readings`, { body: { readings: rows } });
		expect(first.json.inserted).toBe(2);
		expect(retry.status).toBe(201);
		expect(retry.json).toMatchObject({ inserted: 0, duplicates: 2 });
		expect(await readingCount(lot.id)).toBe(2);
		// Both answers name the stored id of each keyed row (the bench page corrects rows by id).
		const listed = await call(inspector, `/api/v1/lots/${lot.id}/readings`);
		const idOf = new Map((listed.json.readings as Array<{ id: number; client_key: string }>).map((r) => [r.client_key, r.id]));
		const expected = rows.map((r) => ({ client_key: r.client_key, id: idOf.get(r.client_key) }));
		expect(expected.every((e) => typeof e.id === 'number')).toBe(true);
		expect(first.json.stored).toEqual(expected);
		expect(retry.json.stored).toEqual(expected);
	});

	it('names no stored ids for rows sent without a client_key', async () => {
		const lot = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 100, declaredSoc: 0.3 });
		const saved = await call(inspector, `/api/v1/lots/${lot.id}/readings`, { body: { readings: modelReadings(VC21_MODEL, 2, 0.3) } });
		expect(saved.status).toBe(201);
		expect(saved.json).toMatchObject({ inserted: 2, stored: [] });
	});

	it('keeps suppliers out: 403 on write, 404 on another supplier’s lot, own lot readable', async () => {
		const lot = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 100, declaredSoc: 0.3 });
		const write = await call(voltariaSupplier, `/api/v1/lots/${lot.id}/readings`, {
			body: { readings: modelReadings(VC21_MODEL, 1, 0.3) }
		});
		expect(write.status).toBe(403);
		expect((await call(ferrolithSupplier, `/api/v1/lots/${lot.id}/readings`)).status).toBe(404);
		expect((await call(ferrolithSupplier, `/api/v1/lots/${lot.id}/evaluation`)).status).toBe(404);
		expect((await call(voltariaSupplier, `/api/v1/lots/${lot.id}/readings`)).status).toBe(200);
		expect((await call(inspector, `/api/v1/lots/00000000-0000-4000-8000-000000000000/readings`)).status).toBe(404);
		expect((await fetch(`${app.url}/api/v1/lots/${lot.id}/readings`)).status).toBe(401);
	});
});

describe('GET /api/v1/lots/{id}/evaluation from model-generated readings', () => {
	async function sampleLot(spec: Parameters<typeof createLot>[1]) {
		const lot = await createLot(buyer, spec);
		const pending = await call(inspector, `/api/v1/lots/${lot.id}/evaluation`);
		expect(pending.json.status).toBe('pending');
		return { lot, n: pending.json.plan.sample_size as number, plan: pending.json.plan };
	}

	it('NMC cells declared at 30 % read at 30 % → accept, with plan, stats and variables', async () => {
		// VC-21700-50G: AQL 1.0, level II; lot 500 → Table I letter H, II-A n 50, Ac 1 Re 2 (MIL-STD-105E).
		const { lot, n, plan } = await sampleLot({ partNumber: 'VC-21700-50G', quantity: 500, declaredSoc: 0.3, documents: [...LI_DOCS] });
		expect(plan).toEqual({ code_letter: 'H', plan_code_letter: 'H', sample_size: 50, accept: 1, reject: 2, hundred_percent: false });
		await call(inspector, `/api/v1/lots/${lot.id}/readings`, { body: { readings: modelReadings(VC21_MODEL, n, 0.3) } });
		const ev = (await call(inspector, `/api/v1/lots/${lot.id}/evaluation`)).json;
		expect(ev.status).toBe('accept');
		expect(ev.severity).toBe('normal');
		expect(ev.nonconforming).toBe(0);
		expect(ev.reasons.filter((r: { severity: string }) => r.severity !== 'info')).toEqual([]);
		expect(ev.units).toHaveLength(50);
		expect(ev.stats.count).toBe(50);
		// Readings were generated from the part's model at 29–31 % SOC, 25 °C: the median estimate is 30 % and every interval holds it.
		const socs = ev.units.map((u: { soc: number }) => u.soc).sort((a: number, b: number) => a - b);
		expect((socs[24] + socs[25]) / 2).toBeCloseTo(0.3, 3);
		expect(ev.units.every((u: { soc_low: number; soc_high: number }) => u.soc_low <= 0.31 && u.soc_high >= 0.29)).toBe(true);
		expect(ev.variables).toBeTypeOf('object');
		expect(ev.model).toMatchObject({ chemistry: 'NMC', version: VC21_MODEL.version }); // the part's approved tabulated model (seed)
		// The served body leaves out the readings snapshot (stored evaluations keep it: decisions.test.ts)
		// and keeps what the lot page's plots draw from; unit numbers are rounded to 1e-6 (1 µV, 0.0001 % SOC).
		expect(ev.inputs.readings).toBeUndefined();
		expect(ev.inputs.model).toMatchObject({ chemistry: 'NMC' });
		expect(ev.inputs.limits.ocv_min_v).toBeTypeOf('number');
		expect(ev.inputs.lot.declared_soc).toBe(0.3);
		const unitNumbers = ev.units.flatMap((u: Record<string, unknown>) => [
			u.soc,
			u.soc_sigma,
			u.soc_low,
			u.soc_high,
			u.ocv_at_25c_v,
			u.expected_ocv_v,
			u.residual_v
		]);
		expect(unitNumbers.every((x: unknown) => typeof x === 'number' && Math.abs(x * 1e6 - Math.round(x * 1e6)) < 1e-6)).toBe(true);
	});

	it('one deep-discharged unit → reject with deep_discharge naming that unit', async () => {
		const { lot, n } = await sampleLot({ partNumber: 'VC-21700-50G', quantity: 500, declaredSoc: 0.3, documents: [...LI_DOCS] });
		const rows = modelReadings(VC21_MODEL, n, 0.3);
		rows[7] = { serial: rows[7].serial, ocv_v: 2.1, temperature_c: 25 }; // below the NMC model's 2.5 V minimum
		await call(inspector, `/api/v1/lots/${lot.id}/readings`, { body: { readings: rows } });
		const ev = (await call(inspector, `/api/v1/lots/${lot.id}/evaluation`)).json;
		expect(ev.status).toBe('reject');
		expect(ev.safety).toBe(true);
		const deep = ev.reasons.find((r: { code: string }) => r.code === 'deep_discharge');
		expect(deep).toMatchObject({ severity: 'reject', units: [rows[7].serial] });
	});

	it('LFP on the generic curve: soc_indeterminate, never a confident verdict', async () => {
		// FL-PR-100: LFP, AQL 1.0, level II. With a declared SOC the declared-SOC check needs the SOC → hold.
		const declared = await sampleLot({ partNumber: 'FL-PR-100', quantity: 200, declaredSoc: 0.5, documents: [...LI_DOCS] });
		// MIL-STD-105E Table I: 151–280 at level II → G; Table II-A: G at AQL 1.0 points down to H, n 50.
		expect(declared.n).toBe(50);
		await call(inspector, `/api/v1/lots/${declared.lot.id}/readings`, {
			body: { readings: modelReadings('LFP', declared.n, 0.5, { halfWidth: 0.05 }) }
		});
		const held = (await call(inspector, `/api/v1/lots/${declared.lot.id}/evaluation`)).json;
		expect(held.status).toBe('hold');
		expect(held.reasons.map((r: { code: string }) => r.code)).toContain('soc_indeterminate');
		expect(held.reasons.map((r: { code: string }) => r.code)).not.toContain('declared_soc_mismatch');
		// The same part read on the steep low-SOC slope (declared and read at 8 %). On the generic LFP curve this
		// is not determinate either: near empty the published LFP cells (Prada 2013, Safari 2011; electrochem/calibration)
		// sit 8–18 SOC points (1σ) from the generic curve, so the interval is wide and the check says so instead of passing.
		const steep = await sampleLot({ partNumber: 'FL-PR-100', quantity: 200, declaredSoc: 0.08, documents: [...LI_DOCS] });
		await call(inspector, `/api/v1/lots/${steep.lot.id}/readings`, {
			body: { readings: modelReadings('LFP', steep.n, 0.08, { halfWidth: 0.005 }) }
		});
		const steepEv = (await call(inspector, `/api/v1/lots/${steep.lot.id}/evaluation`)).json;
		expect(steepEv.reasons.map((r: { code: string }) => r.code)).toContain('soc_indeterminate');
		expect(steepEv.reasons.map((r: { code: string }) => r.code)).not.toContain('declared_soc_mismatch');
		expect(steepEv.status).toBe('hold');
	});

	it('refuses readings on a decided lot with 409', async () => {
		const { lot, n } = await sampleLot({ partNumber: 'VC-21700-50G', quantity: 500, declaredSoc: 0.3, documents: [...LI_DOCS] });
		await call(inspector, `/api/v1/lots/${lot.id}/readings`, { body: { readings: modelReadings(VC21_MODEL, n, 0.3) } });
		const submitted = await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' });
		expect(submitted.status).toBeLessThan(300);
		const late = await call(inspector, `/api/v1/lots/${lot.id}/readings`, {
			body: { readings: modelReadings(VC21_MODEL, 1, 0.3, { prefix: 'LATE' }) }
		});
		expect(late.status).toBe(409);
		expect(await readingCount(lot.id)).toBe(n);
	});
});

describe('GET /api/v1/sampling/plan', () => {
	// Expected values: ISO 2859-1:1999 Table 1 and Tables 2-A/2-B/2-C (normal/tightened/reduced); 1, 2-A
	// and 2-B carry MIL-STD-105E's plans. Cells cross-checked against the inspection core's column-wise
	// copy (tests/unit/inspection/tables-1999.test.ts), otherwise from memory.
	const cases: Array<[string, Record<string, unknown>]> = [
		[
			'lot_size=500&aql=1&level=II',
			{ code_letter: 'H', plan_code_letter: 'H', sample_size: 50, accept: 1, reject: 2, hundred_percent: false }
		],
		['lot_size=500&aql=2.5', { code_letter: 'H', plan_code_letter: 'H', sample_size: 50, accept: 3, reject: 4, hundred_percent: false }],
		// II-A arrow down: H at AQL 0.65 → J, n 80, Ac 1 Re 2
		[
			'lot_size=400&aql=0.65&level=II',
			{ code_letter: 'H', plan_code_letter: 'J', sample_size: 80, accept: 1, reject: 2, hundred_percent: false }
		],
		// II-A arrow down from G at AQL 1.0 → H, n 50, Ac 1 Re 2
		['lot_size=200&aql=1.0&level=II&severity=normal', { code_letter: 'G', plan_code_letter: 'H', sample_size: 50, accept: 1, reject: 2 }],
		// Lot of 5: letter A; at AQL 1.0 the arrow leads to E (n 13, Ac 0 Re 1) which exceeds the lot → 100 %.
		['lot_size=5&aql=1&level=II', { code_letter: 'A', plan_code_letter: 'E', sample_size: 5, accept: 0, reject: 1, hundred_percent: true }],
		// II-B (tightened), arrow down over G and H → J, n 80, Ac 1 Re 2
		[
			'lot_size=200&aql=1.0&level=II&severity=tightened',
			{ code_letter: 'G', plan_code_letter: 'J', sample_size: 80, accept: 1, reject: 2 }
		],
		// 2-C of 1999 (Re = Ac + 1): K at AQL 1.0 → n 50, 2/3 (the older military II-C gave 1/4)
		['lot_size=2000&aql=1.0&level=II&severity=reduced', { code_letter: 'K', plan_code_letter: 'K', sample_size: 50, accept: 2, reject: 3 }],
		// 2-A edge cell: letter A at AQL 10 follows the arrow down to n 5, 1/2
		['lot_size=8&aql=10&level=II', { code_letter: 'A', plan_code_letter: 'C', sample_size: 5, accept: 1, reject: 2 }]
	];
	for (const [query, expected] of cases) {
		it(`?${query}`, async () => {
			const res = await call(inspector, `/api/v1/sampling/plan?${query}`);
			expect(res.status).toBe(200);
			expect(res.json).toMatchObject({ ...expected, edition: 'ISO 2859-1:1999' });
		});
	}

	it('names the refused parameter', async () => {
		const res = await call(inspector, '/api/v1/sampling/plan?lot_size=500&aql=0.3');
		expect(res.status).toBe(400);
		expect(res.json.error.issues).toEqual([expect.objectContaining({ path: 'aql' })]);
	});

	it('answers 400 on a bad query', async () => {
		for (const q of [
			'lot_size=abc&aql=1',
			'lot_size=500&aql=0.3',
			'lot_size=500&aql=1&level=IV',
			'lot_size=-4&aql=1',
			'aql=1',
			'lot_size=500&aql=1&severity=lenient'
		]) {
			const res = await call(inspector, `/api/v1/sampling/plan?${q}`);
			expect(res.status, q).toBe(400);
			expect(res.json.error.code).toBe('bad_request');
		}
	});
});

describe('POST /api/v1/lots/{id}/imports', () => {
	const csvOf = (rows: ReturnType<typeof modelReadings>, mv = false) =>
		`Serial;OCV (${mv ? 'mV' : 'V'});Temp (°C);ACIR (mΩ);Time\r\n` +
		rows
			.map(
				(r, i) =>
					`${r.serial};${(mv ? r.ocv_v * 1000 : r.ocv_v).toFixed(mv ? 1 : 4).replace('.', ',')};25,0;${(18 + (i % 5) * 0.1).toFixed(1).replace('.', ',')};2026-03-02 09:${String(i % 60).padStart(2, '0')}:00`
			)
			.join('\r\n');
	const upload = (lotId: string, name: string, bytes: Uint8Array | string, mapping?: unknown, preview = false) => {
		const form = new FormData();
		form.set('file', new Blob([bytes as BlobPart]), name);
		if (mapping) form.set('mapping', JSON.stringify(mapping));
		return call(inspector, `/api/v1/lots/${lotId}/imports${preview ? '?preview=true' : ''}`, { form });
	};

	it('previews a CSV (mV header, decimal commas) with row-level errors and writes nothing', async () => {
		const lot = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 100, declaredSoc: 0.3 });
		const csv = csvOf(modelReadings(VC21_MODEL, 4, 0.3), true) + '\r\nSN-X;abc;25;18;2026-03-02 10:00:00\r\n';
		const res = await upload(lot.id, 'meter.csv', csv, undefined, true);
		expect(res.status).toBe(200);
		expect(res.json.guessed_mapping).toMatchObject({
			serial: 0,
			ocv: 1,
			ocv_unit: 'mV',
			temperature: 2,
			ac_resistance: 3,
			time: 4,
			first_row: 1
		});
		expect(res.json.valid_rows).toBe(4);
		expect(res.json.errors).toEqual([{ row: 6, column: 'OCV', message: '“abc” is not a number' }]);
		expect(res.json.rows[0].ocv_v).toBeGreaterThan(3.5);
		expect(res.json.rows[0].ocv_v).toBeLessThan(3.7);
		expect(res.json.rows[0].measured_at).toBe('2026-03-02T09:00:00.000Z');
		expect(await readingCount(lot.id)).toBe(0);
	});

	it('imports a CSV once; the same file again stores nothing and says when it was imported', async () => {
		const lot = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 100, declaredSoc: 0.3 });
		const csv = csvOf(modelReadings(VC21_MODEL, 20, 0.3));
		const preview = await upload(lot.id, 'meter.csv', csv, undefined, true);
		const mapping = preview.json.guessed_mapping;
		const first = await upload(lot.id, 'meter.csv', csv, mapping);
		expect(first.status).toBe(201);
		// 20 units complete this lot's sample (n 13), so the lot now awaits its decision.
		expect(first.json).toMatchObject({ inserted: 20, lot_status: 'pending_decision', already_imported_at: null });
		const again = await upload(lot.id, 'meter-copy.csv', csv, mapping);
		expect(again.status).toBe(200);
		expect(again.json.inserted).toBe(0);
		expect(again.json.already_imported_at).toMatch(/^\d{4}-\d{2}-\d{2}T/);
		expect(await readingCount(lot.id)).toBe(20);
		const rows = await withClient(
			db.url,
			async (c) =>
				(await c.query('select source, import_id, ac_resistance_mohm from readings where lot_id = $1 order by id limit 1', [lot.id]))
					.rows[0]
		);
		expect(rows.source).toBe('import');
		expect(rows.import_id).not.toBeNull();
		expect(rows.ac_resistance_mohm).toBeCloseTo(18, 6);
	});

	it('refuses a file with a bad row unless skip_invalid, all or nothing', async () => {
		const lot = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 100, declaredSoc: 0.3 });
		const csv = csvOf(modelReadings(VC21_MODEL, 3, 0.3)) + '\r\nSN-BAD;;25;18;2026-03-02 10:00:00';
		const mapping = { serial: 0, ocv: 1, ocv_unit: 'V', temperature: 2, ac_resistance: 3, time: 4, first_row: 1 };
		const refused = await upload(lot.id, 'bad.csv', csv, mapping);
		expect(refused.status).toBe(422);
		expect(refused.json.error.issues[0]).toEqual({ path: 'row 5.OCV', message: 'OCV is empty' });
		expect(await readingCount(lot.id)).toBe(0);
		const skipped = await upload(lot.id, 'bad.csv', csv, { ...mapping, skip_invalid: true });
		expect(skipped.status).toBe(201);
		expect(skipped.json).toMatchObject({ inserted: 3, skipped_invalid: 1 });
	});

	it('refuses a CSV whose quoting is broken, naming the row, and stores nothing', async () => {
		const lot = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 100, declaredSoc: 0.3 });
		const csv =
			csvOf(modelReadings(VC21_MODEL, 3, 0.3)) +
			'\r\n"SN-OPEN;3,61;25,0;18,0;2026-03-02 10:00:00\r\nSN-NEXT;3,62;25,0;18,0;2026-03-02 10:01:00\r\n';
		const mapping = { serial: 0, ocv: 1, ocv_unit: 'V', temperature: 2, ac_resistance: 3, time: 4, first_row: 1, skip_invalid: true };
		const refused = await upload(lot.id, 'broken.csv', csv, mapping);
		expect(refused.status).toBe(422);
		expect(refused.json.error.message).toContain('row 5');
		expect(refused.json.error.issues).toEqual([{ path: 'row 5', message: 'Quoted field unterminated' }]);
		expect(await readingCount(lot.id)).toBe(0);
	});

	it('previews and imports an XLSX workbook (numbers as numbers, a header row)', async () => {
		const lot = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 100, declaredSoc: 0.3 });
		const rows = modelReadings(VC21_MODEL, 12, 0.3);
		const wb = await XlsxPopulate.fromBlankAsync();
		wb.sheet(0)!
			.range(1, 1, rows.length + 1, 3)
			.value([['Serial number', 'Voltage (V)', 'Temperature °C'], ...rows.map((r) => [r.serial, r.ocv_v, 24.5])]);
		const bytes = new Uint8Array(await wb.outputAsync());
		const preview = await upload(lot.id, 'meter.xlsx', bytes, undefined, true);
		expect(preview.status).toBe(200);
		expect(preview.json.format).toBe('xlsx');
		expect(preview.json.guessed_mapping).toMatchObject({ serial: 0, ocv: 1, ocv_unit: 'V', temperature: 2 });
		expect(preview.json.valid_rows).toBe(12);
		expect(preview.json.rows[3]).toMatchObject({ serial: rows[3].serial, ocv_v: rows[3].ocv_v, temperature_c: 24.5 });
		const done = await upload(lot.id, 'meter.xlsx', bytes, preview.json.guessed_mapping);
		expect(done.json.inserted).toBe(12);
		const again = await upload(lot.id, 'meter.xlsx', bytes, preview.json.guessed_mapping);
		expect(again.json.inserted).toBe(0);
		expect(await readingCount(lot.id)).toBe(12);
	});

	it('imports 10,000 rows (speed: npm run bench)', async () => {
		const lot = await createLot(buyer, { partNumber: 'VC-21700-50G', quantity: 20000, declaredSoc: 0.3 });
		const csv = csvOf(modelReadings(VC21_MODEL, 10_000, 0.3, { halfWidth: 0.02 }));
		const mapping = { serial: 0, ocv: 1, ocv_unit: 'V', temperature: 2, ac_resistance: 3, time: 4, first_row: 1 };
		const res = await upload(lot.id, 'big.csv', csv, mapping);
		expect(res.status).toBe(201);
		expect(res.json.inserted).toBe(10_000);
	});
});
