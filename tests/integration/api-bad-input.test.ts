/**
 * Bad input against every JSON API route (property-based, fast-check): generated malformed bodies,
 * query strings, ids and files, mostly with valid credentials of a role that may call the route
 * (so validation, not authorisation, is exercised) and partly with no or garbage credentials.
 * Promises checked (issue 8, "bad input"):
 *  - no answer is a 5xx;
 *  - every 4xx is JSON in the shape {"error":{"code","message"}};
 *  - writing routes answer 4xx to all of it, and the database is unchanged afterwards (row counts of
 *    every table but the audit trail and the sign-in throttle, which may only grow, plus an md5 of
 *    the lots and readings tables).
 * The route table below is checked against the files under src/routes/api/v1, so a new route or
 * method without an entry fails the test.
 * Strict fields (issue 18): every text and number field of the JSON bodies and query strings, read
 * from the routes' zod schemas (strict-fields.ts), gets NUL and control characters, exponents and
 * comma decimals; each must be refused with a 400/422 that names the field.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { startApp, type RunningApp } from '../helpers/app';
import { signInApi, tokenFor } from '../helpers/auth';
import { freshDatabase } from '../helpers/db';
import { apiRouteFiles, seedIds, snapshot, type DbSnapshot, type SeedIds } from './hardening-fixtures';
import { strictFieldEntries, strictFieldValue } from './strict-fields';

type Who = 'buyer' | 'inspector' | 'quality' | 'qualitySession' | 'supplierA' | 'admin' | 'public';
type InputKind = 'query' | 'json' | 'multipart' | 'none';

interface Sent {
	contentType?: string;
	body?: string | FormData | Uint8Array;
}

interface Entry {
	route: string;
	method: 'GET' | 'POST' | 'PATCH' | 'DELETE';
	who: Who;
	input: InputKind;
	/** The path below /api/v1 (ids generated). */
	path: fc.Arbitrary<string>;
	/** Query keys the route reads (garbage values are generated for them, plus unknown keys). */
	queryKeys?: string[];
	body?: fc.Arbitrary<Sent>;
	/** Inputs a 2xx is fine for although they are not queries (pure computations, import previews): they write nothing. */
	allows2xx?: (url: string, sent: Sent) => boolean;
}

let app: RunningApp;
let db: Awaited<ReturnType<typeof freshDatabase>>;
let ids: SeedIds;
let creds: Record<Exclude<Who, 'public'>, Record<string, string>>;

// ---------------------------------------------------------------- generators of bad values

const deepObject = (depth: number) => {
	let v: unknown = {};
	for (let i = 0; i < depth; i++) v = { a: v };
	return v;
};
const deepArrayText = (depth: number) => '['.repeat(depth) + ']'.repeat(depth);

/** Values that are never a valid number field (finite, in range, of the right type). */
const badNumber = fc.oneof(
	fc.constantFrom<unknown>('NaN', 'Infinity', '-Infinity', '1e309', '3.7', '', ' ', '0x1F', '١٢٣', null, true, false, [], {}, [3.7], {
		value: 3.7
	}),
	fc.integer({ min: -2_147_483_648, max: -1 }),
	fc.constantFrom(-1e308, 1e308, -Number.MAX_VALUE, Number.MAX_SAFE_INTEGER * 1024, -0.000001),
	fc.string({ maxLength: 12 })
);
const overlong = fc.oneof(
	fc.string({ minLength: 300, maxLength: 3000 }),
	fc.constant('x'.repeat(100_000)),
	fc.constant('é'.repeat(20_000))
);
const badUuid = fc.constantFrom(
	'not-a-uuid',
	'123',
	'00000000-0000-0000-0000-00000000000g',
	"' or 1=1 --",
	'../../etc/passwd',
	'%00',
	'null',
	'{}',
	'00000000000000000000000000000000x'
);
/** Anything at all, weighted towards the nasty. */
const junk: fc.Arbitrary<unknown> = fc.oneof(
	{ arbitrary: badNumber, weight: 3 },
	{ arbitrary: fc.anything({ maxDepth: 3, maxKeys: 5 }), weight: 3 },
	{ arbitrary: overlong, weight: 1 },
	{ arbitrary: fc.uuid(), weight: 1 },
	{ arbitrary: badUuid, weight: 1 },
	{
		arbitrary: fc.constantFrom(
			deepObject(200),
			deepObject(3000),
			Array.from({ length: 20_000 }, () => ({}))
		),
		weight: 1
	}
);

