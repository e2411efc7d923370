/**
 * The electrochemistry API through the real app (`node build`) on a fresh copy of the seeded
 * database, with API tokens: response shapes, 401/403, validation errors, textbook values through
 * the API, a 10,000-reading evaluate call, fitting, and saving + approving model versions.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { getLibraryModel } from '../../src/lib/electrochem';
import { startApp, type RunningApp } from '../helpers/app';
import { DEMO_PASSWORD, tokenFor } from '../helpers/auth';
import { freshDatabase, withClient } from '../helpers/db';

let app: RunningApp;
let db: Awaited<ReturnType<typeof freshDatabase>>;
const EMAILS = {
	buyer: 'buyer@kestrel-mobility.example',
	inspector: 'inspector@kestrel-mobility.example',
	quality: 'quality@kestrel-mobility.example',
	quality2: 'quality2@kestrel-mobility.example',
	supplier: 'supplier@voltaria-cells.example'
} as const;
type Who = keyof typeof EMAILS;
const tokens = {} as Record<Who, string>;

beforeAll(async () => {
	db = await freshDatabase('electrochem_api');
	app = await startApp({ databaseUrl: db.url });
	for (const who of Object.keys(EMAILS) as Who[]) tokens[who] = await tokenFor(db.url, EMAILS[who]);
});

afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

interface Reply {
	status: number;
	// eslint-disable-next-line @typescript-eslint/no-explicit-any
	body: any;
	ms: number;
	bytes: number;
}

async function call(who: Who | null, path: string, init: { method?: string; body?: unknown; raw?: string } = {}): Promise<Reply> {
	const headers: Record<string, string> = who ? { authorization: `Bearer ${tokens[who]}` } : {};
	const payload = init.raw ?? (init.body === undefined ? undefined : JSON.stringify(init.body));
	if (payload !== undefined) headers['content-type'] = 'application/json';
	const started = performance.now();
	const res = await fetch(`${app.url}${path}`, { method: init.method ?? (payload ? 'POST' : 'GET'), headers, body: payload });
	const text = await res.text();
	const ms = performance.now() - started;
	let body: unknown = text;
	try {
		body = JSON.parse(text);
	} catch {
		/* not JSON: keep the text for the failure message */
	}
	return { status: res.status, body, ms, bytes: text.length };
}

const post = (who: Who | null, path: string, body: unknown) => call(who, path, { body });

function expectError(reply: Reply, status: number, path?: string) {
	expect(reply.status, JSON.stringify(reply.body)).toBe(status);
	expect(typeof reply.body.error.code).toBe('string');
	expect(reply.body.error.message.length).toBeGreaterThan(5);
	if (path !== undefined) expect(reply.body.error.issues.map((i: { path: string }) => i.path)).toContain(path);
}

const DANIELL = { e0_v: 1.1, n: 2, temperature_c: 25, q: 0.01 / 1.0 };

describe('credentials', () => {
	it('answers 401 in the error shape without a token or session', async () => {
		const calls: Array<[string, string, unknown?]> = [
			['POST', '/api/v1/electrochem/cell-potential', DANIELL],
			['GET', '/api/v1/chemistries'],
			['GET', '/api/v1/chemistries/NMC/curve'],
			['POST', '/api/v1/ocv/evaluate', { chemistry: 'NMC', readings: [{ ocv_v: 3.7, temperature_c: 25 }] }],
			['POST', '/api/v1/ocv/fit', { chemistry: 'NMC', temperature_c: 25, points: [] }],
			['GET', '/api/v1/models'],
			['POST', '/api/v1/models', {}],
			['POST', '/api/v1/models/00000000-0000-4000-8000-000000000000/approve', {}]
		];
		for (const [method, path, body] of calls) {
			const reply = await call(null, path, { method, body });
			expectError(reply, 401);
			expect(reply.body.error.code).toBe('unauthenticated');
		}
	});

	it('refuses a made-up token', async () => {
		const res = await fetch(`${app.url}/api/v1/chemistries`, { headers: { authorization: 'Bearer rv_not-a-real-token' } });
		expect(res.status).toBe(401);
	});
});

