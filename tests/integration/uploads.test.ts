/**
 * One upload path for every file (issue 18, item 4), against the built app on a copy of the demo
 * database. Each finding is reproduced and now refused: an HTML page named `../../x.html` as a lot
 * document and as a supplier reply attachment, a declared PDF that is really HTML, an oversized
 * file, a meter file that is an image or a page; a supplier reply carrying the bytes of the buyer's
 * CoC no longer renames or alters the buyer's document. Stored files keep a cleaned name, get an
 * audit entry and are served as attachments with a safe type; the database refuses to change them.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApp, type RunningApp } from '../helpers/app';
import { CookieJar, postForm, signInLinkFor, tokenFor } from '../helpers/auth';
import { freshDatabase, withClient } from '../helpers/db';
import { VOLTARIA } from './hardening-fixtures';

let app: RunningApp;
let db: Awaited<ReturnType<typeof freshDatabase>>;
let buyerToken: string, inspectorToken: string;
let supplierCookie: string;
/** A Voltaria lot with the buyer's CoC and a notice, one open for documents, one on the bench. */
let target: { lotId: string; noticeId: string; cocId: string };
let openLotId: string, benchLotId: string;

const MB = 1024 * 1024;
const HTML = new TextEncoder().encode('<!DOCTYPE html><html><body><script>fetch("/api/v1/me")</script></body></html>');
const pdf = (note: string) => new TextEncoder().encode(`%PDF-1.4\n% ${note}\n%%EOF\n`);

async function supplierSession(email: string): Promise<string> {
	const since = Date.now() - 1000;
	const ask = await postForm(app.url, '/signin?/link', { email, redirectTo: '' });
	if (ask.status !== 303) throw new Error(`link request refused for ${email}: ${ask.status}`);
	const jar = new CookieJar();
	jar.take(await fetch(await signInLinkFor(email, since), { redirect: 'manual' }));
	if (!jar.header().includes('session-token')) throw new Error(`no session for ${email}`);
	return jar.header();
}

beforeAll(async () => {
	db = await freshDatabase('uploads');
	app = await startApp({ databaseUrl: db.url });
	[buyerToken, inspectorToken] = await Promise.all([
		tokenFor(db.url, 'buyer@kestrel-mobility.example'),
		tokenFor(db.url, 'inspector@kestrel-mobility.example')
	]);
	supplierCookie = await supplierSession('supplier@voltaria-cells.example');
	await withClient(db.url, async (c) => {
		const supplier = (await c.query('select id from organisations where name = $1', [VOLTARIA])).rows[0].id;
		const { rows } = await c.query(
			`select n.id as notice_id, d.lot_id, d.id as coc_id from notices n
			 join documents d on d.lot_id = n.lot_id and d.kind = 'coc'
			 join lots l on l.id = n.lot_id where l.supplier_id = $1 order by n.created_at limit 1`,
			[supplier]
		);
		target = { lotId: rows[0].lot_id, noticeId: rows[0].notice_id, cocId: rows[0].coc_id };
		const lotIn = async (status: string) =>
			(await c.query(`select id from lots where supplier_id = $1 and status = $2 order by created_at limit 1`, [supplier, status])).rows[0]
				.id;
		openLotId = await lotIn('awaiting_arrival');
		benchLotId = await lotIn('in_inspection');
	});
}, 120_000);

afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

function fileForm(fields: Record<string, string>, file: { bytes: Uint8Array; name: string; type: string }) {
	const form = new FormData();
	for (const [k, v] of Object.entries(fields)) form.set(k, v);
	form.set('file', new Blob([new Uint8Array(file.bytes)], { type: file.type }), file.name);
	return form;
}

/** POST multipart to the API with the buyer's (or another) token. */
async function apiUpload(path: string, form: FormData, token = buyerToken) {
	const res = await fetch(`${app.url}/api/v1${path}`, {
		method: 'POST',
		headers: { authorization: `Bearer ${token}`, origin: app.url },
		body: form
	});
	return { status: res.status, json: await res.json() };
}

/** The supplier's reply through the portal's form action, as the enhanced form sends it. */
async function reply(comment: string, file: { bytes: Uint8Array; name: string; type: string }) {
	const res = await fetch(`${app.url}/portal/lots/${target.lotId}?/reply`, {
		method: 'POST',
		headers: { cookie: supplierCookie, origin: app.url, accept: 'application/json', 'x-sveltekit-action': 'true' },
		body: fileForm({ noticeId: target.noticeId, comment }, file)
	});
	return (await res.json()) as { type: string; status: number; data: string };
}

const lotFiles = (lotId: string) =>
	withClient(
		db.url,
		async (c) =>
			(
				await c.query(
					'select id, kind, file_name, mime, sha256, uploaded_by, uploaded_at from documents where lot_id = $1 order by uploaded_at, id',
					[lotId]
				)
			).rows
	);
