/**
 * Suppliers, parts, lots and lot documents through the real app (`node build`) on a fresh copy of
 * the seeded database, with API tokens: happy paths, keyset pagination, supplier isolation, and a
 * matrix of bad input where each call gets a clear 4xx and leaves the database unchanged.
 */
import { createHash, randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApp, type RunningApp } from '../helpers/app';
import { tokenFor } from '../helpers/auth';
import { freshDatabase, withClient } from '../helpers/db';

let app: RunningApp;
let db: Awaited<ReturnType<typeof freshDatabase>>;
const tokens: Record<'buyer' | 'inspector' | 'quality' | 'voltaria' | 'ferrolith', string> = {
	buyer: '',
	inspector: '',
	quality: '',
	voltaria: '',
	ferrolith: ''
};
const ids = { voltaria: '', ferrolith: '', plumbridge: '', vc21: '', fl100: '', pb12: '' };

beforeAll(async () => {
	db = await freshDatabase('lots_api');
	app = await startApp({ databaseUrl: db.url });
	const emails = {
		buyer: 'buyer@kestrel-mobility.example',
		inspector: 'inspector@kestrel-mobility.example',
		quality: 'quality@kestrel-mobility.example',
		voltaria: 'supplier@voltaria-cells.example',
		ferrolith: 'supplier@ferrolith.example'
	};
	for (const [who, email] of Object.entries(emails)) tokens[who as keyof typeof tokens] = await tokenFor(db.url, email);
	await withClient(db.url, async (c) => {
		const org = async (name: string) => (await c.query('select id from organisations where name = $1', [name])).rows[0].id;
		const part = async (pn: string) => (await c.query('select id from parts where part_number = $1', [pn])).rows[0].id;
		ids.voltaria = await org('Voltaria Cells Co.');
		ids.ferrolith = await org('Ferrolith Energy');
		ids.plumbridge = await org('Plumbridge Batteries');
		ids.vc21 = await part('VC-21700-50G');
		ids.fl100 = await part('FL-PR-100');
		ids.pb12 = await part('PB-AGM-12-18');
	});
});

afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

type Who = keyof typeof tokens | null;
async function call(
	who: Who,
	path: string,
	init: { method?: string; body?: unknown; raw?: BodyInit; headers?: Record<string, string> } = {}
) {
	const headers: Record<string, string> = { ...(who ? { authorization: `Bearer ${tokens[who]}` } : {}), ...init.headers };
	let body: BodyInit | undefined = init.raw;
	if (init.body !== undefined) {
		body = JSON.stringify(init.body);
		headers['content-type'] = 'application/json';
	}
	const res = await fetch(`${app.url}${path}`, { method: init.method ?? (body ? 'POST' : 'GET'), headers, body });
	const text = await res.text();
	// eslint-disable-next-line @typescript-eslint/no-explicit-any -- tests read JSON answers of many shapes
	let json: any = null;
	try {
		json = JSON.parse(text);
	} catch {
		/* not JSON */
	}
	return { status: res.status, json, text, headers: res.headers };
}

const validLot = () => ({
	po_number: `PO-${randomUUID().slice(0, 8)}`,
	supplier_id: ids.voltaria,
	part_id: ids.vc21,
	quantity: 500,
	declared_soc: 0.3,
	transport: 'sea',
	un_number: 'UN3480'
});

// Audit rows of this area only: the app's background work (mail outbox) may append its own at any time.
const COUNTS = {
	lots: 'select count(*) from lots',
	documents: 'select count(*) from documents',
	audit: `select count(*) from audit_events where action like 'lot.%' or action like 'document.%'`
} as const;
const count = (what: keyof typeof COUNTS) => withClient(db.url, async (c) => Number((await c.query(COUNTS[what])).rows[0].count));
const snapshot = async () => ({ lots: await count('lots'), documents: await count('documents'), audit: await count('audit') });

async function createLot(overrides: Record<string, unknown> = {}) {
	const res = await call('buyer', '/api/v1/lots', { body: { ...validLot(), ...overrides } });
	expect(res.status, res.text).toBe(201);
	return res.json;
}

