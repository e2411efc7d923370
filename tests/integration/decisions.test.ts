/**
 * Dispositions end to end through the real server (`node build`) on a fresh copy of the seeded
 * database: submit → evaluation; an engine hold or reject goes to quality's review without any
 * supplier mail; quality's e-signed material disposition is what the supplier hears; each notice is read back from the SMTP peer and parsed with mailparser, and its PDF
 * report is read with poppler (pdfinfo / pdftotext). Also: supplier isolation and XLSX exports.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import XlsxPopulate from 'xlsx-populate';
import { startApp, type RunningApp } from '../helpers/app';
import { DEMO_PASSWORD, postForm, signInApi, tokenFor } from '../helpers/auth';
import { freshDatabase, withClient } from '../helpers/db';
import { DISPOSITION, type MaterialDisposition } from '../../src/lib/schemas/disposition';
import { readMail } from '../helpers/mail';
import { PART, measuredLot, mailsForNotice, parsedMail, pdfText, VOLTARIA_CONTACTS, waitUntil } from './decisions-fixtures';
import { call, type Caller } from './readings-fixtures';

let app: RunningApp;
let db: Awaited<ReturnType<typeof freshDatabase>>;
let buyer: Caller, inspector: Caller, quality: Caller, voltaria: Caller, ferrolith: Caller;
let qualityCookie: string;

beforeAll(async () => {
	db = await freshDatabase('decisions', { demo: false });
	app = await startApp({ databaseUrl: db.url });
	const as = async (email: string) => ({ base: app.url, token: await tokenFor(db.url, email) });
	[buyer, inspector, quality, voltaria, ferrolith] = await Promise.all([
		as('buyer@kestrel-mobility.example'),
		as('inspector@kestrel-mobility.example'),
		as('quality@kestrel-mobility.example'),
		as('supplier@voltaria-cells.example'),
		as('supplier@ferrolith.example')
	]);
	qualityCookie = await signInApi(app.url, 'quality@kestrel-mobility.example');
}, 60_000);

afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

/** Ask for a signing challenge for `decision` on the lot (POST …/decision/challenge, session cookie). */
function challengeFor(lotId: string, decision: string, cookie = qualityCookie) {
	return fetch(`${app.url}/api/v1/lots/${lotId}/decision/challenge`, {
		method: 'POST',
		headers: { cookie, origin: app.url, 'content-type': 'application/json' },
		body: JSON.stringify({ decision })
	}).then(async (r) => ({ status: r.status, json: await r.json() }));
}

/**
 * POST the e-signed decision as a signed-in quality manager (interactive session cookie), with a
 * fresh signing challenge for that lot and decision unless the body brings its own.
 */
async function decide(lotId: string, body: Record<string, string>, cookie = qualityCookie) {
	const decision = body.decision ?? DISPOSITION[body.disposition as MaterialDisposition]?.decision ?? 'reject';
	const challenge = body.challenge_id ? null : await challengeFor(lotId, decision, cookie);
	const challengeId = body.challenge_id ?? (challenge?.status === 201 ? challenge.json.challenge_id : undefined);
	return fetch(`${app.url}/api/v1/lots/${lotId}/decision`, {
		method: 'POST',
		headers: { cookie, origin: app.url, 'content-type': 'application/json' },
		body: JSON.stringify({ ...body, challenge_id: challengeId })
	}).then(async (r) => ({ status: r.status, json: await r.json() }));
}

const lotRow = (id: string) =>
	withClient(db.url, async (c) => (await c.query('select status, decided_at, severity from lots where id = $1', [id])).rows[0]);
/** The lot's supplier notices (staff alerts about the lot, kind 'alert', are left out). */
const noticesOf = (id: string) =>
	withClient(
		db.url,
		async (c) => (await c.query(`select * from notices where lot_id = $1 and kind <> 'alert' order by created_at`, [id])).rows
	);
const staffAlertsOf = (id: string) =>
	withClient(
		db.url,
		async (c) => (await c.query(`select * from notices where lot_id = $1 and kind = 'alert' order by created_at`, [id])).rows
	);