/** A near-valid body: one field dropped or replaced by junk, unknown fields added; `spoil` keeps it invalid. */
function mutated(template: Record<string, unknown>, spoil: (o: Record<string, unknown>) => fc.Arbitrary<Record<string, unknown>>) {
	return fc
		.record({ field: fc.constantFrom(...Object.keys(template), '__proto__', 'constructor', 'extra'), value: junk, drop: fc.boolean() })
		.chain(({ field, value, drop }) => {
			const copy: Record<string, unknown> = JSON.parse(JSON.stringify(template));
			if (drop) delete copy[field];
			else copy[field] = value;
			return spoil(copy);
		});
}
const spoilWith = (field: string, bad: fc.Arbitrary<unknown>) => (o: Record<string, unknown>) => bad.map((v) => ({ ...o, [field]: v }));

const invalidJsonText = fc.oneof(
	fc.constantFrom(
		'{',
		'{"a":1,}',
		"{'a':1}",
		'NaN',
		'[1,2',
		'\uFEFF{}',
		'{"quantity": 1e400}',
		'',
		'undefined',
		'{"a":"\\ud800"}',
		deepArrayText(5000),
		deepArrayText(100_000)
	),
	fc.string({ maxLength: 200 })
);

const jsonOf = (value: unknown): Sent => ({ contentType: 'application/json', body: JSON.stringify(value) ?? 'undefined' });

/** Random bytes under a trusted-looking name. */
const garbageFile = fc.record({
	bytes: fc.oneof(fc.uint8Array({ minLength: 0, maxLength: 4096 }), fc.uint8Array({ minLength: 200_000, maxLength: 200_000 })),
	name: fc.oneof(
		fc.constantFrom('coc.pdf', 'meter.csv', 'meter.xlsx', '../../etc/passwd.pdf', 'a\u0000b.csv', 'CON.xlsx', ''),
		overlong.map((s) => `${s.slice(0, 400)}.pdf`)
	),
	type: fc.constantFrom(
		'application/pdf',
		'text/csv',
		'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
		'application/octet-stream',
		''
	)
});

function multipartOf(fields: Record<string, unknown>, file: { bytes: Uint8Array; name: string; type: string } | null): Sent {
	const form = new FormData();
	for (const [k, v] of Object.entries(fields)) if (v !== undefined) form.set(k, typeof v === 'string' ? v : (JSON.stringify(v) ?? ''));
	if (file) form.set('file', new Blob([new Uint8Array(file.bytes)], { type: file.type }), file.name);
	return { body: form };
}

/** Bodies of the wrong kind for a JSON route: wrong content types, multipart with garbage, broken framing. */
const wrongKindBody = fc.oneof(
	fc.record({
		contentType: fc.constantFrom(
			'text/plain',
			'application/x-www-form-urlencoded',
			'application/xml',
			'application/json; charset=utf-16',
			'image/png'
		),
		body: fc.string({ maxLength: 100 })
	}),
	fc.record({ contentType: fc.constant('multipart/form-data; boundary=zzz'), body: fc.string({ maxLength: 100 }) }),
	garbageFile.map((f) => multipartOf({ kind: 'coc', mapping: '{"serial":0}' }, f)),
	fc.uint8Array({ maxLength: 512 }).map((b): Sent => ({ contentType: 'application/octet-stream', body: b }))
);

/** Bodies for a JSON route: near-valid mutations (weighted), pure junk, invalid JSON text, wrong kinds. */
function jsonBodies(
	template: Record<string, unknown>,
	spoil: (o: Record<string, unknown>) => fc.Arbitrary<Record<string, unknown>>
): fc.Arbitrary<Sent> {
	return fc.oneof(
		{ arbitrary: mutated(template, spoil).map(jsonOf), weight: 4 },
		{ arbitrary: junk.map(jsonOf), weight: 2 },
		{ arbitrary: invalidJsonText.map((t) => ({ contentType: 'application/json', body: t })), weight: 2 },
		{ arbitrary: wrongKindBody, weight: 1 },
		{ arbitrary: fc.constant<Sent>({}), weight: 1 }
	);
}

/** Bodies sent to routes that read none: must not matter. */
const ignoredBody = fc.oneof(fc.constant<Sent>({}), junk.map(jsonOf), wrongKindBody);