describe('GET /api/v1/suppliers and /api/v1/parts', () => {
	it('lists suppliers with contacts, each with an id', async () => {
		const res = await call('buyer', '/api/v1/suppliers');
		expect(res.status).toBe(200);
		const names = res.json.suppliers.map((s: { name: string }) => s.name);
		expect(names).toEqual(['Ferrolith Energy', 'Nimbus Pack Works', 'Plumbridge Batteries', 'Voltaria Cells Co.']);
		const voltaria = res.json.suppliers.find((s: { id: string }) => s.id === ids.voltaria);
		expect(voltaria.contacts.map((c: { email: string }) => c.email).sort()).toEqual([
			'quality-desk@voltaria-cells.example',
			'supplier@voltaria-cells.example'
		]);
		expect(voltaria.contacts[0]).toHaveProperty('receives_notices', true);
	});

	it('lists parts with limits and sampling, filterable by supplier', async () => {
		const all = await call('inspector', '/api/v1/parts');
		expect(all.status).toBe(200);
		expect(all.json.parts).toHaveLength(12);
		const mine = await call('quality', `/api/v1/parts?supplier_id=${ids.ferrolith}`);
		expect(mine.json.parts.map((p: { part_number: string }) => p.part_number)).toEqual(['FL-MOD-12V50', 'FL-PR-100', 'FL-PR-280']);
		const fl100 = mine.json.parts.find((p: { id: string }) => p.id === ids.fl100);
		expect(fl100).toMatchObject({
			chemistry: 'LFP',
			cells_in_series: 1,
			nominal_capacity_ah: 100,
			sampling: { aql: 1, inspection_level: 'II' },
			required_documents: ['coc', 'un38_3_summary', 'sds']
		});
		expect(fl100.model.version).toEqual(expect.any(String));
		expect(fl100.limits.ocv_min_cell_v).toBeLessThan(fl100.limits.ocv_max_cell_v);
	});

	it('refuses anonymous callers (401) and supplier users (403)', async () => {
		expect((await call(null, '/api/v1/suppliers')).status).toBe(401);
		expect((await call('voltaria', '/api/v1/suppliers')).status).toBe(403);
		const parts = await call('voltaria', '/api/v1/parts');
		expect(parts.status).toBe(403);
		expect(parts.json.error.code).toBe('forbidden');
		expect((await call('buyer', '/api/v1/parts?supplier_id=nope')).status).toBe(400);
	});
});

describe('POST /api/v1/lots', () => {
	it('registers a lot released for arrival, with a human lot code and an audit entry', async () => {
		const before = await snapshot();
		const res = await call('buyer', '/api/v1/lots', { body: { ...validLot(), expected_arrival: '2026-04-30' } });
		expect(res.status).toBe(201);
		expect(res.json).toMatchObject({
			supplier_id: ids.voltaria,
			part_id: ids.vc21,
			quantity: 500,
			declared_soc: 0.3,
			transport: 'sea',
			un_number: 'UN3480',
			expected_arrival: '2026-04-30',
			status: 'awaiting_arrival',
			supplier_name: 'Voltaria Cells Co.',
			part_number: 'VC-21700-50G'
		});
		expect(res.json.id).toMatch(/^[0-9a-f-]{36}$/);
		expect(res.json.lot_code).toMatch(/^L-\d{4}-\d{5}$/);
		// The severity is the supplier × part's current one (replayed from the seeded history).
		expect(['normal', 'tightened', 'reduced', 'discontinued']).toContain(res.json.severity);
		expect(res.headers.get('location')).toBe(`/api/v1/lots/${res.json.id}`);
		const after = await snapshot();
		expect(after.lots).toBe(before.lots + 1);
		const audit = await withClient(db.url, (c) => c.query(`select action, actor_email from audit_events where lot_id = $1`, [res.json.id]));
		expect(audit.rows).toEqual([{ action: 'lot.create', actor_email: 'buyer@kestrel-mobility.example' }]);
	});

	it('gives concurrent registrations distinct, consecutive lot codes', async () => {
		const made = await Promise.all(Array.from({ length: 8 }, () => call('buyer', '/api/v1/lots', { body: validLot() })));
		expect(made.map((r) => r.status)).toEqual(Array(8).fill(201));
		const numbers = made.map((r) => Number(r.json.lot_code.slice(7))).sort((a, b) => a - b);
		expect(new Set(numbers).size).toBe(8);
		expect(numbers.at(-1)! - numbers[0]).toBe(7);
	});

	it('lets a non-lithium lot go without a UN number and normalises a lower-case one', async () => {
		const lead = await createLot({ supplier_id: ids.plumbridge, part_id: ids.pb12, un_number: undefined, transport: 'road' });
		expect(lead.un_number).toBeNull();
		const lower = await createLot({ un_number: 'un3481', packing: 'with_equipment' });
		expect(lower.un_number).toBe('UN3481');
		expect(lower.packing).toBe('with_equipment');
	});

	it('records packing (default alone) and refuses a UN number that does not fit it, naming packing', async () => {
		// UN 3480 is lithium-ion batteries on their own, UN 3481 with or in equipment (UN Model Regulations
		// Dangerous Goods List, from memory).
		expect((await createLot({})).packing).toBe('alone');
		const wrong = await call('buyer', '/api/v1/lots', { body: { ...validLot(), un_number: 'UN3480', packing: 'in_equipment' } });
		expect(wrong.status).toBe(422);
		expect(JSON.stringify(wrong.json.error.issues)).toMatch(/packing/);
		const unknown = await call('buyer', '/api/v1/lots', { body: { ...validLot(), packing: 'boxed' } });
		expect(unknown.status).toBe(422);
		expect(JSON.stringify(unknown.json.error.issues)).toMatch(/packing/);
	});

	it('refuses roles that may not register lots', async () => {
		expect((await call('inspector', '/api/v1/lots', { body: validLot() })).status).toBe(403);
		expect((await call('voltaria', '/api/v1/lots', { body: validLot() })).status).toBe(403);
		expect((await call(null, '/api/v1/lots', { body: validLot() })).status).toBe(401);
	});
});