describe('POST /api/v1/electrochem/cell-potential', () => {
	it('gives the Daniell cell values', async () => {
		const reply = await post('inspector', '/api/v1/electrochem/cell-potential', DANIELL);
		expect(reply.status).toBe(200);
		expect(Object.keys(reply.body).sort()).toEqual(['delta_g0_kj_per_mol', 'delta_g_kj_per_mol', 'e_v', 'k', 'log10_k']);
		// OpenStax Chemistry 2e §17.4 (Nernst equation): Zn/Cu cell, [Zn²⁺] = 0.010 M, [Cu²⁺] = 1.0 M,
		// E° = 1.10 V, n = 2 → E = 1.10 − (0.0592/2)·log10(0.010) ≈ 1.159 V
		expect(reply.body.e_v).toBeCloseTo(1.159, 3);
		// OpenStax Chemistry 2e §17.4: ΔG° = −nFE° = −2 · 96 485 C/mol · 1.10 V ≈ −212 kJ/mol
		expect(reply.body.delta_g0_kj_per_mol).toBeCloseTo(-212.3, 1);
		// ΔG = −nFE with the E above (same relation, same section)
		expect(reply.body.delta_g_kj_per_mol).toBeCloseTo(-2 * 96.48533212 * reply.body.e_v, 6);
		// OpenStax Chemistry 2e §17.4: log10 K = nE°/0.0592 V = 2 · 1.10 / 0.0592 ≈ 37.2 at 25 °C
		expect(reply.body.log10_k).toBeCloseTo(37.2, 1);
		expect(Math.log10(reply.body.k)).toBeCloseTo(reply.body.log10_k, 6);
	});

	it('gives K for Cu + 2Ag⁺ → Cu²⁺ + 2Ag with E° = 0.46 V', async () => {
		// OpenStax Chemistry 2e §17.4 (equilibrium constant from E°): n = 2, E° = 0.46 V → K ≈ 3.5 × 10¹⁵ (order 10¹⁵)
		const reply = await post('buyer', '/api/v1/electrochem/cell-potential', { e0_v: 0.46, n: 2, temperature_c: 25, q: 1 });
		expect(reply.status).toBe(200);
		expect(reply.body.log10_k).toBeCloseTo(15.55, 1);
		expect(reply.body.e_v).toBeCloseTo(0.46, 12); // Q = 1 → E = E°
	});

	const bad: Array<[string, unknown, string]> = [
		['NaN as a string', { ...DANIELL, e0_v: 'NaN' }, 'e0_v'],
		['a number as a string', { ...DANIELL, q: '0.01' }, 'q'],
		['negative Q', { ...DANIELL, q: -0.01 }, 'q'],
		['zero Q', { ...DANIELL, q: 0 }, 'q'],
		['fractional n', { ...DANIELL, n: 1.5 }, 'n'],
		['negative n', { ...DANIELL, n: -2 }, 'n'],
		['absent temperature', { e0_v: 1.1, n: 2, q: 0.01 }, 'temperature_c'],
		['below absolute zero', { ...DANIELL, temperature_c: -300 }, 'temperature_c'],
		['null e0', { ...DANIELL, e0_v: null }, 'e0_v']
	];
	for (const [what, body, path] of bad) {
		it(`answers 422 for ${what}`, async () => {
			expectError(await post('buyer', '/api/v1/electrochem/cell-potential', body), 422, path);
		});
	}

	it('answers 400 for a body that is not JSON (a bare NaN is not JSON)', async () => {
		expectError(await call('buyer', '/api/v1/electrochem/cell-potential', { raw: '{"e0_v": NaN, "n": 2}' }), 400);
		expectError(await call('buyer', '/api/v1/electrochem/cell-potential', { raw: 'e0=1.1' }), 400);
	});

	it('refuses a supplier (403): the tools are for the receiving company', async () => {
		expectError(await post('supplier', '/api/v1/electrochem/cell-potential', DANIELL), 403);
	});
});