/**
 * Every message the SMTP peer received for the lot that went to one of the supplier's addresses.
 * The peer is shared with other test files (their databases have the same lot codes), so only
 * messages of this database's outbox count: each carries its notice id in the Message-ID.
 */
async function supplierMailsFor(lotCode: string) {
	const ours = await withClient(db.url, async (c) =>
		(await c.query('select id from notices')).rows.map((r) => `<notice-${r.id}@restvolt.local>`)
	);
	return (await readMail()).filter(
		(m) =>
			!!m.messageId &&
			ours.includes(m.messageId) &&
			m.subject.includes(lotCode) &&
			m.envelope.to.some((to) => VOLTARIA_CONTACTS.includes(to))
	);
}
const inTwoWeeks = () => new Date(Date.now() + 14 * 86_400_000).toISOString().slice(0, 10);

/**
 * After an engine hold or reject: quality's alert is mailed (the outbox has worked through the
 * transaction's jobs) and the supplier has no notice row and no mail.
 */
async function expectReviewWithoutSupplierMail(lotId: string, lotCode: string) {
	const [alert] = await staffAlertsOf(lotId);
	expect(alert, 'quality is alerted').toBeDefined();
	expect(alert.recipients).toContain('quality@kestrel-mobility.example');
	const [mail] = await waitUntil(async () => {
		const found = await mailsForNotice(alert.id);
		return found.length ? found : null;
	});
	expect(mail.subject).toMatch(new RegExp(`Lot ${lotCode} on hold for your review`));
	expect(await noticesOf(lotId)).toHaveLength(0);
	expect(await supplierMailsFor(lotCode)).toHaveLength(0);
}

/** Wait for the notice's mail, parse it, and check what every notice must carry. */
async function readNotice(noticeId: string, lotCode: string, disposition: RegExp) {
	const [mail] = await waitUntil(
		async () => {
			const found = await mailsForNotice(noticeId);
			return found.length ? found : null;
		},
		20_000,
		`notice ${noticeId}`
	);
	expect(mail.envelope.to.sort()).toEqual([...VOLTARIA_CONTACTS].sort());
	expect(mail.subject).toContain(lotCode);
	expect(mail.subject).toMatch(disposition);
	const parsed = await parsedMail(mail);
	expect(parsed.text).toContain(`Lot: ${lotCode}`);
	expect(typeof parsed.html === 'string' && parsed.html.includes(lotCode)).toBe(true);
	const pdf = parsed.attachments.find((a) => a.contentType === 'application/pdf');
	expect(pdf, 'the PDF report is attached').toBeDefined();
	const text = pdfText(pdf!.content);
	expect(text).toContain(lotCode);
	return { mail, parsed, pdfText: text };
}