describe('bad lot input: a clear 4xx and nothing changes', () => {
	const cases: Array<[string, () => Record<string, unknown> | string, number, string | null]> = [
		['quantity as a string', () => ({ ...validLot(), quantity: '500' }), 422, 'quantity'],
		['quantity "NaN"', () => ({ ...validLot(), quantity: 'NaN' }), 422, 'quantity'],
		['declared_soc "NaN"', () => ({ ...validLot(), declared_soc: 'NaN' }), 422, 'declared_soc'],
		['negative quantity', () => ({ ...validLot(), quantity: -5 }), 422, 'quantity'],
		['fractional quantity', () => ({ ...validLot(), quantity: 2.5 }), 422, 'quantity'],
		['quantity above 10,000,000', () => ({ ...validLot(), quantity: 10_000_001 }), 422, 'quantity'],
		['declared_soc as percent', () => ({ ...validLot(), declared_soc: 30 }), 422, 'declared_soc'],
		['unknown transport', () => ({ ...validLot(), transport: 'boat' }), 422, 'transport'],
		['empty PO number', () => ({ ...validLot(), po_number: '   ' }), 422, 'po_number'],
		['PO number of 41 characters', () => ({ ...validLot(), po_number: 'P'.repeat(41) }), 422, 'po_number'],
		['supplier_id not a uuid', () => ({ ...validLot(), supplier_id: 'voltaria' }), 422, 'supplier_id'],
		['unknown supplier id', () => ({ ...validLot(), supplier_id: randomUUID() }), 422, 'supplier_id'],
		['unknown part id', () => ({ ...validLot(), part_id: randomUUID() }), 422, 'part_id'],
		['part of another supplier', () => ({ ...validLot(), part_id: ids.fl100 }), 422, 'part_id'],
		['lithium part without UN number', () => ({ ...validLot(), un_number: null }), 422, 'un_number'],
		['lithium-ion part with a lithium-metal UN number', () => ({ ...validLot(), un_number: 'UN3090' }), 422, 'un_number'],
		['malformed UN number', () => ({ ...validLot(), un_number: 'UN34800' }), 422, 'un_number'],
		[
			'lead-acid part with a lithium UN number',
			() => ({ ...validLot(), supplier_id: ids.plumbridge, part_id: ids.pb12, transport: 'road', un_number: 'UN3480' }),
			422,
			'un_number'
		],
		['bad expected_arrival date', () => ({ ...validLot(), expected_arrival: '2026-02-30' }), 422, 'expected_arrival'],
		['missing fields', () => ({ po_number: 'PO-1' }), 422, 'supplier_id'],
		['body that is not JSON', () => '{"quantity": NaN}', 400, null],
		['JSON array body', () => '[1,2]', 422, null]
	];

	it.each(cases)('%s', async (_name, make, status, path) => {
		const before = await snapshot();
		const input = make();
		const res =
			typeof input === 'string'
				? await call('buyer', '/api/v1/lots', { raw: input, headers: { 'content-type': 'application/json' } })
				: await call('buyer', '/api/v1/lots', { body: input });
		expect(res.status, res.text).toBe(status);
		expect(res.json.error.code).toBe(status === 400 ? 'bad_request' : 'unprocessable');
		expect(res.json.error.message).toEqual(expect.any(String));
		if (path) expect(res.json.error.issues.map((i: { path: string }) => i.path)).toContain(path);
		expect(await snapshot()).toEqual(before);
	});
});