const repliesTo = (noticeId: string) =>
	withClient(db.url, async (c) => (await c.query('select * from notice_responses where notice_id = $1', [noticeId])).rows);
const uploadAudits = (lotId: string) =>
	withClient(db.url, async (c) =>
		(await c.query(`select details from audit_events where lot_id = $1 and action = 'document.upload' order by id`, [lotId])).rows.map(
			(r) => r.details
		)
	);

describe('lot documents (POST /api/v1/lots/{id}/documents)', () => {
	it('refuses the HTML page named ../../x.html with 415 naming the field file, and stores nothing', async () => {
		const before = await lotFiles(openLotId);
		const res = await apiUpload(
			`/lots/${openLotId}/documents`,
			fileForm({ kind: 'other' }, { bytes: HTML, name: '../../x.html', type: 'text/html' })
		);
		expect(res.status).toBe(415);
		expect(res.json.error.code).toBe('unsupported_type');
		expect(res.json.error.message).toMatch(/“x\.html” is an HTML page/);
		expect(res.json.error.issues).toEqual([{ path: 'file', message: res.json.error.message }]);
		expect(await lotFiles(openLotId)).toEqual(before);
	});

	it('refuses a declared PDF that is really HTML, and an oversized file, storing nothing', async () => {
		const before = await lotFiles(openLotId);
		const disguised = await apiUpload(
			`/lots/${openLotId}/documents`,
			fileForm({ kind: 'coc' }, { bytes: HTML, name: 'coc.pdf', type: 'application/pdf' })
		);
		expect(disguised.status).toBe(415);
		expect(disguised.json.error.issues[0].path).toBe('file');
		expect(disguised.json.error.message).toMatch(/HTML page/);
		const big = new Uint8Array(20 * MB + 1);
		big.set(pdf('large'));
		const oversize = await apiUpload(
			`/lots/${openLotId}/documents`,
			fileForm({ kind: 'sds' }, { bytes: big, name: 'sds.pdf', type: 'application/pdf' })
		);
		expect(oversize.status).toBe(413);
		expect(oversize.json.error.code).toBe('file_too_large');
		expect(oversize.json.error.issues[0].path).toBe('file');
		expect(await lotFiles(openLotId)).toEqual(before);
	});

	it('stores a PDF under its cleaned name with an audit entry, and serves it as an attachment', async () => {
		const res = await apiUpload(
			`/lots/${openLotId}/documents`,
			fileForm({ kind: 'other' }, { bytes: pdf('route card'), name: '../../route\u202Ecard..pdf', type: 'application/pdf' })
		);
		expect(res.status).toBe(201);
		expect(res.json.file_name).toBe('routecard.pdf');
		expect(res.json.mime).toBe('application/pdf');
		expect((await uploadAudits(openLotId)).at(-1)).toMatchObject({
			use: 'lot_document',
			fileName: 'routecard.pdf',
			sha256: res.json.sha256
		});
		const file = await fetch(`${app.url}/api/v1/lots/${openLotId}/documents/${res.json.id}`, {
			headers: { authorization: `Bearer ${buyerToken}` }
		});
		expect(file.headers.get('content-type')).toBe('application/pdf');
		expect(file.headers.get('content-disposition')).toMatch(/^attachment; filename="routecard\.pdf"/);
		expect(file.headers.get('x-content-type-options')).toBe('nosniff');
		expect(file.headers.get('content-security-policy')).toContain('sandbox');
	});
});