/** Lot ids: seeded ones (the route's own choice), unknown uuids, malformed ones. */
const idFrom = (...known: string[]) =>
	fc.oneof({ arbitrary: fc.constantFrom(...known), weight: 3 }, { arbitrary: fc.uuid(), weight: 1 }, { arbitrary: badUuid, weight: 1 });
const seg = (s: string) => encodeURIComponent(s);

function queryString(keys: string[]): fc.Arbitrary<string> {
	// At most 250 characters (1.5 kB encoded) per value: beyond Node's 16 kB header limit its HTTP parser answers a bare 431 before the app runs.
	const value = fc.oneof(
		badNumber.map((v) => (typeof v === 'string' ? v : (JSON.stringify(v) ?? ''))),
		overlong.map((v) => v.slice(0, 250)),
		fc.uuid(),
		badUuid,
		fc.string({ maxLength: 20 })
	);
	const pairs = fc.array(
		fc.tuple(
			fc.oneof({ arbitrary: fc.constantFrom(...keys, 'x'), weight: 4 }, { arbitrary: fc.string({ maxLength: 10 }), weight: 1 }),
			value
		),
		{ maxLength: 6 }
	);
	const raw = fc.constantFrom('%', '%E0%A4%A', 'a=%ZZ', '&&&=&', 'limit=1&limit=2&limit=abc', '=', '?'.repeat(50));
	return fc.oneof({ arbitrary: pairs.map((p) => new URLSearchParams(p).toString()), weight: 4 }, { arbitrary: raw, weight: 1 });
}

// ---------------------------------------------------------------- the route table

const CHEM_TEMPLATE = { chemistry: 'NMC', temperature_c: 25 };
const fivePoints = [0.1, 0.3, 0.5, 0.7, 0.9].map((soc) => ({ soc, ocv_v: 3.4 + soc * 0.7 }));
/** Five points whose OCV falls between 50 % and 70 %: every part-model form refuses them, so no variant of the body stores a version. */
const dippingPoints = fivePoints.map((p) => (p.soc === 0.7 ? { ...p, ocv_v: 3.7 } : p));

const pure = () => true;
const isPreview = (url: string, sent: Sent) =>
	/[?&]preview=true(&|$)/.test(url) || (sent.body instanceof FormData && sent.body.get('preview') === 'true');