describe('GET /api/v1/lots (keyset pages) and /api/v1/lots/{id}', () => {
	it('walks every lot of a filter exactly once, newest first', async () => {
		const created: string[] = [];
		for (let i = 0; i < 7; i++) {
			created.push((await createLot({ po_number: `PO-PAGE-${i}`, supplier_id: ids.ferrolith, part_id: ids.fl100, quantity: 100 + i })).id);
		}
		const seen: Array<{ id: string; created_at: string }> = [];
		let cursor: string | null = null;
		const pageSizes: number[] = [];
		do {
			const q: string = `/api/v1/lots?supplier_id=${ids.ferrolith}&search=PO-PAGE-&limit=3${cursor ? `&cursor=${cursor}` : ''}`;
			const res = await call('buyer', q);
			expect(res.status).toBe(200);
			pageSizes.push(res.json.lots.length);
			seen.push(...res.json.lots);
			cursor = res.json.next_cursor;
		} while (cursor);
		expect(pageSizes).toEqual([3, 3, 1]);
		expect(seen.map((l) => l.id)).toEqual([...created].reverse());
		const times = seen.map((l) => Date.parse(l.created_at));
		expect([...times].sort((a, b) => b - a)).toEqual(times);
	});

	it('filters by status and search, and refuses bad query values with 400', async () => {
		const lot = await createLot({ po_number: 'PO-FIND-ME-77' });
		const found = await call('buyer', '/api/v1/lots?search=find-me');
		expect(found.json.lots.map((l: { id: string }) => l.id)).toEqual([lot.id]);
		const byCode = await call('buyer', `/api/v1/lots?search=${lot.lot_code}`);
		expect(byCode.json.lots.map((l: { id: string }) => l.id)).toEqual([lot.id]);
		const drafts = await call('buyer', '/api/v1/lots?status=draft&limit=100');
		expect(drafts.json.lots.every((l: { status: string }) => l.status === 'draft')).toBe(true);
		expect(drafts.json.lots.map((l: { id: string }) => l.id)).not.toContain(lot.id);
		for (const q of ['status=lost', 'limit=0', 'limit=abc', 'limit=101', 'supplier_id=x', 'cursor=not-a-cursor']) {
			const res = await call('buyer', `/api/v1/lots?${q}`);
			expect(res.status, q).toBe(400);
			expect(res.json.error.code).toBe('bad_request');
		}
	});

	it('traces a unit by its serial: every lot holding a reading of it, and only the caller’s own for a supplier', async () => {
		const serial = `TRACE-${randomUUID().slice(0, 8)}`;
		const mine = await createLot();
		const theirs = await createLot({ supplier_id: ids.ferrolith, part_id: ids.fl100 });
		const other = await createLot();
		for (const [lot, unit] of [
			[mine, serial],
			[theirs, serial],
			[other, `${serial}-2`]
		]) {
			const stored = await call('inspector', `/api/v1/lots/${lot.id}/readings`, {
				body: { readings: [{ serial: unit, ocv_v: 3.6, temperature_c: 22 }] }
			});
			expect(stored.status, stored.text).toBe(201);
		}
		const lotIds = (res: { json: { lots: Array<{ id: string }> } }) => res.json.lots.map((l) => l.id);
		const traced = await call('buyer', `/api/v1/lots?serial=${serial}`);
		expect(traced.status).toBe(200);
		expect(lotIds(traced)).toEqual([theirs.id, mine.id]); // exact serial, newest first
		expect(lotIds(await call('voltaria', `/api/v1/lots?serial=${serial}`))).toEqual([mine.id]);
		expect(lotIds(await call('buyer', `/api/v1/lots?serial=${serial}&supplier_id=${ids.ferrolith}`))).toEqual([theirs.id]);
		expect(lotIds(await call('buyer', '/api/v1/lots?serial=NO-SUCH-UNIT'))).toEqual([]);
		const long = await call('buyer', `/api/v1/lots?serial=${'x'.repeat(65)}`);
		expect(long.status).toBe(400);
		expect(long.json.error.issues[0].path).toBe('serial');
	});

	it('returns one lot with its documents; unknown → 404, malformed id → 404', async () => {
		const lot = await createLot();
		const res = await call('inspector', `/api/v1/lots/${lot.id}`);
		expect(res.status).toBe(200);
		expect(res.json).toMatchObject({ id: lot.id, documents: [], missing_documents: ['coc', 'un38_3_summary', 'sds'] });
		const unknown = await call('buyer', `/api/v1/lots/${randomUUID()}`);
		expect(unknown.status).toBe(404);
		expect(unknown.json.error.code).toBe('not_found');
		expect((await call('buyer', '/api/v1/lots/12345')).status).toBe(404);
	});
});

