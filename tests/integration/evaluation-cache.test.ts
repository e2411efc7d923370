/**
 * The stored switching state and the revision-keyed evaluation cache never answer stale: every
 * input of a lot's evaluation (a reading, a document, a part limit, a decision, the supplier ×
 * part switching state) is changed in turn and the served evaluation follows at once; the stored
 * state equals the full replay of the history after a sequence of decisions.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApp, type RunningApp } from '../helpers/app';
import { tokenFor } from '../helpers/auth';
import { freshDatabase, withClient } from '../helpers/db';
import { measuredLot, PART } from './decisions-fixtures';
import { call, VC21_MODEL, type Caller } from './readings-fixtures';
import { closeDb, getDb } from '../../src/lib/server/db';
import { currentSeverity } from '../../src/lib/server/services/switching';

let app: RunningApp;
let db: Awaited<ReturnType<typeof freshDatabase>>;
let buyer: Caller, inspector: Caller;

beforeAll(async () => {
	db = await freshDatabase('evaluation_cache', { demo: false });
	app = await startApp({ databaseUrl: db.url });
	process.env.DATABASE_URL = db.url; // for the in-process replay (services/switching.ts)
	buyer = { base: app.url, token: await tokenFor(db.url, 'buyer@kestrel-mobility.example') };
	inspector = { base: app.url, token: await tokenFor(db.url, 'inspector@kestrel-mobility.example') };
});

afterAll(async () => {
	await closeDb();
	await app?.stop();
	await db?.drop();
});

/** GET the evaluation with the raw headers (ETag, Server-Timing). */
async function evaluation(lotId: string, headers: Record<string, string> = {}) {
	const res = await fetch(`${app.url}/api/v1/lots/${lotId}/evaluation`, {
		headers: { authorization: `Bearer ${inspector.token}`, ...headers }
	});
	const text = await res.text();
	return {
		status: res.status,
		etag: res.headers.get('etag'),
		timing: res.headers.get('server-timing') ?? '',
		json: text ? JSON.parse(text) : null
	};
}

const codes = (ev: { reasons: Array<{ code: string }> }) => ev.reasons.map((r) => r.code);
const sql = <T>(text: string, params: unknown[] = []) => withClient(db.url, async (c) => (await c.query(text, params)).rows as T[]);