function table(): Entry[] {
	const A = ids.lotA;
	const anyLot = idFrom(A.accepted, A.on_hold, A.rejected, A.in_inspection, ids.lotB.accepted);
	const get = (route: string, who: Who, path: fc.Arbitrary<string>, queryKeys: string[] = []): Entry => ({
		route,
		method: 'GET',
		who,
		input: 'query',
		path,
		queryKeys
	});
	const lotPath = (suffix: string, lots = anyLot) => lots.map((id) => `/lots/${seg(id)}${suffix}`);
	const readingRow = { serial: 'SN-BAD-1', ocv_v: 3.6, temperature_c: 25 };
	const importFile = garbageFile;
	const importMapping = fc.oneof(
		fc.constant(undefined),
		junk,
		invalidJsonText,
		// Valid mapping whose temperature column (9) random bytes will not fill: every row is refused.
		fc.constant({ serial: 0, ocv: 1, temperature: 9, first_row: 1 }),
		mutated({ serial: 0, ocv: 1, temperature: 9 }, spoilWith('ocv', badNumber))
	);
	return [
		get('chemistries', 'inspector', fc.constant('/chemistries')),
		get(
			'chemistries/[code]/curve',
			'buyer',
			fc
				.oneof(
					fc.constantFrom('NMC', 'lfp', 'XX', ''),
					overlong.map((v) => v.slice(0, 500))
				)
				.map((c) => `/chemistries/${seg(c)}/curve`),
			['temperature_c', 'points']
		),
		{
			route: 'electrochem/cell-potential',
			method: 'POST',
			who: 'buyer',
			input: 'json',
			allows2xx: pure,
			path: fc.constant('/electrochem/cell-potential'),
			body: jsonBodies({ e0_v: 1.1, n: 2, temperature_c: 25, q: 1 }, spoilWith('n', fc.oneof(badNumber, fc.constantFrom(0, 1.5, -2))))
		},
		get('health', 'public', fc.constant('/health')),
		get('lots.xlsx', 'buyer', fc.constant('/lots.xlsx'), ['status', 'supplier_id']),
		get('lots', 'buyer', fc.constant('/lots'), ['status', 'supplier_id', 'part_id', 'search', 'limit', 'cursor']),
		{
			route: 'lots',
			method: 'POST',
			who: 'buyer',
			input: 'json',
			path: fc.constant('/lots'),
			body: jsonBodies(
				{
					po_number: 'PO-BAD',
					supplier_id: ids.supplier.a,
					part_id: ids.partA,
					quantity: 100,
					declared_soc: 0.3,
					transport: 'road',
					un_number: 'UN3480'
				},
				spoilWith('quantity', fc.oneof(badNumber, fc.constantFrom(0, -5, 10_000_001, 2.5)))
			)
		},
		get('lots/[id=uuid]', 'quality', lotPath('')),
		{
			route: 'lots/[id=uuid]/decision',
			method: 'POST',
			who: 'qualitySession',
			input: 'json',
			path: lotPath('/decision', idFrom(A.on_hold, ids.lotB.on_hold)),
			// The password is wrong in every body (junk never is the demo password), so nothing can be decided.
			body: jsonBodies({ disposition: 'release', reason: 'Released after review', password: 'not-the-password' }, (o) =>
				fc.oneof(
					fc.constant(o),
					spoilWith('decision', fc.oneof(junk, fc.constantFrom('release', 'ACCEPT', '')))(o),
					spoilWith('disposition', fc.oneof(junk, fc.constantFrom('accept', 'RELEASE', '', 'rework')))(o),
					spoilWith('due_date', fc.oneof(junk, fc.constantFrom('tomorrow', '2026-13-45', '05.12.2026')))(o)
				)
			)
		},
		{
			route: 'lots/[id=uuid]/decision/challenge',
			method: 'POST',
			who: 'qualitySession',
			input: 'json',
			path: lotPath('/decision/challenge', idFrom(A.on_hold, ids.lotB.on_hold)),
			// The decision is always spoiled, so no challenge row is ever issued (the snapshot stays as it was).
			body: jsonBodies({ decision: 'reject' }, spoilWith('decision', fc.oneof(junk, fc.constantFrom('release', 'ACCEPT', ''))))
		},
		get('lots/[id=uuid]/decisions', 'quality', lotPath('/decisions')),
		get('lots/[id=uuid]/documents', 'buyer', lotPath('/documents')),
		{
			route: 'lots/[id=uuid]/documents',
			method: 'POST',
			who: 'buyer',
			input: 'multipart',
			path: lotPath('/documents', idFrom(A.awaiting_arrival, A.in_inspection, A.cancelled)),
			body: fc.oneof(
				{
					arbitrary: fc
						.tuple(fc.oneof(fc.constantFrom('coc', 'sds', 'other', 'un38_3_summary'), fc.string({ maxLength: 20 })), importFile)
						.map(([kind, f]) => multipartOf({ kind }, f)),
					weight: 4
				},
				{ arbitrary: junk.map((kind) => multipartOf({ kind }, null)), weight: 1 },
				{ arbitrary: wrongKindBody, weight: 1 },
				{ arbitrary: junk.map(jsonOf), weight: 1 }
			)
		},
		get(
			'lots/[id=uuid]/documents/[docId=uuid]',
			'buyer',
			fc.tuple(anyLot, idFrom(ids.documentA, ids.documentB)).map(([l, d]) => `/lots/${seg(l)}/documents/${seg(d)}`)
		),
		get('lots/[id=uuid]/evaluation', 'inspector', lotPath('/evaluation'), ['detail']),
		{
			route: 'lots/[id=uuid]/imports',
			method: 'POST',
			who: 'inspector',
			input: 'multipart',
			allows2xx: isPreview,
			path: fc
				.tuple(
					lotPath('/imports', idFrom(A.in_inspection, A.awaiting_arrival, A.accepted)),
					fc.constantFrom('', '?preview=true', '?preview=1', '?preview=%00')
				)
				.map(([p, q]) => p + q),
			body: fc.oneof(
				{
					arbitrary: fc
						.tuple(importFile, importMapping, fc.constantFrom(undefined, 'true', 'yes'))
						.map(([f, mapping, preview]) => multipartOf({ mapping, preview }, f)),
					weight: 4
				},
				{ arbitrary: importMapping.map((mapping) => multipartOf({ mapping }, null)), weight: 1 },
				{ arbitrary: wrongKindBody, weight: 1 },
				{ arbitrary: junk.map(jsonOf), weight: 1 }
			)
		},
		get('lots/[id=uuid]/quarantine-tag.pdf', 'quality', lotPath('/quarantine-tag.pdf')),
		get('lots/[id=uuid]/readings.xlsx', 'inspector', lotPath('/readings.xlsx')),
		get('lots/[id=uuid]/readings', 'inspector', lotPath('/readings')),
		{
			route: 'lots/[id=uuid]/readings',
			method: 'POST',
			who: 'inspector',
			input: 'json',
			path: lotPath('/readings', idFrom(A.in_inspection, A.awaiting_arrival, A.accepted)),
			body: fc.oneof(
				{ arbitrary: mutated(readingRow, spoilWith('ocv_v', badNumber)).map((row) => jsonOf({ readings: [readingRow, row] })), weight: 3 },
				{
					arbitrary: fc
						.constantFrom<unknown>({ readings: [] }, { readings: {} }, { readings: null }, { reading: [readingRow] }, [readingRow], {
							readings: Array.from({ length: 10_001 }, (_, i) => ({ ...readingRow, serial: `S${i}` }))
						})
						.map(jsonOf),
					weight: 1
				},
				{
					arbitrary: jsonBodies(
						{ readings: [] },
						spoilWith(
							'readings',
							fc.oneof(junk, fc.constant([])).map((r) => (Array.isArray(r) ? [...r, { ocv_v: 'NaN' }] : r))
						)
					),
					weight: 3
				}
			)
		},
		{
			route: 'lots/[id=uuid]/readings/[readingId]',
			method: 'PATCH',
			who: 'inspector',
			input: 'json',
			path: fc
				.tuple(
					lotPath('', idFrom(A.accepted, A.rejected)),
					fc.oneof(
						fc.constant(String(ids.readingOfAcceptedA)),
						fc.constantFrom('abc', '-1', '0', '1e3', '99999999999999999999', '0x10', '1.5', ' 1'),
						fc.nat().map(String)
					)
				)
				.map(([l, r]) => `${l}/readings/${seg(r)}`),
			body: jsonBodies({ ocv_v: 3.61, reason: 'typed wrongly' }, (o) => fc.constant(o))
		},
		get('lots/[id=uuid]/report.pdf', 'buyer', lotPath('/report.pdf')),
		{
			route: 'lots/[id=uuid]/submit',
			method: 'POST',
			who: 'inspector',
			input: 'none',
			path: lotPath('/submit', idFrom(A.accepted, A.on_hold, A.cancelled, A.awaiting_arrival)),
			body: ignoredBody
		},
		get('me', 'admin', fc.constant('/me')),
		get('models', 'buyer', fc.constant('/models'), ['chemistry', 'status']),
		{
			route: 'models',
			method: 'POST',
			who: 'quality',
			input: 'json',
			path: fc.constant('/models'),
			body: jsonBodies({ ...CHEM_TEMPLATE, points: dippingPoints, label: 'bad input' }, (o) =>
				fc.constant({ ...o, points: Array.isArray(o.points) ? (o.points as unknown[]).slice(0, 5) : o.points })
			)
		},
		get(
			'models/[id=uuid]',
			'quality',
			idFrom(ids.libraryModel).map((id) => `/models/${seg(id)}`)
		),
		{
			route: 'models/[id=uuid]/approve',
			method: 'POST',
			who: 'quality',
			input: 'none',
			path: idFrom(ids.libraryModel).map((id) => `/models/${seg(id)}/approve`),
			body: ignoredBody
		},
		get('notices', 'supplierA', fc.constant('/notices'), ['lot_id']),
		{
			route: 'notices/[id=uuid]/acknowledge',
			method: 'POST',
			who: 'supplierA',
			input: 'none',
			path: fc.oneof(fc.constant(ids.noticeB), fc.uuid(), badUuid).map((id) => `/notices/${seg(id)}/acknowledge`),
			body: ignoredBody
		},
		{
			route: 'ocv/evaluate',
			method: 'POST',
			who: 'inspector',
			input: 'json',
			allows2xx: pure,
			path: fc.constant('/ocv/evaluate'),
			body: jsonBodies({ chemistry: 'NMC', cells_in_series: 1, declared_soc: 0.3, readings: [{ ocv_v: 3.6, temperature_c: 25 }] }, (o) =>
				badNumber.map((v) => ({ ...o, readings: [...(Array.isArray(o.readings) ? o.readings : []), { ocv_v: v, temperature_c: 25 }] }))
			)
		},
		{
			route: 'ocv/fit',
			method: 'POST',
			who: 'quality',
			input: 'json',
			allows2xx: pure,
			path: fc.constant('/ocv/fit'),
			body: jsonBodies({ ...CHEM_TEMPLATE, points: fivePoints }, (o) =>
				fc.constant({ ...o, points: Array.isArray(o.points) ? (o.points as unknown[]).slice(0, 5) : o.points })
			)
		},
		get('parts', 'inspector', fc.constant('/parts'), ['supplier_id', 'chemistry', 'search']),
		get('sampling/plan', 'inspector', fc.constant('/sampling/plan'), ['lot_size', 'aql', 'level', 'severity']),
		get('suppliers', 'buyer', fc.constant('/suppliers')),
		get(
			'suppliers/[id=uuid]/scorecard',
			'quality',
			idFrom(ids.supplier.a, ids.supplier.b).map((id) => `/suppliers/${seg(id)}/scorecard`),
			['part_id', 'period', 'from', 'to']
		),
		get(
			'suppliers/[id=uuid]/scorecard.xlsx',
			'quality',
			idFrom(ids.supplier.a, ids.supplier.b).map((id) => `/suppliers/${seg(id)}/scorecard.xlsx`),
			['part_id', 'period', 'from', 'to']
		),
		get(
			'suppliers/[id=uuid]/scorecard.pdf',
			'quality',
			idFrom(ids.supplier.a, ids.supplier.b).map((id) => `/suppliers/${seg(id)}/scorecard.pdf`),
			['part_id', 'period', 'from', 'to']
		),
		get('openapi.json', 'public', fc.constant('/openapi.json')),
		get('readings', 'buyer', fc.constant('/readings'), ['serial', 'serial_prefix', 'limit']),
		get('webhooks', 'admin', fc.constant('/webhooks')),
		{
			route: 'webhooks',
			method: 'POST',
			who: 'admin',
			input: 'json',
			path: fc.constant('/webhooks'),
			body: jsonBodies(
				{ url: 'http://127.0.0.1:9/bad-input', events: ['lot.decided'] },
				spoilWith(
					'url',
					fc.oneof(
						fc.constantFrom('', 'ftp://127.0.0.1/x', 'javascript:alert(1)', 'http://user:pw@127.0.0.1/x', 'not a url', null, 7, []),
						overlong.map((v) => `http://127.0.0.1/${v}`)
					)
				)
			)
		},
		// No endpoint is registered in this database: every id is unknown, malformed or garbage.
		get(
			'webhooks/[id=uuid]',
			'admin',
			idFrom(randomUUID()).map((id) => `/webhooks/${seg(id)}`)
		),
		{
			route: 'webhooks/[id=uuid]',
			method: 'PATCH',
			who: 'admin',
			input: 'json',
			path: idFrom(randomUUID()).map((id) => `/webhooks/${seg(id)}`),
			body: jsonBodies({ paused: true }, spoilWith('paused', fc.constantFrom('true', 1, null, 'yes', [], {})))
		},
		{
			route: 'webhooks/[id=uuid]',
			method: 'DELETE',
			who: 'admin',
			input: 'none',
			path: idFrom(randomUUID()).map((id) => `/webhooks/${seg(id)}`),
			body: ignoredBody
		},
		get(
			'webhooks/[id=uuid]/deliveries',
			'admin',
			idFrom(randomUUID()).map((id) => `/webhooks/${seg(id)}/deliveries`)
		),
		{
			route: 'webhooks/[id=uuid]/deliveries/[deliveryId=uuid]/resend',
			method: 'POST',
			who: 'admin',
			input: 'none',
			path: fc.tuple(idFrom(randomUUID()), idFrom(randomUUID())).map(([id, d]) => `/webhooks/${seg(id)}/deliveries/${seg(d)}/resend`),
			body: ignoredBody
		},
		{
			route: 'webhooks/[id=uuid]/rotate-secret',
			method: 'POST',
			who: 'admin',
			input: 'none',
			path: idFrom(randomUUID()).map((id) => `/webhooks/${seg(id)}/rotate-secret`),
			body: ignoredBody
		}
	];
}