describe('submit → automatic disposition with a notice', () => {
	it('refuses an incomplete sample with 422 and stores nothing', async () => {
		const lot = await measuredLot(buyer, inspector, 'accept');
		// Remove one unit's reading so the sample is one short.
		await withClient(db.url, (c) => c.query(`delete from readings where lot_id = $1 and serial = 'P-00001'`, [lot.id]));
		const before = (await lotRow(lot.id)).status;
		const res = await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' });
		expect(res.status).toBe(422);
		expect(res.json.error.code).toBe('sample_incomplete');
		expect(res.json.error.message).toMatch(/sample/i);
		expect((await lotRow(lot.id)).status).toBe(before);
		const count = await withClient(
			db.url,
			async (c) => (await c.query('select count(*)::int as n from evaluations where lot_id = $1', [lot.id])).rows[0].n
		);
		expect(count).toBe(0);
		expect(await noticesOf(lot.id)).toHaveLength(0);
	});

	it('accepts a conforming lot and mails the accept notice with the PDF', async () => {
		const lot = await measuredLot(buyer, inspector, 'accept');
		const res = await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' });
		expect(res.status).toBe(201);
		expect(res.json.status).toBe('accepted');
		expect(res.json.evaluation.status).toBe('accept');
		expect(res.json.evaluation.plan.sample_size).toBe(lot.sampleSize);
		const row = await lotRow(lot.id);
		expect(row.status).toBe('accepted');
		expect(row.decided_at).not.toBeNull();
		const stored = await withClient(db.url, async (c) => (await c.query('select * from evaluations where lot_id = $1', [lot.id])).rows);
		expect(stored).toHaveLength(1);
		expect(stored[0].model_version).toBeTruthy();
		expect(stored[0].inputs.readings.serial).toHaveLength(lot.sampleSize);
		const { parsed, pdfText: text } = await readNotice(res.json.noticeId, lot.lot_code, /ACCEPTED/);
		expect(parsed.text).toContain('Disposition: ACCEPTED');
		expect(parsed.text).toContain('No action is needed');
		expect(text).toMatch(/ACCEPT/);
		// A second submit is a conflict: the lot is already decided.
		const again = await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' });
		expect(again.status).toBe(409);
		const [notice] = await noticesOf(lot.id);
		expect(notice.status).toBe('sent');
		expect(notice.message_id).toBe(`<notice-${notice.id}@restvolt.local>`);
	});

	it('holds an engine accept for quality when the part is released only by quality (auto_release_accept off)', async () => {
		const setAuto = (on: boolean) =>
			withClient(db.url, (c) => c.query('update parts set auto_release_accept = $1 where part_number = $2', [on, PART]));
		await setAuto(false);
		try {
			const lot = await measuredLot(buyer, inspector, 'accept');
			const res = await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' });
			expect(res.json.evaluation.status).toBe('accept');
			expect(res.json.status).toBe('on_hold');
			expect(res.json.noticeId).toBeNull();
			await expectReviewWithoutSupplierMail(lot.id, lot.lot_code);
			const ok = await decide(lot.id, { disposition: 'release', reason: 'Checked the readings; release', password: DEMO_PASSWORD });
			expect(ok.status).toBe(200);
			expect(ok.json.status).toBe('accepted');
			const { parsed } = await readNotice(ok.json.noticeId, lot.lot_code, /ACCEPTED/);
			expect(parsed.text).toContain('No action is needed');
			expect(await supplierMailsFor(lot.lot_code)).toHaveLength(1);
		} finally {
			await setAuto(true);
		}
	});

	it('an automatic reject (deep discharge) e-mails nobody at the supplier until quality confirms it; then exactly once', async () => {
		const lot = await measuredLot(buyer, inspector, 'safety');
		const res = await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' });
		expect(res.status).toBe(201);
		expect(res.json.evaluation.status).toBe('reject');
		expect(res.json.evaluation.safety).toBe(true);
		// Quarantined at once (the tag prints now), but only proposed: no notice.
		expect(res.json.status).toBe('on_hold');
		expect(res.json.noticeId).toBeNull();
		const tag = await fetch(`${app.url}/api/v1/lots/${lot.id}/quarantine-tag.pdf`, { headers: { authorization: `Bearer ${buyer.token}` } });
		expect(tag.status).toBe(200);
		await expectReviewWithoutSupplierMail(lot.id, lot.lot_code);

		// A safety finding allows neither release nor use as is, nor sort/rework: only return or scrap.
		for (const disposition of ['release', 'use_as_is']) {
			const refused = await decide(lot.id, { disposition, reason: 'Trying to use it', password: DEMO_PASSWORD, due_date: inTwoWeeks() });
			expect(refused.status, disposition).toBeGreaterThanOrEqual(400);
		}
		const released = await decide(lot.id, { disposition: 'release', reason: 'Trying to release', password: DEMO_PASSWORD });
		expect(released.status).toBe(409);
		expect(released.json.error.message).toMatch(/must not be recharged/);
		expect(await supplierMailsFor(lot.lot_code)).toHaveLength(0);

		const reason = 'Deep-discharged cell in the sample; the lot goes back for the supplier to dispose of';
		const due = inTwoWeeks();
		const ok = await decide(lot.id, { disposition: 'return_to_supplier', due_date: due, reason, password: DEMO_PASSWORD });
		expect(ok.status).toBe(200);
		expect(ok.json.status).toBe('rejected');
		const { mail, parsed, pdfText: text } = await readNotice(ok.json.noticeId, lot.lot_code, /REJECTED \(return to supplier\)/);
		expect(parsed.text).toContain('for safety reasons');
		expect(parsed.text).toMatch(/must not be recharged/);
		expect(parsed.text).toMatch(/dangerous-goods regulations/);
		// Which unit, its value and why; the rule and its source; what is asked, by when.
		expect(parsed.text).toMatch(/SN-\d+: 2\.000 V, rested below its minimum safe voltage \(deep discharge\)/);
		expect(parsed.text).toMatch(/Rule applied: .*ISO 2859-1:1999, Table I and Table II-A/);
		expect(parsed.text).toContain(`Reply due by: ${due}`);
		expect(parsed.text).toContain(
			`Arrange the return shipment with our buyer (collection date and the dangerous-goods shipping papers) by ${due}.`
		);
		expect(parsed.text).not.toMatch(/No action/);
		expect(text).toMatch(/REJECT/);
		// The attached report states the disposition and what is asked, by when.
		expect(text.replace(/\s+/g, ' ')).toContain(
			`Disposition: Return to supplier. Asked of the supplier by ${due}: Arrange the return shipment`
		);
		// Exactly one message reached the supplier for this lot: the confirmed disposition.
		const reached = await supplierMailsFor(lot.lot_code);
		expect(reached.map((m) => m.messageId)).toEqual([mail.messageId]);
		expect(await noticesOf(lot.id)).toHaveLength(1);
		const stored = await withClient(
			db.url,
			async (c) =>
				(
					await c.query(`select disposition, supplier_due_date::text as due from decisions where kind = 'override' and lot_id = $1`, [
						lot.id
					])
				).rows
		);
		expect(stored).toEqual([{ disposition: 'return_to_supplier', due }]);
	});
});

