/**
 * E-signatures bound to the record (issue 18, item 10), against the built app: a quality override
 * needs a server-issued, single-use challenge tied to the signer, the lot, its revision and the
 * decision. Each finding is reproduced and now refused: a signed body replayed on another held lot,
 * a used challenge sent again, a challenge whose lot changed since, one for the other decision,
 * an expired one and another signer's one. A correct override stores a manifest whose SHA-256 is
 * recomputed here from a canonical JSON written out by hand (21 CFR Part 11, §11.50 and §11.70
 * style), and the PDF report shows it (read with poppler's pdftotext).
 */
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApp, type RunningApp } from '../helpers/app';
import { DEMO_PASSWORD, signInApi, tokenFor } from '../helpers/auth';
import { freshDatabase, withClient } from '../helpers/db';
import { measuredLot, pdfText } from './decisions-fixtures';
import { call, type Caller } from './readings-fixtures';

let app: RunningApp;
let db: Awaited<ReturnType<typeof freshDatabase>>;
let buyer: Caller, inspector: Caller, quality: Caller;
let qualityCookie: string, quality2Cookie: string;

beforeAll(async () => {
	db = await freshDatabase('signatures', { demo: false });
	app = await startApp({ databaseUrl: db.url });
	const as = async (email: string) => ({ base: app.url, token: await tokenFor(db.url, email) });
	[buyer, inspector, quality] = await Promise.all([
		as('buyer@kestrel-mobility.example'),
		as('inspector@kestrel-mobility.example'),
		as('quality@kestrel-mobility.example')
	]);
	qualityCookie = await signInApi(app.url, 'quality@kestrel-mobility.example');
	quality2Cookie = await signInApi(app.url, 'quality2@kestrel-mobility.example');
}, 60_000);

afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

type Answer = {
	status: number;
	json: { error?: { code: string; message: string; issues?: { path: string }[] } } & Record<string, unknown>;
};

async function post(path: string, body: unknown, cookie = qualityCookie): Promise<Answer> {
	const res = await fetch(`${app.url}/api/v1${path}`, {
		method: 'POST',
		headers: { cookie, origin: app.url, 'content-type': 'application/json' },
		body: JSON.stringify(body)
	});
	return { status: res.status, json: await res.json() };
}

const challenge = (lotId: string, decision: string, cookie = qualityCookie) =>
	post(`/lots/${lotId}/decision/challenge`, { decision }, cookie);
/** The disposition that fits each signed decision here: release, or return to the supplier (with a due date). */
const DISPOSITION_FOR: Record<string, Record<string, unknown>> = {
	accept: { disposition: 'release' },
	reject: { disposition: 'return_to_supplier', due_date: new Date(Date.now() + 14 * 86_400_000).toISOString().slice(0, 10) }
};
const sign = (lotId: string, body: Record<string, unknown>, cookie = qualityCookie) =>
	post(`/lots/${lotId}/decision`, { ...DISPOSITION_FOR[String(body.decision)], ...body }, cookie);

/** A lot of Voltaria's held by the engine (the UN 38.3 summary is missing). */
async function heldLot() {
	const lot = await measuredLot(buyer, inspector, 'hold');
	const res = await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' });
	expect(res.json.status).toBe('on_hold');
	return lot;
}

const lotState = (id: string) =>
	withClient(db.url, async (c) => ({
		status: (await c.query('select status from lots where id = $1', [id])).rows[0].status as string,
		overrides: (await c.query(`select count(*)::int as n from decisions where lot_id = $1 and kind = 'override'`, [id])).rows[0].n as number
	}));

const challengeRow = (id: string) =>
	withClient(db.url, async (c) => (await c.query('select * from signature_challenges where id = $1', [id])).rows[0]);