describe('GET /api/v1/chemistries and curves', () => {
	it('lists the thirteen chemistries (with sodium-ion) with per-cell limits', async () => {
		const reply = await call('buyer', '/api/v1/chemistries');
		expect(reply.status).toBe(200);
		const codes = reply.body.map((c: { code: string }) => c.code);
		expect(codes.sort()).toEqual([
			'ALKALINE',
			'LCO',
			'LFP',
			'LIMNO2',
			'LISOCL2',
			'LMO',
			'LTO',
			'NCA',
			'NICD',
			'NIMH',
			'NMC',
			'PBACID',
			'SIB'
		]);
		for (const c of reply.body) {
			expect(Object.keys(c).sort()).toEqual([
				'code',
				'default_required_documents',
				'max_v',
				'min_safe_v',
				'name',
				'nominal_v',
				'ocv_empty_v',
				'ocv_full_v',
				'rechargeable'
			]);
			expect(c.ocv_empty_v).toBeLessThan(c.ocv_full_v);
			expect(c.min_safe_v).toBeLessThan(c.max_v);
		}
		const byCode = Object.fromEntries(reply.body.map((c: { code: string }) => [c.code, c]));
		// The UN 38.3 test summary is a default document for every lithium chemistry, lithium metal included
		// (UN Model Regulations 2.9.4), and for sodium-ion (2.9.5, from memory); every part asks for its CoC.
		for (const code of ['NMC', 'LFP', 'LIMNO2', 'LISOCL2', 'SIB'])
			expect(byCode[code].default_required_documents).toEqual(['coc', 'un38_3_summary']);
		expect(byCode.PBACID.default_required_documents).toEqual(['coc']);
		// Primary cells are not rechargeable; Li-ion charge limits 4.20 V (+ tolerance) and LFP 3.65 V: common practice
		expect(byCode.ALKALINE.rechargeable).toBe(false);
		expect(byCode.LISOCL2.rechargeable).toBe(false);
		expect(byCode.NMC.rechargeable).toBe(true);
		expect(byCode.NMC.max_v).toBeGreaterThanOrEqual(4.2);
		expect(byCode.LFP.max_v).toBeCloseTo(3.65, 2);
	});

	it('gives a monotonic NMC curve per cell, moved by temperature', async () => {
		const at25 = await call('inspector', '/api/v1/chemistries/NMC/curve?temperature_c=25&points=101');
		expect(at25.status).toBe(200);
		const points = at25.body.points as Array<{ soc: number; ocv_v: number }>;
		expect(points).toHaveLength(101);
		expect(points[0].soc).toBe(0);
		expect(points[100].soc).toBe(1);
		for (let i = 1; i < points.length; i++) expect(points[i].ocv_v).toBeGreaterThan(points[i - 1].ocv_v);
		// a single Li-ion cell lies between about 3.0 V empty and 4.2 V full at rest (common practice)
		expect(points[0].ocv_v).toBeGreaterThan(2.9);
		expect(points[100].ocv_v).toBeLessThan(4.25);
		const at0 = await call('inspector', '/api/v1/chemistries/NMC/curve?temperature_c=0&points=101');
		expect(at0.body.points[20].ocv_v).not.toBeCloseTo(points[20].ocv_v, 4);
		const lower = await call('inspector', '/api/v1/chemistries/nmc/curve');
		expect(lower.body.points).toHaveLength(101); // defaults: 25 °C, 101 points; code case-insensitive
		expect(lower.body.points[37].ocv_v).toBeCloseTo(points[37].ocv_v, 12);
	});

	it('answers 404 for an unknown chemistry and 400 for bad query values', async () => {
		expectError(await call('buyer', '/api/v1/chemistries/UNOBTAINIUM/curve'), 404);
		expectError(await call('buyer', '/api/v1/chemistries/NMC/curve?points=1'), 400, 'points');
		expectError(await call('buyer', '/api/v1/chemistries/NMC/curve?points=1002'), 400, 'points');
		expectError(await call('buyer', '/api/v1/chemistries/NMC/curve?points=10.5'), 400, 'points');
		expectError(await call('buyer', '/api/v1/chemistries/NMC/curve?temperature_c=warm'), 400, 'temperature_c');
		expectError(await call('buyer', '/api/v1/chemistries/NMC/curve?temperature_c=-300'), 400, 'temperature_c');
	});
});