// ---------------------------------------------------------------- sending and judging

const garbageCreds = fc.constantFrom<Record<string, string>>(
	{},
	{ authorization: 'Bearer garbage' },
	{ authorization: `Bearer rv_${'A'.repeat(43)}` },
	{ authorization: 'Basic Zm9vOmJhcg==' },
	{ authorization: `Bearer ${'x'.repeat(8000)}` },
	{ cookie: 'authjs.session-token=garbage' },
	{ cookie: `__Secure-authjs.session-token=${'e'.repeat(500)}` }
);

interface Outcome {
	status: number;
	contentType: string;
	text: string;
}

async function send(method: string, url: string, headers: Record<string, string>, sent: Sent): Promise<Outcome> {
	const h: Record<string, string> = { ...headers };
	if (sent.contentType) h['content-type'] = sent.contentType;
	const once = async () => {
		const res = await fetch(url, {
			method,
			headers: h,
			body: method === 'GET' ? undefined : (sent.body as BodyInit | undefined),
			redirect: 'manual'
		});
		return { status: res.status, contentType: res.headers.get('content-type') ?? '', text: await res.text() };
	};
	try {
		return await once();
	} catch (error) {
		// Node closes a keep-alive connection after answering a request whose body it did not read (an
		// early 401/404/413); fetch may have reused that socket already. One retry on a fresh connection;
		// a second reset is a real failure.
		if (!/ECONNRESET|other side closed|socket/i.test(String((error as Error & { cause?: unknown }).cause ?? error))) throw error;
		counted.resets += 1;
		return await once();
	}
}