describe('signing challenges', () => {
	it('are issued to an interactive quality session for a held lot only, bound to its revision', async () => {
		const lot = await heldLot();
		const issued = await challenge(lot.id, 'accept');
		expect(issued.status).toBe(201);
		const revision = await withClient(
			db.url,
			async (c) => (await c.query('select revision from lots where id = $1', [lot.id])).rows[0].revision
		);
		expect(issued.json).toMatchObject({
			lot_id: lot.id,
			lot_code: lot.lot_code,
			revision,
			decision: 'accept',
			meaning: 'release of a held lot'
		});
		expect(Date.parse(String(issued.json.expires_at))).toBeGreaterThan(Date.now());
		const row = await challengeRow(String(issued.json.challenge_id));
		expect(row.used_at).toBeNull();
		expect(row.lot_revision).toBe(revision);

		const byToken = await call(quality, `/api/v1/lots/${lot.id}/decision/challenge`, { body: { decision: 'accept' } });
		expect(byToken.status).toBe(403);
		expect(byToken.json.error.code).toBe('session_required');
		const byBuyer = await call(buyer, `/api/v1/lots/${lot.id}/decision/challenge`, { body: { decision: 'accept' } });
		expect(byBuyer.status).toBe(403);
		const release = await challenge(lot.id, 'release');
		expect(release.status).toBe(422);
	});

	it('a signature without a challenge is refused, naming challenge_id, and decides nothing', async () => {
		const lot = await heldLot();
		const res = await sign(lot.id, { decision: 'accept', reason: 'Summary received and checked', password: DEMO_PASSWORD });
		expect(res.status).toBe(422);
		expect(res.json.error!.issues!.map((i) => i.path)).toContain('challenge_id');
		expect(await lotState(lot.id)).toEqual({ status: 'on_hold', overrides: 0 });
	});
});

describe('replays and stale challenges are refused', () => {
	it('a signed body replayed on another held lot is refused, before and after it was used', async () => {
		const [first, second] = [await heldLot(), await heldLot()];
		const issued = await challenge(first.id, 'accept');
		const body = {
			decision: 'accept',
			reason: 'UN 38.3 summary received by mail and checked',
			password: DEMO_PASSWORD,
			challenge_id: issued.json.challenge_id
		};
		const early = await sign(second.id, body);
		expect(early.status).toBe(422);
		expect(early.json.error!.code).toBe('challenge_wrong_lot');
		expect((await sign(first.id, body)).status).toBe(200);
		const late = await sign(second.id, body);
		expect(late.status).toBe(422);
		expect(late.json.error!.code).toBe('challenge_wrong_lot');
		expect(await lotState(second.id)).toEqual({ status: 'on_hold', overrides: 0 });
		expect(await lotState(first.id)).toEqual({ status: 'accepted', overrides: 1 });
	});

	it('a used challenge cannot sign again (a wrong password does not use it up)', async () => {
		const lot = await heldLot();
		const issued = await challenge(lot.id, 'reject');
		const body = { decision: 'reject', reason: 'Supplier cannot provide the summary', challenge_id: issued.json.challenge_id };
		const wrong = await sign(lot.id, { ...body, password: 'not-my-password' });
		expect(wrong.status).toBe(403);
		expect(wrong.json.error!.code).toBe('signature_invalid');
		expect((await challengeRow(String(issued.json.challenge_id))).used_at).toBeNull();
		expect((await sign(lot.id, { ...body, password: DEMO_PASSWORD })).status).toBe(200);
		expect((await challengeRow(String(issued.json.challenge_id))).used_at).not.toBeNull();
		const again = await sign(lot.id, { ...body, password: DEMO_PASSWORD });
		expect(again.status).toBe(409);
		expect(again.json.error!.code).toBe('challenge_used');
		expect(await lotState(lot.id)).toEqual({ status: 'rejected', overrides: 1 });
	});

	it('a challenge issued before the lot changed is refused; a fresh one signs', async () => {
		const lot = await heldLot();
		const issued = await challenge(lot.id, 'accept');
		// The missing summary arrives while the quality manager is reading the lot: its revision moves on.
		const form = new FormData();
		form.set('kind', 'un38_3_summary');
		form.set(
			'file',
			new Blob([new TextEncoder().encode(`%PDF-1.4\n% summary ${lot.id}\n%%EOF\n`)], { type: 'application/pdf' }),
			'un38_3.pdf'
		);
		expect((await call(buyer, `/api/v1/lots/${lot.id}/documents`, { form })).status).toBe(201);
		const body = { decision: 'accept', reason: 'Summary received and checked', password: DEMO_PASSWORD };
		const stale = await sign(lot.id, { ...body, challenge_id: issued.json.challenge_id });
		expect(stale.status).toBe(409);
		expect(stale.json.error!.code).toBe('lot_changed');
		expect(stale.json.error!.message).toMatch(/changed since/);
		expect(await lotState(lot.id)).toEqual({ status: 'on_hold', overrides: 0 });
		const fresh = await challenge(lot.id, 'accept');
		expect(fresh.json.revision).toBeGreaterThan(Number(issued.json.revision));
		expect((await sign(lot.id, { ...body, challenge_id: fresh.json.challenge_id })).status).toBe(200);
	});

	it('a challenge for the other decision, an expired one or another signer’s one is refused', async () => {
		const lot = await heldLot();
		const body = { decision: 'accept', reason: 'Summary received and checked', password: DEMO_PASSWORD };
		const forReject = await challenge(lot.id, 'reject');
		const other = await sign(lot.id, { ...body, challenge_id: forReject.json.challenge_id });
		expect(other.status).toBe(422);
		expect(other.json.error!.code).toBe('challenge_wrong_decision');

		const expired = await challenge(lot.id, 'accept');
		await withClient(db.url, (c) =>
			c.query(
				`update signature_challenges set issued_at = now() - interval '2 hours', expires_at = now() - interval '1 hour' where id = $1`,
				[expired.json.challenge_id]
			)
		);
		const late = await sign(lot.id, { ...body, challenge_id: expired.json.challenge_id });
		expect(late.status).toBe(409);
		expect(late.json.error!.code).toBe('challenge_expired');

		const colleagues = await challenge(lot.id, 'accept', quality2Cookie);
		expect(colleagues.status).toBe(201);
		const borrowed = await sign(lot.id, { ...body, challenge_id: colleagues.json.challenge_id });
		expect(borrowed.status).toBe(422);
		expect(borrowed.json.error!.code).toBe('challenge_unknown');
		expect(await lotState(lot.id)).toEqual({ status: 'on_hold', overrides: 0 });
	});
});