async function curveAt(code: string, temperature = 25) {
	const reply = await call('buyer', `/api/v1/chemistries/${code}/curve?temperature_c=${temperature}&points=101`);
	return reply.body.points as Array<{ soc: number; ocv_v: number }>;
}

describe('POST /api/v1/ocv/evaluate', () => {
	const RESULT_KEYS = [
		'determinate',
		'expected_ocv_v',
		'flags',
		'ocv_at_25c_v',
		'ocv_cell_v',
		'residual_v',
		'soc',
		'soc_high',
		'soc_low',
		'soc_sigma',
		'uncertainty'
	];

	it('places readings on the curve, with pack division, flags and the expected OCV', async () => {
		const nmc = await curveAt('NMC');
		const lfp = await curveAt('LFP');
		const reply = await post('inspector', '/api/v1/ocv/evaluate', {
			chemistry: 'NMC',
			cells_in_series: 4,
			declared_soc: 0.3,
			meter_accuracy_v: 0.002,
			readings: [
				{ ocv_v: 4 * nmc[50].ocv_v, temperature_c: 25 },
				{ ocv_v: 4 * 2.1, temperature_c: 25 },
				{ ocv_v: 4 * 4.3, temperature_c: 25 },
				{ ocv_v: 4 * nmc[30].ocv_v, temperature_c: 50 }
			]
		});
		expect(reply.status, JSON.stringify(reply.body)).toBe(200);
		const [mid, deep, over, hot] = reply.body.results;
		expect(Object.keys(mid).sort()).toEqual(RESULT_KEYS);
		expect(mid.ocv_cell_v).toBeCloseTo(nmc[50].ocv_v, 6);
		expect(mid.soc).toBeCloseTo(0.5, 3);
		// determinate only when the 95 % interval is narrower than the chemistry's 30 SOC points (issue 14)
		expect(mid.determinate).toBe(mid.soc_high - mid.soc_low <= 0.3);
		expect(mid.uncertainty.model_v).toBeGreaterThan(0);
		expect(mid.soc_low).toBeLessThan(0.5);
		expect(mid.soc_high).toBeGreaterThan(0.5);
		// expected OCV at the declared 30 % and 25 °C is the model curve's value there
		expect(mid.expected_ocv_v).toBeCloseTo(nmc[30].ocv_v, 5);
		expect(mid.residual_v).toBeCloseTo(nmc[50].ocv_v - nmc[30].ocv_v, 5);
		// the generic NMC curve is calibrated against published cells: no flag but, where the interval is wide, soc_indeterminate
		expect(mid.flags).toEqual(mid.determinate ? [] : ['soc_indeterminate']);
		// 2.1 V per cell rests below the Li-ion 2.5 V floor: must not be recharged (common practice)
		expect(deep.flags).toContain('deep_discharge');
		expect(over.flags).toContain('over_voltage');
		expect(hot.flags).toContain('temperature_out_of_range');

		const flat = await post('inspector', '/api/v1/ocv/evaluate', {
			chemistry: 'LFP',
			readings: [{ ocv_v: lfp[50].ocv_v, temperature_c: 25 }]
		});
		// LFP's plateau: OCV cannot place SOC mid-range, so the result is indeterminate (Restvolt physics rule)
		expect(flat.body.results[0].determinate).toBe(false);
		expect(flat.body.results[0].flags).toContain('soc_indeterminate');
		expect(flat.body.results[0].expected_ocv_v).toBeNull();
	});

	it('evaluates 10,000 readings in one call', async () => {
		const readings = Array.from({ length: 10_000 }, (_, i) => ({ ocv_v: 3.3 + (i % 900) / 1000, temperature_c: 15 + (i % 20) }));
		const body = { chemistry: 'NMC', declared_soc: 0.3, readings };
		const last: Reply | null = await post('inspector', '/api/v1/ocv/evaluate', body);
		expect(last!.status).toBe(200);
		expect(last!.body.results).toHaveLength(10_000);
		const socs = last!.body.results.map((r: { soc: number }) => r.soc);
		expect(Math.min(...socs)).toBeGreaterThanOrEqual(0);
		expect(Math.max(...socs)).toBeLessThanOrEqual(1);
		// same reading, same answer, wherever it sits in the array
		expect(last!.body.results[9_000]).toEqual(last!.body.results[0]);
		// Its speed is measured by npm run bench (ratio against the computation alone), not asserted here.
	});

	it('answers 413 for more than 10,000 readings, naming the limit', async () => {
		const readings = Array.from({ length: 10_001 }, () => ({ ocv_v: 3.7, temperature_c: 25 }));
		const reply = await post('inspector', '/api/v1/ocv/evaluate', { chemistry: 'NMC', readings });
		expectError(reply, 413, 'readings');
		expect(reply.body.error.message).toContain('10000');
	});

	const ok = { ocv_v: 3.7, temperature_c: 25 };
	const LFP_MODEL = JSON.parse(JSON.stringify(getLibraryModel('LFP')));
	const bad: Array<[string, unknown, string]> = [
		['an unknown chemistry', { chemistry: 'XYZ', readings: [ok] }, 'chemistry'],
		['absent readings', { chemistry: 'NMC' }, 'readings'],
		['an empty readings array', { chemistry: 'NMC', readings: [] }, 'readings'],
		['a string voltage', { chemistry: 'NMC', readings: [ok, { ocv_v: '3.7', temperature_c: 25 }] }, 'readings.1.ocv_v'],
		['a negative voltage', { chemistry: 'NMC', readings: [ok, ok, { ocv_v: -3.7, temperature_c: 25 }] }, 'readings.2.ocv_v'],
		['an absent temperature', { chemistry: 'NMC', readings: [{ ocv_v: 3.7 }] }, 'readings.0.temperature_c'],
		['a reading that is not an object', { chemistry: 'NMC', readings: [3.7] }, 'readings.0'],
		['zero cells in series', { chemistry: 'NMC', cells_in_series: 0, readings: [ok] }, 'cells_in_series'],
		['a declared SOC above 1', { chemistry: 'NMC', declared_soc: 30, readings: [ok] }, 'declared_soc'],
		['a negative meter accuracy', { chemistry: 'NMC', meter_accuracy_v: -0.002, readings: [ok] }, 'meter_accuracy_v'],
		// a model sent back with a bad uncertainty field is refused naming that field
		['a model whose plateau leaves 0–1', { model: { ...LFP_MODEL, plateau: [0.2, 1.5] }, readings: [ok] }, 'model.plateau'],
		[
			'a model with its hysteresis in mV',
			{ model: { ...LFP_MODEL, hysteresis_half_v: [[0, 15]] }, readings: [ok] },
			'model.hysteresis_half_v'
		],
		[
			'a model with its SOC sigma in percent',
			{ model: { ...LFP_MODEL, sigma_model_soc_curve: [[0, 8]] }, readings: [ok] },
			'model.sigma_model_soc_curve'
		],
		[
			'a model with a determinate width of 30',
			{ model: { ...LFP_MODEL, determinate_width: 30 }, readings: [ok] },
			'model.determinate_width'
		]
	];
	for (const [what, body, path] of bad) {
		it(`answers 422 for ${what}`, async () => {
			expectError(await post('inspector', '/api/v1/ocv/evaluate', body), 422, path);
		});
	}

	it('answers 400 for a body that is not JSON', async () => {
		expectError(await call('inspector', '/api/v1/ocv/evaluate', { raw: '{"chemistry":"NMC","readings":[' }), 400);
	});
});

