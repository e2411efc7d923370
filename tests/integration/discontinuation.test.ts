/**
 * ISO 2859-1:1999 9.4 (clause number from memory; the rule also stands in MIL-STD-105E 4.7.3):
 * when the cumulative number of lots not accepted on tightened inspection reaches five,
 * inspection is discontinued. Restvolt alerts buyers and quality managers by mail (through the
 * outbox, in the decision's transaction), holds new lots of that supplier × part, and lets a
 * quality manager resume inspection, which restarts on tightened inspection.
 */
import { afterAll, beforeAll, expect, it } from 'vitest';
import { startApp, type RunningApp } from '../helpers/app';
import { postForm, signInApi, tokenFor } from '../helpers/auth';
import { freshDatabase, withClient } from '../helpers/db';
import { waitForMail } from '../helpers/mail';
import { measuredLot, PART } from './decisions-fixtures';
import { call, type Caller } from './readings-fixtures';

let app: RunningApp;
let db: Awaited<ReturnType<typeof freshDatabase>>;
let buyer: Caller, inspector: Caller;

beforeAll(async () => {
	db = await freshDatabase('discontinuation', { demo: false });
	app = await startApp({ databaseUrl: db.url });
	buyer = { base: app.url, token: await tokenFor(db.url, 'buyer@kestrel-mobility.example') };
	inspector = { base: app.url, token: await tokenFor(db.url, 'inspector@kestrel-mobility.example') };
}, 60_000);

afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

const q = <T>(sql: string, values: unknown[] = []) => withClient(db.url, async (c) => (await c.query(sql, values)).rows as T[]);

it('discontinues after five lots not accepted on tightened, alerts staff, holds new lots, and resumes on tightened', async () => {
	const [part] = await q<{ id: string }>(`select id from parts where part_number = $1`, [PART]);
	const severity = async () =>
		(await q<{ s: string }>(`select severity::text as s from sampling_states where part_id = $1`, [part.id]))[0]?.s;

	// Two held lots on normal (9.3.1) switch to tightened; five more held lots on tightened (9.4) discontinue.
	for (let i = 0; i < 7; i++) {
		const lot = await measuredLot(buyer, inspector, 'hold');
		const res = await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' });
		expect(res.json.status).toBe('on_hold');
		expect(await severity()).toBe(i < 1 ? 'normal' : i < 6 ? 'tightened' : 'discontinued');
	}

	// One discontinuation alert, to every active buyer and quality manager, never to the supplier
	// (each held lot also alerted quality that it waits for review: seven of those).
	const alerts = await q<{ kind: string; recipients: string[]; organisation: string }>(
		`select n.kind, n.recipients, o.kind::text as organisation from notices n join organisations o on o.id = n.organisation_id
		 where n.kind = 'alert' and n.subject like 'Inspection discontinued:%'`
	);
	const reviewAlerts = await q<{ recipients: string[] }>(
		`select recipients from notices where kind = 'alert' and subject like 'Lot % on hold for your review%'`
	);
	expect(reviewAlerts).toHaveLength(7);
	expect(reviewAlerts.every((a) => !a.recipients.includes('buyer@kestrel-mobility.example'))).toBe(true);
	expect(alerts).toHaveLength(1);
	expect(alerts[0].organisation).toBe('own');
	expect([...alerts[0].recipients].sort()).toEqual([
		'buyer@kestrel-mobility.example',
		'quality2@kestrel-mobility.example',
		'quality@kestrel-mobility.example'
	]);
	const [mail] = await waitForMail((m) => m.subject.startsWith('Inspection discontinued: Voltaria Cells Co. VC-21700-50G'));
	expect(mail.envelope.to).toContain('quality@kestrel-mobility.example');
	expect(mail.text).toMatch(/Five lots were not accepted while inspection was tightened/);

	// A new lot of this part is held with the discontinuation reason.
	const next = await measuredLot(buyer, inspector, 'accept');
	const held = await call(inspector, `/api/v1/lots/${next.id}/evaluation?detail=summary`);
	expect(held.json.reasons.map((r: { code: string }) => r.code)).toContain('inspection_discontinued');

	// Only quality may resume; the reason is required; then inspection restarts on tightened.
	const buyerCookie = await signInApi(app.url, 'buyer@kestrel-mobility.example');
	expect((await postForm(app.url, `/parts/${part.id}?/resume`, { reason: 'Corrective action 8D-2291 accepted' }, buyerCookie)).status).toBe(
		403
	);
	const qualityCookie = await signInApi(app.url, 'quality@kestrel-mobility.example');
	expect((await postForm(app.url, `/parts/${part.id}?/resume`, { reason: 'short' }, qualityCookie)).status).toBe(400);
	expect(await severity()).toBe('discontinued');
	const resumed = await postForm(
		app.url,
		`/parts/${part.id}?/resume`,
		{ reason: 'Corrective action 8D-2291 accepted after an audit' },
		qualityCookie
	);
	expect(resumed.status).toBe(200);
	expect(await severity()).toBe('tightened');
	expect(await q(`select 1 from audit_events where action = 'inspection.resumed' and entity_id = $1`, [part.id])).toHaveLength(1);
	const after = await call(inspector, `/api/v1/lots/${next.id}/evaluation?detail=summary`);
	expect(after.json.severity).toBe('tightened');
	expect(after.json.reasons.map((r: { code: string }) => r.code)).not.toContain('inspection_discontinued');
	// Resuming twice is refused: there is nothing left to resume.
	expect(
		(await postForm(app.url, `/parts/${part.id}?/resume`, { reason: 'Corrective action 8D-2291 accepted again' }, qualityCookie)).status
	).toBe(409);
});