describe('the stored manifest', () => {
	it('records signer, meaning, time and challenge, and its hash matches a recomputation; the PDF shows it', async () => {
		const lot = await heldLot();
		const issued = await challenge(lot.id, 'accept');
		const reason = 'UN 38.3 summary “received by mail”\nand checked against the cell type';
		const before = Date.now();
		const res = await sign(lot.id, { decision: 'accept', reason, password: DEMO_PASSWORD, challenge_id: issued.json.challenge_id });
		expect(res.status).toBe(200);
		const { decision, lotRow, evaluationId, audit } = await withClient(db.url, async (c) => ({
			decision: (await c.query(`select * from decisions where lot_id = $1 and kind = 'override'`, [lot.id])).rows[0],
			lotRow: (await c.query('select lot_code, revision from lots where id = $1', [lot.id])).rows[0],
			evaluationId: Number((await c.query('select max(id) as id from evaluations where lot_id = $1', [lot.id])).rows[0].id),
			audit: (await c.query(`select details from audit_events where lot_id = $1 and action = 'lot.override_signed'`, [lot.id])).rows[0]
		}));
		const m = decision.signature;
		expect(m).toMatchObject({
			signer_email: 'quality@kestrel-mobility.example',
			signer_id: decision.decided_by,
			meaning: 'release of a held lot',
			method: 'password re-entered',
			challenge_id: issued.json.challenge_id,
			hash_algorithm: 'SHA-256'
		});
		expect(m.signer_name).toBeTruthy();
		expect(Date.parse(m.signed_at)).toBeGreaterThanOrEqual(before - 1000);
		expect(m.signed).toEqual({
			lot_id: lot.id,
			lot_code: lotRow.lot_code,
			revision: issued.json.revision,
			decision: 'accept',
			disposition: 'release',
			due_date: null,
			reason,
			evaluation_id: evaluationId
		});
		// The decision itself moved the lot on by one revision after the signed one.
		expect(lotRow.revision).toBe(Number(issued.json.revision) + 1);
		// Canonical JSON by hand: keys in code-unit order, no white space (RFC 8785 style).
		const J = JSON.stringify;
		const canonical = `{"decision":${J('accept')},"disposition":${J('release')},"due_date":null,"evaluation_id":${J(evaluationId)},"lot_code":${J(lotRow.lot_code)},"lot_id":${J(lot.id)},"reason":${J(reason)},"revision":${J(issued.json.revision)}}`;
		expect(m.content_sha256).toBe(createHash('sha256').update(canonical, 'utf8').digest('hex'));
		expect(audit.details.signature.content_sha256).toBe(m.content_sha256);

		const pdf = await fetch(`${app.url}/api/v1/lots/${lot.id}/report.pdf`, { headers: { authorization: `Bearer ${buyer.token}` } });
		expect(pdf.status).toBe(200);
		const text = pdfText(Buffer.from(await pdf.arrayBuffer()));
		expect(text).toContain('Electronic signature of the quality decision');
		expect(text).toContain(m.signer_name);
		expect(text).toContain('quality@kestrel-mobility.example');
		expect(text).toContain('release of a held lot');
		expect(text).toContain(`${m.signed_at.slice(0, 16).replace('T', ' ')} UTC`);
		expect(text).toContain(`${m.content_sha256.slice(0, 16)}…`);
	});
});