/** A smooth, increasing reference curve: the library NMC curve at 25 °C, every 5 %. */
async function nmcReference() {
	return (await curveAt('NMC')).filter((_, i) => i % 5 === 0);
}

/** Non-monotonic: a 150 mV dip in the middle that no increasing curve can follow. */
async function wavyReference() {
	return (await nmcReference()).map((p) => ({ soc: p.soc, ocv_v: p.ocv_v - 0.15 * Math.sin(Math.PI * 2 * p.soc) }));
}

describe('POST /api/v1/ocv/fit', () => {
	it('recovers a smooth reference curve', async () => {
		const points = await nmcReference();
		const reply = await post('buyer', '/api/v1/ocv/fit', { chemistry: 'NMC', temperature_c: 25, points });
		expect(reply.status, JSON.stringify(reply.body)).toBe(200);
		expect(reply.body.monotonic).toBe(true);
		expect(['nernst', 'tabulated']).toContain(reply.body.form);
		expect(reply.body.rmse_v).toBeLessThan(0.001); // the library curve is itself a combined-model curve
		expect(reply.body.max_error_v).toBeGreaterThanOrEqual(reply.body.rmse_v);
		expect(reply.body.sigma_model_v).toBeGreaterThanOrEqual(0.001); // never below the meter's resolution
		expect(reply.body.curve).toHaveLength(101);
		expect(reply.body.curve[50].soc).toBe(0.5);
		// the model object can be sent back to evaluate
		const back = await post('buyer', '/api/v1/ocv/evaluate', {
			model: reply.body.model,
			readings: [{ ocv_v: points[10].ocv_v, temperature_c: 25 }]
		});
		expect(back.status, JSON.stringify(back.body)).toBe(200);
		expect(back.body.results[0].soc).toBeCloseTo(points[10].soc, 2);
	});

	it('rejects non-increasing points with 422 naming them, and pools them when smooth: true', async () => {
		const points = await wavyReference();
		const reply = await post('buyer', '/api/v1/ocv/fit', { chemistry: 'NMC', temperature_c: 25, points });
		expectError(reply, 422);
		expect(reply.body.error.code).toBe('non_monotonic');
		expect(reply.body.error.issues.length).toBeGreaterThan(0);
		expect(reply.body.error.issues[0].path).toMatch(/^points\.\d+$/);
		const smoothed = await post('buyer', '/api/v1/ocv/fit', {
			chemistry: 'NMC',
			temperature_c: 25,
			points,
			smooth: true,
			form: 'tabulated'
		});
		if (smoothed.status === 200) expect(smoothed.body.smoothed).toBe(true);
		else expectError(smoothed, 422); // too few points may remain after pooling
	});

	it('answers 422 for too few points or SOC outside 0–1', async () => {
		const few = (await nmcReference()).slice(0, 4);
		expectError(await post('buyer', '/api/v1/ocv/fit', { chemistry: 'NMC', temperature_c: 25, points: few }), 422, 'points');
		const pct = (await nmcReference()).map((p) => ({ soc: p.soc * 100, ocv_v: p.ocv_v }));
		expectError(await post('buyer', '/api/v1/ocv/fit', { chemistry: 'NMC', temperature_c: 25, points: pct }), 422);
	});
});