function judge(entry: Entry, anonymous: boolean, out: Outcome, what: string, harmless2xx: boolean) {
	expect(out.status, `5xx from ${what}: ${out.text.slice(0, 300)}`).toBeLessThan(500);
	if ((entry.input !== 'query' && !harmless2xx) || anonymous) {
		// A write with bad input, or any call without valid credentials, is refused.
		if (!(['health', 'openapi.json'].includes(entry.route) && anonymous))
			expect(out.status, `not refused: ${what} → ${out.text.slice(0, 300)}`).toBeGreaterThanOrEqual(400);
	}
	if (out.status >= 400) {
		expect(out.contentType, `${what}`).toMatch(/^application\/json/);
		const body = JSON.parse(out.text);
		expect(body, `${what} → ${out.text.slice(0, 300)}`).toMatchObject({ error: { code: expect.any(String), message: expect.any(String) } });
	}
}

const describeSent = (s: Sent) =>
	s.body instanceof FormData
		? `multipart{${[...s.body.entries()].map(([k, v]) => (typeof v === 'string' ? `${k}=${v.slice(0, 60)}` : `${k}=<file ${v.name.slice(0, 40)} ${v.size} B>`)).join(', ')}}`
		: `${s.contentType ?? '-'} ${typeof s.body === 'string' ? s.body.slice(0, 200) : s.body ? `<${s.body.length} bytes>` : ''}`;