describe('supplier replies (portal form action)', () => {
	it('refuses the HTML page named ../../x.html, naming the field file, and stores neither reply nor file', async () => {
		const [files, replies] = [await lotFiles(target.lotId), await repliesTo(target.noticeId)];
		const res = await reply('Our report is attached.', { bytes: HTML, name: '../../x.html', type: 'text/html' });
		expect(res).toMatchObject({ type: 'failure', status: 415 });
		expect(res.data).toMatch(/x\.html.{0,4} is an HTML page/);
		expect(res.data).toContain('"file"');
		expect(await lotFiles(target.lotId)).toEqual(files);
		expect(await repliesTo(target.noticeId)).toEqual(replies);
	});

	it('refuses a declared PDF that is really HTML and an oversized file', async () => {
		const files = await lotFiles(target.lotId);
		const disguised = await reply('Our report is attached.', { bytes: HTML, name: '8D.pdf', type: 'application/pdf' });
		expect(disguised).toMatchObject({ type: 'failure', status: 415 });
		const big = new Uint8Array(20 * MB + 1);
		big.set(pdf('large reply'));
		const oversize = await reply('Our report is attached.', { bytes: big, name: '8D.pdf', type: 'application/pdf' });
		expect(oversize).toMatchObject({ type: 'failure', status: 413 });
		expect(await lotFiles(target.lotId)).toEqual(files);
	});

	it('a reply with bytes identical to the buyer’s CoC links that document and leaves it exactly as it was', async () => {
		const [coc] = (await lotFiles(target.lotId)).filter((d) => d.id === target.cocId);
		const bytes = await withClient(
			db.url,
			async (c) => new Uint8Array((await c.query('select bytes from documents where id = $1', [target.cocId])).rows[0].bytes)
		);
		const countBefore = (await lotFiles(target.lotId)).length;
		const res = await reply('Here is the CoC again, as requested.', { bytes, name: 'renamed-by-supplier.pdf', type: 'application/pdf' });
		expect(res).toMatchObject({ type: 'success' });
		const after = await lotFiles(target.lotId);
		expect(after).toHaveLength(countBefore);
		expect(after.find((d) => d.id === target.cocId)).toEqual(coc);
		expect(coc.file_name).not.toBe('renamed-by-supplier.pdf');
		const latest = (await repliesTo(target.noticeId)).sort((a, b) => b.created_at - a.created_at)[0];
		expect(latest.document_id).toBe(target.cocId);
	});

	it('stores a new reply file as a corrective action under a cleaned name, audited, downloadable by the supplier', async () => {
		const res = await reply('Our 8D report is attached.', {
			bytes: pdf('8D report'),
			name: '../../8D report.pdf',
			type: 'application/pdf'
		});
		expect(res).toMatchObject({ type: 'success' });
		const stored = (await lotFiles(target.lotId)).find((d) => d.kind === 'corrective_action' && d.file_name === '8D report.pdf');
		expect(stored).toBeDefined();
		expect(stored!.mime).toBe('application/pdf');
		expect((await uploadAudits(target.lotId)).some((a) => a.use === 'supplier_reply' && a.sha256 === stored!.sha256)).toBe(true);
		const file = await fetch(`${app.url}/api/v1/lots/${target.lotId}/documents/${stored!.id}`, { headers: { cookie: supplierCookie } });
		expect(file.status).toBe(200);
		expect(file.headers.get('content-disposition')).toMatch(/^attachment; filename="8D report\.pdf"/);
	});
});

describe('stored files', () => {
	it('cannot be changed in the database, not even by a superuser statement', async () => {
		await expect(
			withClient(db.url, (c) => c.query(`update documents set file_name = 'x.html', mime = 'text/html' where id = $1`, [target.cocId]))
		).rejects.toThrow(/documents are immutable/);
		const [row] = (await lotFiles(target.lotId)).filter((d) => d.id === target.cocId);
		expect(row.mime).toBe('application/pdf');
	});

	it('a row stored as text/html by the old reply path is served as plain bytes, as an attachment, under its last name segment', async () => {
		const id = await withClient(
			db.url,
			async (c) =>
				(
					await c.query(
						`insert into documents (lot_id, kind, file_name, mime, size_bytes, sha256, bytes) values ($1, 'corrective_action', '../../x.html', 'text/html', $2, 'legacy-x-html', $3) returning id`,
						[target.lotId, HTML.length, Buffer.from(HTML)]
					)
				).rows[0].id
		);
		const file = await fetch(`${app.url}/api/v1/lots/${target.lotId}/documents/${id}`, {
			headers: { authorization: `Bearer ${buyerToken}` }
		});
		expect(file.status).toBe(200);
		expect(file.headers.get('content-type')).toBe('application/octet-stream');
		expect(file.headers.get('content-disposition')).toMatch(/^attachment; filename="x\.html"/);
		expect(file.headers.get('x-content-type-options')).toBe('nosniff');
		expect(file.headers.get('content-security-policy')).toMatch(/sandbox/);
	});
});

describe('meter files (POST /api/v1/lots/{id}/imports)', () => {
	it('are read only when the content is CSV text or an XLSX workbook', async () => {
		const mapping = JSON.stringify({ serial: 0, ocv: 1, temperature: 2 });
		const png = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0]);
		const image = await apiUpload(
			`/lots/${benchLotId}/imports?preview=true`,
			fileForm({ mapping }, { bytes: png, name: 'meter.png', type: 'image/png' }),
			inspectorToken
		);
		expect(image.status).toBe(415);
		expect(image.json.error.issues[0].path).toBe('file');
		const page = await apiUpload(
			`/lots/${benchLotId}/imports?preview=true`,
			fileForm({ mapping }, { bytes: HTML, name: 'meter.csv', type: 'text/csv' }),
			inspectorToken
		);
		expect(page.status).toBe(415);
		expect(page.json.error.message).toMatch(/HTML page/);
		const csv = new TextEncoder().encode('serial,ocv,temp\nU-1,3.61,25\n');
		const ok = await apiUpload(
			`/lots/${benchLotId}/imports?preview=true`,
			fileForm({ mapping }, { bytes: csv, name: '../bench/meter.csv', type: 'text/csv' }),
			inspectorToken
		);
		expect(ok.status).toBe(200);
		expect(ok.json).toMatchObject({ file_name: 'meter.csv', format: 'csv', valid_rows: 1 });
	});
});