describe('model versions', () => {
	it('lists the seeded library versions as approved', async () => {
		const reply = await call('inspector', '/api/v1/models');
		expect(reply.status).toBe(200);
		const library = reply.body.filter((v: { origin: string }) => v.origin === 'library');
		expect(library).toHaveLength(13);
		expect(library.every((v: { status: string }) => v.status === 'approved')).toBe(true);
	});

	it('lets quality save a fitted version and approve it; buyers and inspectors may not', async () => {
		const body = { chemistry: 'NMC', temperature_c: 23, points: await nmcReference(), label: 'datasheet rev B' };
		expectError(await post('buyer', '/api/v1/models', body), 403);
		expectError(await post('inspector', '/api/v1/models', body), 403);

		const saved = await post('quality', '/api/v1/models', body);
		expect(saved.status, JSON.stringify(saved.body)).toBe(201);
		expect(saved.body).toMatchObject({
			chemistry: 'NMC',
			origin: 'fitted',
			status: 'awaiting_approval',
			fit_temperature_c: 23,
			created_by: EMAILS.quality
		});
		expect(saved.body.version).toMatch(/^fit-\d+$/);
		expect(saved.body.fit_rmse_v).toBeLessThan(0.002);

		const awaiting = await call('buyer', '/api/v1/models?status=awaiting_approval&chemistry=NMC');
		expect(awaiting.body.map((v: { id: string }) => v.id)).toEqual([saved.body.id]);

		const one = await call('buyer', `/api/v1/models/${saved.body.id}`);
		expect(one.body.model.chemistry).toBe('NMC');
		expect(['combined', 'tabulated']).toContain(one.body.model.form);
		expect(one.body.model.fit.temperature_c).toBe(23);

		const path = `/api/v1/models/${saved.body.id}/approve`;
		const sign = { password: DEMO_PASSWORD, reason: 'points checked against our readings' };
		expectError(await post('buyer', path, sign), 403);
		expectError(await post('inspector', path, sign), 403);
		expectError(await post('quality', path, sign), 403); // the author may not approve own fit
		expectError(await post('quality2', path, { ...sign, password: 'wrong-password' }), 403);
		const approved = await post('quality2', path, sign);
		expect(approved.status, JSON.stringify(approved.body)).toBe(200);
		expect(approved.body).toMatchObject({ id: saved.body.id, status: 'approved', approved_by: EMAILS.quality2 });
		expectError(await post('quality2', path, sign), 409);

		const byId = await post('buyer', '/api/v1/ocv/evaluate', { model_id: saved.body.id, readings: [{ ocv_v: 3.7, temperature_c: 25 }] });
		expect(byId.status, JSON.stringify(byId.body)).toBe(200);
		expect(byId.body.model.version).toBe(saved.body.version);

		const again = await post('quality', '/api/v1/models', body);
		expect(again.body.version).not.toBe(saved.body.version); // a new version number each time

		const audit = await withClient(db.url, (c) =>
			c.query(`select action from audit_events where entity_id = $1 order by id`, [saved.body.id])
		);
		expect(audit.rows.map((r) => r.action)).toEqual(['model.fitted', 'model.approved']);
	});

	it('refuses to store a rejected fit and answers 404 for an unknown version', async () => {
		const rejected = await post('quality', '/api/v1/models', { chemistry: 'NMC', temperature_c: 25, points: await wavyReference() });
		expectError(rejected, 422);
		expect(rejected.body.monotonic).toBe(false);
		const count = await withClient(db.url, (c) =>
			c.query(`select count(*)::int as n from ocv_models where origin = 'fitted' and fit_rmse_v > 0.01`)
		);
		expect(count.rows[0].n).toBe(0);
		const sign = { password: DEMO_PASSWORD, reason: 'points checked against our readings' };
		expectError(await post('quality', '/api/v1/models/00000000-0000-4000-8000-000000000000/approve', sign), 404);
		expectError(await call('quality', '/api/v1/models/00000000-0000-4000-8000-000000000000'), 404);
		expectError(await call('quality', '/api/v1/models?status=maybe'), 400, 'status');
	});
});