describe('supplier isolation', () => {
	it('a supplier sees its own lots and gets 404 for another supplier’s lot', async () => {
		const theirs = await createLot({ supplier_id: ids.ferrolith, part_id: ids.fl100 });
		const mine = await createLot();
		expect((await call('voltaria', `/api/v1/lots/${mine.id}`)).status).toBe(200);
		const other = await call('voltaria', `/api/v1/lots/${theirs.id}`);
		expect(other.status).toBe(404);
		expect(other.json.error.code).toBe('not_found');
		expect((await call('voltaria', `/api/v1/lots/${theirs.id}/documents`)).status).toBe(404);
		const list = await call('voltaria', '/api/v1/lots?limit=100');
		expect(list.status).toBe(200);
		expect(list.json.lots.length).toBeGreaterThan(0);
		expect(new Set(list.json.lots.map((l: { supplier_id: string }) => l.supplier_id))).toEqual(new Set([ids.voltaria]));
		// Asking for another supplier's lots by filter yields nothing rather than their lots.
		const sneaky = await call('voltaria', `/api/v1/lots?supplier_id=${ids.ferrolith}`);
		expect(sneaky.json.lots).toEqual([]);
	});
});

describe('lot documents', () => {
	// A minimal PDF: the header is what identifies the type (ISO 32000-1 §7.5.2: "%PDF-1.n").
	const pdf = Buffer.from('%PDF-1.4\n1 0 obj <<>> endobj\ntrailer <<>>\n%%EOF\n' + randomUUID());
	// PNG signature (RFC 2083 §3.1 / PNG spec: 89 50 4E 47 0D 0A 1A 0A) followed by filler bytes.
	const png = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.from('not really pixels')]);

	// Integrations send no Origin header: a bearer-token upload must not be taken for a cross-site form post.
	const sameOrigin = () => ({});
	const upload = (who: Who, lotId: string, kind: string | null, bytes: Buffer, name: string, type = 'application/pdf') => {
		const form = new FormData();
		if (kind !== null) form.set('kind', kind);
		form.set('file', new File([new Uint8Array(bytes)], name, { type }));
		return call(who, `/api/v1/lots/${lotId}/documents`, { method: 'POST', raw: form, headers: sameOrigin() });
	};

	it('stores a PDF with its SHA-256, serves it as an attachment, and recognises the same file twice', async () => {
		const lot = await createLot();
		const first = await upload('buyer', lot.id, 'coc', pdf, 'CoC lot 77.pdf');
		expect(first.status, first.text).toBe(201);
		expect(first.json).toMatchObject({
			lot_id: lot.id,
			kind: 'coc',
			file_name: 'CoC lot 77.pdf',
			mime: 'application/pdf',
			size_bytes: pdf.length,
			sha256: createHash('sha256').update(pdf).digest('hex')
		});

		const before = await snapshot();
		const again = await upload('buyer', lot.id, 'other', pdf, 'renamed.pdf');
		expect(again.status).toBe(409);
		expect(again.json.error.code).toBe('duplicate_document');
		expect(again.json.error.message).toContain('already attached as “CoC lot 77.pdf”');
		expect(again.json.error.existing_document_id).toBe(first.json.id);
		expect(await snapshot()).toEqual(before);

		const file = await fetch(`${app.url}/api/v1/lots/${lot.id}/documents/${first.json.id}`, {
			headers: { authorization: `Bearer ${tokens.voltaria}` }
		});
		expect(file.status).toBe(200);
		expect(file.headers.get('content-type')).toBe('application/pdf');
		expect(file.headers.get('content-disposition')).toMatch(/^attachment; filename="CoC lot 77\.pdf"/);
		expect(file.headers.get('x-content-type-options')).toBe('nosniff');
		expect(Buffer.from(await file.arrayBuffer()).equals(pdf)).toBe(true);

		const detail = await call('buyer', `/api/v1/lots/${lot.id}`);
		expect(detail.json.documents.map((d: { id: string }) => d.id)).toEqual([first.json.id]);
		expect(detail.json.missing_documents).toEqual(['un38_3_summary', 'sds']);
	});

	it('accepts a PNG by its content and keeps a path-like name only as a display name', async () => {
		const lot = await createLot();
		const res = await upload('buyer', lot.id, 'other', png, '../../etc/label.png', 'image/png');
		expect(res.status, res.text).toBe(201);
		expect(res.json).toMatchObject({ mime: 'image/png', file_name: 'label.png' });
	});

	it('refuses bad uploads with a clear 4xx and stores nothing', async () => {
		const lot = await createLot();
		const big = Buffer.alloc(30 * 1024 * 1024, 0x20);
		big.write('%PDF-1.7\n', 0);
		const textAsPdf = Buffer.from('Certificate of conformity\nThis is plain text.\n');
		const bad: Array<[string, () => ReturnType<typeof upload>, number, string]> = [
			['a 30 MB file', () => upload('buyer', lot.id, 'coc', big, 'huge.pdf'), 413, 'file_too_large'],
			['a text file named .pdf', () => upload('buyer', lot.id, 'coc', textAsPdf, 'coc.pdf'), 415, 'unsupported_type'],
			['a PDF named .png', () => upload('buyer', lot.id, 'coc', pdf, 'coc.png', 'image/png'), 415, 'type_mismatch'],
			['an empty file', () => upload('buyer', lot.id, 'coc', Buffer.alloc(0), 'empty.pdf'), 400, 'empty_file'],
			['an unknown kind', () => upload('buyer', lot.id, 'invoice', pdf, 'x.pdf'), 422, 'unprocessable'],
			['no kind', () => upload('buyer', lot.id, null, pdf, 'x.pdf'), 422, 'unprocessable'],
			[
				'no file',
				() => call('buyer', `/api/v1/lots/${lot.id}/documents`, { method: 'POST', raw: new FormData(), headers: sameOrigin() }),
				422,
				'unprocessable'
			],
			['a JSON body', () => call('buyer', `/api/v1/lots/${lot.id}/documents`, { body: { kind: 'coc' } }), 400, 'bad_request'],
			['an inspector', () => upload('inspector', lot.id, 'coc', pdf, 'x.pdf'), 403, 'forbidden'],
			['an unknown lot', () => upload('buyer', randomUUID(), 'coc', pdf, 'x.pdf'), 404, 'not_found']
		];
		for (const [name, send, status, code] of bad) {
			const before = await snapshot();
			const res = await send();
			expect(res.status, `${name}: ${res.text}`).toBe(status);
			expect(res.json.error.code, name).toBe(code);
			expect(res.json.error.message, name).toEqual(expect.any(String));
			expect(await snapshot(), name).toEqual(before);
		}
		const text = await upload('buyer', lot.id, 'coc', textAsPdf, 'coc.pdf');
		expect(text.json.error.message).toContain('“coc.pdf” is named .pdf but is a text file');
	});

	it('404s an unknown document and another supplier’s document', async () => {
		const lot = await createLot({ supplier_id: ids.ferrolith, part_id: ids.fl100 });
		const doc = await upload('buyer', lot.id, 'sds', Buffer.concat([pdf, Buffer.from('ferrolith')]), 'sds.pdf');
		expect(doc.status).toBe(201);
		expect((await call('ferrolith', `/api/v1/lots/${lot.id}/documents/${doc.json.id}`)).status).toBe(200);
		expect((await call('voltaria', `/api/v1/lots/${lot.id}/documents/${doc.json.id}`)).status).toBe(404);
		expect((await call('buyer', `/api/v1/lots/${lot.id}/documents/${randomUUID()}`)).status).toBe(404);
	});
});