describe('GET /api/v1/lots/{id}/evaluation cache', () => {
	it('serves the cached body with an ETag, answers 304 to If-None-Match, and recomputes after a reading changes', async () => {
		expect.hasAssertions();
		const lot = await measuredLot(buyer, inspector, 'accept');
		const first = await evaluation(lot.id);
		expect(first.status).toBe(200);
		expect(first.json.status).toBe('accept');
		const again = await evaluation(lot.id);
		expect(again.etag).toBe(first.etag);
		expect(again.timing).toContain('cached');
		expect(again.json).toEqual(first.json);
		const notModified = await evaluation(lot.id, { 'if-none-match': first.etag! });
		expect(notModified.status).toBe(304);
		expect(notModified.json).toBeNull();

		// A reading corrected to a deep-discharged value: the served evaluation must say so at once.
		const readings = await call(inspector, `/api/v1/lots/${lot.id}/readings`);
		const target = readings.json.readings[3];
		const patch = await call(inspector, `/api/v1/lots/${lot.id}/readings/${target.id}`, {
			method: 'PATCH',
			body: { ocv_v: 2.0, reason: 'cache test' }
		});
		expect(patch.status).toBe(200);
		const corrected = await evaluation(lot.id);
		expect(corrected.etag).not.toBe(first.etag);
		expect(corrected.json.status).toBe('reject');
		expect(codes(corrected.json)).toContain('deep_discharge');
		expect((await evaluation(lot.id, { 'if-none-match': first.etag! })).status).toBe(200);
	});

	it('follows a new document, a part limit changed by any writer, and the decision', async () => {
		expect.hasAssertions();
		const lot = await measuredLot(buyer, inspector, 'hold'); // the UN 38.3 summary and SDS are missing
		const held = await evaluation(lot.id);
		expect(codes(held.json)).toContain('documents_missing');

		for (const kind of ['un38_3_summary', 'sds']) {
			const form = new FormData();
			form.set('kind', kind);
			form.set(
				'file',
				new Blob([new TextEncoder().encode(`%PDF-1.4\n% ${kind} cache ${lot.id}\n%%EOF\n`)], { type: 'application/pdf' }),
				`${kind}.pdf`
			);
			expect((await call(buyer, `/api/v1/lots/${lot.id}/documents`, { form })).status).toBe(201);
		}
		const documented = await evaluation(lot.id);
		expect(codes(documented.json)).not.toContain('documents_missing');
		expect(documented.json.status).toBe('accept');

		// A part limit changed straight in the database (no service involved): the trigger still bumps the lot.
		const [{ spread_limit_mv: limit }] = await sql<{ spread_limit_mv: number }>(
			'select spread_limit_mv from parts where part_number = $1',
			[PART]
		);
		await sql('update parts set spread_limit_mv = 0.01 where part_number = $1', [PART]);
		const tight = await evaluation(lot.id);
		expect(codes(tight.json)).toContain('spread_over_limit');
		await sql('update parts set spread_limit_mv = $2 where part_number = $1', [PART, limit]);
		const restored = await evaluation(lot.id);
		expect(codes(restored.json)).not.toContain('spread_over_limit');

		const submitted = await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' });
		expect(submitted.status).toBe(201);
		const decided = await evaluation(lot.id);
		expect(decided.etag).not.toBe(restored.etag);
		expect(decided.json.inputs.lot.status).toBe('accepted');
	});

	it('serves UTF-8 JSON whose text keeps every non-ASCII character (Greek, degree sign), computed and cached', async () => {
		expect.hasAssertions();
		const lot = await measuredLot(buyer, inspector, 'accept');
		for (const round of ['computed', 'cached']) {
			const res = await fetch(`${app.url}/api/v1/lots/${lot.id}/evaluation`, { headers: { authorization: `Bearer ${inspector.token}` } });
			expect(res.headers.get('server-timing'), round).toContain(round);
			expect(res.headers.get('content-type')).toMatch(/^application\/json/);
			const served = JSON.parse(new TextDecoder('utf-8', { fatal: true }).decode(await res.arrayBuffer()));
			// The part's tabulated model (seed) writes its source note with σ and °.
			const source = VC21_MODEL.source;
			// eslint-disable-next-line no-control-regex -- any character outside ASCII
			expect(source).toMatch(/[^\x00-\x7f]/);
			expect(served.inputs.model.source).toBe(source);
		}
	});
});

describe('stored switching state', () => {
	it('moves an open lot to tightened after two rejections and equals the full replay after each decision', async () => {
		expect.hasAssertions();
		const open = await measuredLot(buyer, inspector, 'accept');
		const before = await evaluation(open.id);
		expect(before.json.severity).toBe('normal');
		const [{ supplier_id: supplierId, part_id: partId }] = await sql<{ supplier_id: string; part_id: string }>(
			'select supplier_id, part_id from lots where id = $1',
			[open.id]
		);

		const storedEqualsReplay = async () => {
			const [stored] = await sql<{ severity: string; switching_score: number; history: Record<string, unknown> }>(
				'select severity::text as severity, switching_score, history from sampling_states where supplier_id = $1 and part_id = $2',
				[supplierId, partId]
			);
			const { lots: _lots, severity, switching_score, ...history } = await currentSeverity(getDb(), supplierId, partId);
			expect(stored).toEqual({ severity, switching_score, history: JSON.parse(JSON.stringify(history)) });
			return severity;
		};

		// ISO 2859-1:1999 9.3.1: two of (at most) five consecutive lots not accepted on normal → tightened.
		const sequence: Array<'accept' | 'safety'> = ['accept', 'safety', 'accept', 'safety'];
		const severities: string[] = [];
		for (const scenario of sequence) {
			const lot = await measuredLot(buyer, inspector, scenario);
			expect((await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' })).status).toBe(201);
			severities.push(await storedEqualsReplay());
		}
		expect(severities).toEqual(['normal', 'normal', 'normal', 'tightened']);

		const after = await evaluation(open.id);
		expect(after.etag).not.toBe(before.etag);
		expect(after.json.severity).toBe('tightened');

		// A missing row (as after a part's AQL change) is rebuilt from the replay on the next read.
		await sql('delete from sampling_states where supplier_id = $1 and part_id = $2', [supplierId, partId]);
		expect((await evaluation(open.id)).json.severity).toBe('tightened');
		expect(await storedEqualsReplay()).toBe('tightened');
	});
});