const RUNS_PER_ENTRY = 12;
const STRICT_RUNS_PER_FIELD = 6;
let before: DbSnapshot;
const counted = { calls: 0, resets: 0, byStatus: {} as Record<number, number> };

beforeAll(async () => {
	db = await freshDatabase('bad_input');
	app = await startApp({ databaseUrl: db.url });
	ids = await seedIds(db.url);
	const bearer = async (email: string) => ({ authorization: `Bearer ${await tokenFor(db.url, email)}` });
	creds = {
		buyer: await bearer('buyer@kestrel-mobility.example'),
		inspector: await bearer('inspector@kestrel-mobility.example'),
		quality: await bearer('quality@kestrel-mobility.example'),
		// Quality decisions are e-signed in an interactive session (tokens are refused before the body is read).
		qualitySession: { cookie: await signInApi(app.url, 'quality2@kestrel-mobility.example'), origin: app.url },
		supplierA: await bearer('supplier@voltaria-cells.example'),
		admin: await bearer('admin@kestrel-mobility.example')
	};
	before = await snapshot(db.url);
}, 120_000);

afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

describe('bad input to every JSON API route', () => {
	it('has a table entry for every route file and method under src/routes/api/v1', () => {
		const onDisk = apiRouteFiles().flatMap((f) => f.methods.map((m) => `${m} ${f.route}`));
		const covered = table().map((e) => `${e.method} ${e.route}`);
		expect(onDisk.length).toBeGreaterThan(30);
		expect(
			onDisk.filter((r) => !covered.includes(r)),
			'routes without a bad-input entry'
		).toEqual([]);
		expect(
			covered.filter((r) => !onDisk.includes(r)),
			'entries for routes that no longer exist'
		).toEqual([]);
	});

	it('answers generated bad input without a 5xx, in the error shape, refusing every write', async () => {
		for (const entry of table()) {
			const query = queryString(entry.queryKeys ?? []);
			const body = entry.body ?? fc.constant<Sent>({});
			const who = fc.oneof(
				{ arbitrary: fc.constant<Record<string, string> | null>(null), weight: 6 },
				{ arbitrary: garbageCreds, weight: 1 }
			);
			const run = await fc.check(
				fc.asyncProperty(entry.path, query, body, who, async (path, q, sent, garbage) => {
					const anonymous = garbage !== null || entry.who === 'public';
					const headers = garbage ?? (entry.who === 'public' ? {} : creds[entry.who]);
					const url = `${app.url}/api/v1${path}${q ? (path.includes('?') ? '&' : '?') + q : ''}`;
					const what = `${entry.method} ${url.slice(app.url.length, app.url.length + 300)} [${garbage ? 'garbage credentials' : entry.who}] ${describeSent(sent)}`;
					const out = await send(entry.method, url, headers, sent).catch((e: Error & { cause?: unknown }) => {
						throw new Error(
							`${what}: ${e.message} ${String(e.cause ?? '')}; app exit ${app.process.exitCode ?? app.process.signalCode}; app log: ${app.output().slice(-1500)}`
						);
					});
					counted.calls += 1;
					counted.byStatus[out.status] = (counted.byStatus[out.status] ?? 0) + 1;
					judge(entry, anonymous, out, what, entry.allows2xx?.(url, sent) ?? false);
				}),
				{ numRuns: RUNS_PER_ENTRY, endOnFailure: true }
			);
			// Our own short report: the generated values can be 100 kB long.
			if (run.failed)
				throw new Error(
					`${entry.method} ${entry.route} (seed ${run.seed}, path ${run.counterexamplePath}): ${String((run.errorInstance as Error)?.message ?? run.errorInstance).slice(0, 1500)} ${String((run.errorInstance as Error & { cause?: unknown })?.cause ?? '')}`
				);
		}
	}, 240_000);

	it('refuses NUL, control characters, exponents and comma decimals in every text and number field, naming the field', async () => {
		// The fields come from the routes' zod schemas (strict-fields.ts), so a new field is covered too.
		const entries = strictFieldEntries(ids);
		expect(entries.reduce((n, e) => n + e.fields.length, 0)).toBeGreaterThan(40);
		for (const entry of entries) {
			for (const field of entry.fields) {
				const run = await fc.check(
					fc.asyncProperty(strictFieldValue(field.kind, { query: entry.method === 'GET' }), async (value) => {
						const sent = entry.send(field.name, value);
						const url = `${app.url}/api/v1${sent.path}`;
						const what = `${entry.method} ${sent.path.slice(0, 200)} field ${field.name} (${field.kind}) = ${JSON.stringify(value).slice(0, 80)}`;
						const out = await send(entry.method, url, creds[entry.who], sent);
						counted.calls += 1;
						counted.byStatus[out.status] = (counted.byStatus[out.status] ?? 0) + 1;
						expect([400, 422], `${what} → ${out.status} ${out.text.slice(0, 300)}`).toContain(out.status);
						expect(out.contentType, what).toMatch(/^application\/json/);
						const { error } = JSON.parse(out.text) as { error: { message: string; issues?: Array<{ path: string }> } };
						const named = entry.names(field.name);
						const paths = (error.issues ?? []).map((i) => i.path);
						expect(
							paths.some((p) => named.includes(p)) || named.some((n) => error.message.includes(`\`${n}\``)),
							`${what}: not named in ${out.text.slice(0, 300)}`
						).toBe(true);
					}),
					{ numRuns: STRICT_RUNS_PER_FIELD, endOnFailure: true }
				);
				if (run.failed)
					throw new Error(
						`${entry.method} ${entry.route} ${field.name} (seed ${run.seed}): ${String((run.errorInstance as Error)?.message ?? run.errorInstance).slice(0, 1500)}`
					);
			}
		}
	}, 240_000);

	it('sent at least 200 inputs and left the database as it was', async () => {
		expect(counted.calls).toBeGreaterThanOrEqual(200);
		const after = await snapshot(db.url);
		expect(after.counts).toEqual(before.counts);
		expect(after.lotsMd5).toBe(before.lotsMd5);
		expect(after.readingsMd5).toBe(before.readingsMd5);
		expect(after.audit).toBeGreaterThanOrEqual(before.audit);
		console.info(
			`[bad-input] ${counted.calls} calls (${counted.resets} retried after a connection reset); statuses ${JSON.stringify(counted.byStatus)}`
		);
	});
});