describe('quality review of held lots (e-signed overrides)', () => {
	it('hold → release: no notice for the hold, signature recorded, one notice for the release', async () => {
		const lot = await measuredLot(buyer, inspector, 'hold');
		const res = await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' });
		expect(res.json.status).toBe('on_hold');
		expect(res.json.noticeId).toBeNull();
		expect(res.json.evaluation.reasons.map((r: { code: string }) => r.code)).toContain('documents_missing');
		await expectReviewWithoutSupplierMail(lot.id, lot.lot_code);

		// Tokens cannot sign; a wrong password signs nothing; a missing reason is refused.
		const byToken = await call(quality, `/api/v1/lots/${lot.id}/decision`, {
			body: { disposition: 'release', reason: 'Released', password: DEMO_PASSWORD }
		});
		expect(byToken.status).toBe(403);
		expect(byToken.json.error.code).toBe('session_required');
		const wrong = await decide(lot.id, { disposition: 'release', reason: 'Summary received by mail', password: 'not-my-password' });
		expect(wrong.status).toBe(403);
		expect(wrong.json.error.code).toBe('signature_invalid');
		const noReason = await decide(lot.id, { disposition: 'release', reason: '', password: DEMO_PASSWORD });
		expect(noReason.status).toBe(422);
		// Nothing is chosen for the signer: no disposition, no decision.
		const noChoice = await decide(lot.id, { decision: 'accept', reason: 'Summary received by mail', password: DEMO_PASSWORD });
		expect(noChoice.status).toBe(422);
		expect(noChoice.json.error.issues.map((i: { path: string }) => i.path)).toContain('disposition');
		// A disposition that rejects does not fit an 'accept' signature; a release asks for no due date.
		const misfit = await decide(lot.id, {
			decision: 'accept',
			disposition: 'scrap',
			due_date: inTwoWeeks(),
			reason: 'Scrap it',
			password: DEMO_PASSWORD
		});
		expect(misfit.status).toBe(422);
		expect(misfit.json.error.issues.map((i: { path: string }) => i.path)).toContain('disposition');
		const noDue = await decide(lot.id, { disposition: 'use_as_is', reason: 'Deviation for this lot', password: DEMO_PASSWORD });
		expect(noDue.status).toBe(422);
		expect(noDue.json.error.issues.map((i: { path: string }) => i.path)).toContain('due_date');
		expect((await lotRow(lot.id)).status).toBe('on_hold');

		const reason = 'UN 38.3 summary received by mail and checked against the cell type';
		const ok = await decide(lot.id, { disposition: 'release', reason, password: DEMO_PASSWORD });
		expect(ok.status).toBe(200);
		expect(ok.json.status).toBe('accepted');
		expect((await lotRow(lot.id)).status).toBe('accepted');
		const signed = await withClient(db.url, async (c) => ({
			decision: (await c.query(`select * from decisions where lot_id = $1 and kind = 'override'`, [lot.id])).rows[0],
			audit: (await c.query(`select * from audit_events where lot_id = $1 and action = 'lot.override_signed'`, [lot.id])).rows[0]
		}));
		expect(signed.decision.reason).toBe(reason);
		expect(signed.decision.signature).toMatchObject({ signer_email: 'quality@kestrel-mobility.example', decision: 'accept', reason });
		expect(signed.audit.actor_email).toBe('quality@kestrel-mobility.example');
		expect(signed.audit.details.signature.meaning).toMatch(/release/);
		const release = await readNotice(ok.json.noticeId, lot.lot_code, /ACCEPTED/);
		expect(release.mail.subject).toMatch(/^Quality decision/);
		expect(release.parsed.text).toContain(reason);

		// Decision history for the lot page's panel.
		const history = await call(buyer, `/api/v1/lots/${lot.id}/decisions`);
		expect(history.status).toBe(200);
		expect(history.json.decisions.map((d: { kind: string }) => d.kind)).toEqual(['override', 'automatic']);
		expect(history.json.notices.filter((n: { kind: string }) => n.kind !== 'alert')).toHaveLength(1);
		expect(await supplierMailsFor(lot.lot_code)).toHaveLength(1);
	});

	it('hold → reject: the reject notice carries the reason and the cautions', async () => {
		const lot = await measuredLot(buyer, inspector, 'hold');
		const res = await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' });
		expect(res.json.status).toBe('on_hold');
		const reason = 'Supplier cannot provide a UN 38.3 summary for this cell type';
		const due = inTwoWeeks();
		const ok = await decide(lot.id, { disposition: 'sort_rework', due_date: due, reason, password: DEMO_PASSWORD });
		expect(ok.status).toBe(200);
		expect(ok.json.status).toBe('rejected');
		const { parsed, pdfText: text } = await readNotice(ok.json.noticeId, lot.lot_code, /REJECTED \(sort or rework/);
		expect(parsed.text).toContain(reason);
		expect(parsed.text).toMatch(/corrective-action report/);
		expect(parsed.text).toContain(`the cost is yours by ${due}.`);
		expect(parsed.text).toContain('UN 38.3 test summary');
		expect(text).toMatch(/REJECT/);
		// The quarantine tag exists for the rejected lot and names it.
		const tag = await fetch(`${app.url}/api/v1/lots/${lot.id}/quarantine-tag.pdf`, { headers: { authorization: `Bearer ${buyer.token}` } });
		expect(tag.status).toBe(200);
		const tagText = pdfText(Buffer.from(await tag.arrayBuffer()));
		expect(tagText).toContain(lot.lot_code);
		expect(tagText).toMatch(/REJECTED/i);
	});

	it('re-evaluates a held lot after a correction: a new evaluation row, old one kept, status follows', async () => {
		const lot = await measuredLot(buyer, inspector, 'hold');
		const first = await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' });
		expect(first.json.status).toBe('on_hold');
		// The missing UN 38.3 summary arrives and is attached by the buyer.
		const form = new FormData();
		form.set('kind', 'un38_3_summary');
		form.set(
			'file',
			new Blob([new TextEncoder().encode(`%PDF-1.4\n% summary ${lot.id}\n%%EOF\n`)], { type: 'application/pdf' }),
			'un38_3.pdf'
		);
		expect((await call(buyer, `/api/v1/lots/${lot.id}/documents`, { form })).status).toBe(201);
		const res = await postForm(app.url, `/review/${lot.id}?/reevaluate`, {}, qualityCookie);
		expect(res.status).toBeLessThan(400);
		const rows = await withClient(
			db.url,
			async (c) => (await c.query('select disposition from evaluations where lot_id = $1 order by id', [lot.id])).rows
		);
		expect(rows.map((r) => r.disposition)).toEqual(['hold', 'accept']);
		expect((await lotRow(lot.id)).status).toBe('accepted');
		// Quality re-ran the engine, which now accepts: the supplier hears only the release.
		const kinds = (await noticesOf(lot.id)).map((n) => n.kind);
		expect(kinds).toEqual(['accept']);
		// Only a held lot can be re-evaluated.
		const again = await postForm(app.url, `/review/${lot.id}?/reevaluate`, {}, qualityCookie);
		expect(again.status).toBe(409);
	});

	it('refuses to release a held lot whose latest evaluation is a safety finding', async () => {
		const lot = await measuredLot(buyer, inspector, 'hold');
		await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' });
		// A safety finding on a held lot cannot come from today's engine; write one to test the guard.
		await withClient(db.url, (c) =>
			c.query(
				`insert into evaluations (lot_id, model_version, severity, plan, inputs, result, disposition, safety)
				 select lot_id, model_version, severity, plan, inputs, result, 'reject', true from evaluations where lot_id = $1`,
				[lot.id]
			)
		);
		const res = await decide(lot.id, { disposition: 'release', reason: 'Release anyway', password: DEMO_PASSWORD });
		expect(res.status).toBe(409);
		expect(res.json.error.message).toMatch(/safety finding/i);
		expect((await lotRow(lot.id)).status).toBe('on_hold');
	});
});

describe('reports, exports, notices and supplier isolation', () => {
	let lot: { id: string; lot_code: string; sampleSize: number };
	let decided: { id: string; lot_code: string };
	let noticeId: string;

	beforeAll(async () => {
		lot = await measuredLot(buyer, inspector, 'hold');
		await call(inspector, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' });
		// An accepted lot, released at once with its notice, for the supplier to list and acknowledge
		// (one more lot not accepted would move this supplier × part on to discontinued inspection).
		decided = await measuredLot(buyer, inspector, 'accept');
		noticeId = (await call(inspector, `/api/v1/lots/${decided.id}/submit`, { method: 'POST' })).json.noticeId;
	});

	it('serves the PDF report that poppler reads (lot code and disposition)', async () => {
		const res = await fetch(`${app.url}/api/v1/lots/${lot.id}/report.pdf`, { headers: { authorization: `Bearer ${voltaria.token}` } });
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('application/pdf');
		const text = pdfText(Buffer.from(await res.arrayBuffer()));
		expect(text).toContain(lot.lot_code);
		expect(text).toMatch(/HOLD/);
	});

	it('exports the readings as XLSX with the right values (re-read by xlsx-populate)', async () => {
		const res = await fetch(`${app.url}/api/v1/lots/${lot.id}/readings.xlsx`, { headers: { authorization: `Bearer ${buyer.token}` } });
		expect(res.status).toBe(200);
		const book = await XlsxPopulate.fromDataAsync(Buffer.from(await res.arrayBuffer()));
		const sheet = book.sheet('Readings')!;
		const stored = await withClient(
			db.url,
			async (c) => (await c.query(`select serial, ocv_v from readings where lot_id = $1`, [lot.id])).rows
		);
		const bySerial = new Map(stored.map((r) => [r.serial as string, r.ocv_v as number]));
		const headers = (sheet.usedRange()!.value()[0] as unknown[]).map(String);
		const serialCol = headers.indexOf('serial');
		const ocvCol = headers.indexOf('OCV (V)');
		expect(serialCol).toBeGreaterThanOrEqual(0);
		const rows = (sheet.usedRange()!.value() as unknown[][]).slice(1).filter((r) => r[serialCol]);
		expect(rows).toHaveLength(lot.sampleSize);
		for (const r of rows) expect(r[ocvCol]).toBeCloseTo(bySerial.get(String(r[serialCol]))!, 6);
	});

	it('exports the lot list with filters', async () => {
		const res = await fetch(`${app.url}/api/v1/lots.xlsx?status=on_hold`, { headers: { authorization: `Bearer ${buyer.token}` } });
		expect(res.status).toBe(200);
		const book = await XlsxPopulate.fromDataAsync(Buffer.from(await res.arrayBuffer()));
		const values = book.sheet(0)!.usedRange()!.value() as unknown[][];
		const codes = values.flat().map(String);
		expect(codes).toContain(lot.lot_code);
		const onHold = await withClient(db.url, async (c) =>
			(await c.query(`select lot_code from lots where status = 'on_hold'`)).rows.map((r) => r.lot_code)
		);
		const listed = values.filter((row) => onHold.includes(String(row[0])));
		expect(listed).toHaveLength(onHold.length);
		// states and filters in Restvolt's words (src/lib/status.ts), not the API's codes
		expect(String(values[0][0])).toBe('Filters applied: status = On hold');
		expect(listed.every((row) => row[6] === 'On hold')).toBe(true);
		expect(codes).not.toContain('on_hold');
		const bad = await fetch(`${app.url}/api/v1/lots.xlsx?status=nonsense`, { headers: { authorization: `Bearer ${buyer.token}` } });
		expect(bad.status).toBe(400);
	});

	it('lets the supplier list and acknowledge its notice, and hides it from other suppliers (404)', async () => {
		const mine = await call(voltaria, `/api/v1/notices?lot_id=${decided.id}`);
		expect(mine.status).toBe(200);
		expect(mine.json.notices.map((n: { id: string }) => n.id)).toContain(noticeId);
		const others = await call(ferrolith, `/api/v1/notices`);
		expect(others.json.notices.map((n: { id: string }) => n.id)).not.toContain(noticeId);
		expect((await call(ferrolith, `/api/v1/notices?lot_id=${lot.id}`)).status).toBe(404);
		expect((await call(ferrolith, `/api/v1/notices/${noticeId}/acknowledge`, { method: 'POST' })).status).toBe(404);
		expect((await call(ferrolith, `/api/v1/lots/${lot.id}/report.pdf`)).status).toBe(404);
		expect((await call(ferrolith, `/api/v1/lots/${lot.id}/readings.xlsx`)).status).toBe(404);
		expect((await call(ferrolith, `/api/v1/lots/${lot.id}/decisions`)).status).toBe(404);
		const ack = await call(voltaria, `/api/v1/notices/${noticeId}/acknowledge`, { method: 'POST' });
		expect(ack.status).toBe(200);
		expect(ack.json.acknowledgedAt).toBeTruthy();
		expect((await call(voltaria, `/api/v1/notices`)).json.notices.every((n: { kind: string }) => n.kind !== 'alert')).toBe(true);
		const [row] = (await noticesOf(decided.id)).filter((n) => n.id === noticeId);
		expect(row.acknowledged_at).not.toBeNull();
	});

	it('refuses submit to roles without it (buyer 403) and quarantine tags for accepted lots (409)', async () => {
		expect((await call(buyer, `/api/v1/lots/${lot.id}/submit`, { method: 'POST' })).status).toBe(403);
		const accepted = await measuredLot(buyer, inspector, 'accept');
		await call(inspector, `/api/v1/lots/${accepted.id}/submit`, { method: 'POST' });
		expect((await call(buyer, `/api/v1/lots/${accepted.id}/quarantine-tag.pdf`)).status).toBe(409);
	});

	it('computes the supplier scorecard from the decided lots', async () => {
		const supplierId = await withClient(
			db.url,
			async (c) => (await c.query(`select supplier_id from lots where id = $1`, [lot.id])).rows[0].supplier_id
		);
		const res = await call(buyer, `/api/v1/suppliers/${supplierId}/scorecard`);
		expect(res.status).toBe(200);
		const facts = await withClient(
			db.url,
			async (c) =>
				(
					await c.query(`select status::text from lots where supplier_id = $1 and status in ('accepted','on_hold','rejected')`, [
						supplierId
					])
				).rows
		);
		expect(res.json.totals.lotsDecided).toBe(facts.length);
		expect(res.json.totals.held + res.json.totals.accepted + res.json.totals.rejected).toBe(facts.length);
		expect(res.json.months.length).toBeGreaterThanOrEqual(1);
		// ppm = nonconforming / inspected × 10⁶ (definition); the safety lot has one deep-discharged unit.
		expect(res.json.totals.nonconformingUnits).toBeGreaterThanOrEqual(1);
		expect(res.json.totals.ppm).toBeCloseTo((res.json.totals.nonconformingUnits / res.json.totals.unitsInspected) * 1e6, 6);
		expect((await call(voltaria, `/api/v1/suppliers/${supplierId}/scorecard`)).status).toBe(403);
	});
});
