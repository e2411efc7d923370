/**
 * The strict-input table of api-bad-input.test.ts: for every JSON body and query string of the API,
 * its text and number fields, read from the route's zod schema (so a new field is covered without
 * editing this file), a valid template, and how to send one field spoilt:
 *  - text fields get NUL or another control character inserted (one refused in one-line and in
 *    multi-line text alike);
 *  - number fields get exponents, comma decimals, hex and trailing junk, as JSON strings and as raw
 *    literals written into the body (`"quantity": 1,5` is broken JSON, `1e309` parses to Infinity).
 * A refusal must be a 400/422 that names the field (an issue path, or the container in backticks).
 */
import fc from 'fast-check';
import { z } from 'zod';
import { lotApiSchema, lotListQuerySchema } from '../../src/lib/schemas/lot';
import { importMappingSchema, planQuerySchema, readingCorrectionSchema, readingSchema } from '../../src/lib/schemas/readings';
import {
	cellPotentialBody,
	curvePoint,
	curveQuery,
	evaluateHeader,
	fitBody,
	modelListQuery,
	saveModelBody
} from '../../src/lib/schemas/electrochem';
import { lotListExportQuery, noticesQuery, overrideRequestSchema } from '../../src/lib/schemas/decision';
import { scorecardQuery } from '../../src/lib/schemas/scorecard';
import { partListQuerySchema } from '../../src/lib/schemas/part';
import type { SeedIds } from './hardening-fixtures';

export type FieldKind = 'text' | 'whole' | 'number';
export interface StrictField {
	name: string;
	kind: FieldKind;
}
/** One spoilt value: a character inserted into the template's text, a JSON value, or a raw JSON literal. */
export interface StrictValue {
	insert?: { char: string; at: number };
	json?: unknown;
	raw?: string;
}
type StrictWho = 'buyer' | 'inspector' | 'quality' | 'qualitySession' | 'supplierA';
export interface StrictEntry {
	route: string;
	method: 'GET' | 'POST' | 'PATCH';
	who: StrictWho;
	fields: StrictField[];
	send: (field: string, value: StrictValue) => { path: string; contentType?: string; body?: string | FormData };
	/** What counts as naming the field: issue paths, or a name the message quotes in backticks. */
	names: (field: string) => string[];
}

/** The top-level text and number fields of a schema (arrays, objects and booleans are left out). */
export function fieldsOf(schema: z.ZodType, skip: string[] = []): StrictField[] {
	type Node = { type?: string | string[]; anyOf?: Node[]; oneOf?: Node[]; properties?: Record<string, Node> };
	const json = z.toJSONSchema(schema, { io: 'output', unrepresentable: 'any' }) as Node;
	const types = (n: Node): string[] => [
		...(Array.isArray(n.type) ? n.type : n.type ? [n.type] : []),
		...[...(n.anyOf ?? []), ...(n.oneOf ?? [])].flatMap(types)
	];
	const fields: StrictField[] = [];
	for (const [name, node] of Object.entries(json.properties ?? {})) {
		if (skip.includes(name)) continue;
		const t = types(node);
		if (t.includes('integer')) fields.push({ name, kind: 'whole' });
		else if (t.includes('number')) fields.push({ name, kind: 'number' });
		else if (t.includes('string')) fields.push({ name, kind: 'text' });
	}
	return fields;
}

/** Refused in every text field, multi-line ones included (tab, LF and CR are allowed there). */
const CONTROL = fc.constantFrom(
	'\u0000',
	'\u0001',
	'\u0007',
	'\u0008',
	'\u000B',
	'\u000C',
	'\u001B',
	'\u001F',
	'\u007F',
	'\u0085',
	'\u009B',
	'\u202E',
	'\u2066'
);
const NUMBER_TEXT = ['1e7', '1E3', '1,5', '12abc', '1e309', '0x10', '١٢', '', 'NaN', '3.6 V'];
const WHOLE_RAW = ['1,5', '12abc', '1e309', '-1e400', 'NaN', 'Infinity', '25e-1', '1.5', '0x10', '1_000'];
const NUMBER_RAW = ['1,5', '3,6', '12abc', '1e309', '-1e400', 'NaN', 'Infinity', '0x10', '3.6.1', '.5'];

export function strictFieldValue(kind: FieldKind, { query = false } = {}): fc.Arbitrary<StrictValue> {
	if (kind === 'text') return fc.record({ char: CONTROL, at: fc.nat({ max: 40 }) }).map((insert) => ({ insert }));
	// In a query every value is text: the raw literals are simply more text there, where a blank
	// means "not given" and `.5` is a plainly written number.
	const texts = query ? NUMBER_TEXT.filter((t) => t !== '') : NUMBER_TEXT;
	const raws = (kind === 'whole' ? WHOLE_RAW : NUMBER_RAW).filter((r) => !(query && r === '.5'));
	return fc.oneof(
		fc.constantFrom(...texts).map((json): StrictValue => ({ json })),
		fc.constantFrom(...raws).map((raw): StrictValue => ({ raw }))
	);
}

const RAW_MARK = '__strict_raw_literal__';

/** The template with one field spoilt; `wrap` places it in the body; raw literals replace a marker in the text. */
function spoiltJson(
	template: Record<string, unknown>,
	field: string,
	value: StrictValue,
	wrap: (o: Record<string, unknown>) => unknown = (o) => o
): string {
	const copy: Record<string, unknown> = { ...template };
	if (value.insert) {
		const base = String(template[field] ?? 'x');
		const at = value.insert.at % (base.length + 1);
		copy[field] = base.slice(0, at) + value.insert.char + base.slice(at);
	} else if (value.raw !== undefined) copy[field] = RAW_MARK;
	else copy[field] = value.json;
	const text = JSON.stringify(wrap(copy));
	return value.raw !== undefined ? text.replace(`"${RAW_MARK}"`, value.raw) : text;
}

function queryValue(base: string | undefined, value: StrictValue): string {
	if (value.insert) {
		const b = base ?? 'x';
		const at = value.insert.at % (b.length + 1);
		return b.slice(0, at) + value.insert.char + b.slice(at);
	}
	return value.raw ?? String(value.json);
}

export function strictFieldEntries(ids: SeedIds): StrictEntry[] {
	const A = ids.lotA;
	const json =
		(path: string) =>
		(template: Record<string, unknown>, wrap?: (o: Record<string, unknown>) => unknown) =>
		(field: string, value: StrictValue) => ({
			path,
			contentType: 'application/json',
			body: spoiltJson(template, field, value, wrap)
		});
	const top = (field: string) => [field];
	const inside = (prefix: string) => (field: string) => [`${prefix}${field}`, field];
	const body = (
		route: string,
		method: 'POST' | 'PATCH',
		who: StrictWho,
		fields: StrictField[],
		send: StrictEntry['send'],
		names = top
	): StrictEntry => ({ route, method, who, fields, send, names });

	const validRow = {
		serial: 'SN-STRICT-1',
		ocv_v: 3.6,
		temperature_c: 25,
		ac_resistance_mohm: 20,
		measured_at: new Date(Date.now() - 3_600_000).toISOString(),
		client_key: 'strict-key-0001'
	};
	const points = [0.1, 0.2, 0.3, 0.5, 0.6, 0.7, 0.9].map((soc) => ({ soc, ocv_v: 3.4 + soc * 0.7 }));
	const mapping = { serial: 0, ocv: 1, ocv_unit: 'V', temperature: 2, default_temperature_c: 25, ac_resistance: 3, time: 4, first_row: 1 };
	const meterCsv = 'serial,ocv,temp,acr,time\nSN-STRICT-9,3.6,25,20,2025-05-01T10:00:00Z\n';

	const queries: Array<[route: string, who: StrictWho, path: string, schema: z.ZodType, base: Record<string, string>]> = [
		[
			'lots',
			'buyer',
			'/lots',
			lotListQuerySchema,
			{ status: 'on_hold', supplier_id: ids.supplier.a, part_id: ids.partA, search: 'PO', serial: 'SN-1', cursor: 'abc' }
		],
		['lots.xlsx', 'buyer', '/lots.xlsx', lotListExportQuery, { status: 'on_hold', supplier_id: ids.supplier.a }],
		[
			'suppliers/[id=uuid]/scorecard',
			'quality',
			`/suppliers/${ids.supplier.a}/scorecard`,
			scorecardQuery,
			{ period: 'custom', from: '2026-01-01', to: '2026-03-31' }
		],
		['parts', 'inspector', '/parts', partListQuerySchema, { supplier_id: ids.supplier.a, chemistry: 'NMC', search: 'VC' }],
		['models', 'buyer', '/models', modelListQuery, { chemistry: 'NMC', status: 'approved' }],
		['notices', 'supplierA', '/notices', noticesQuery, { lot_id: A.accepted }],
		['sampling/plan', 'inspector', '/sampling/plan', planQuerySchema, { level: 'II', severity: 'normal' }],
		['chemistries/[code]/curve', 'buyer', '/chemistries/NMC/curve', curveQuery, {}]
	];

	return [
		body(
			'lots',
			'POST',
			'buyer',
			fieldsOf(lotApiSchema),
			json('/lots')({
				po_number: 'PO-STRICT',
				supplier_id: ids.supplier.a,
				part_id: ids.partA,
				quantity: 100,
				declared_soc: 0.3,
				transport: 'road',
				un_number: 'UN3480',
				expected_arrival: '2026-05-01'
			})
		),
		body(
			'lots/[id=uuid]/readings',
			'POST',
			'inspector',
			fieldsOf(readingSchema),
			json(`/lots/${A.in_inspection}/readings`)(validRow, (row) => ({ readings: [validRow, row] })),
			inside('readings.1.')
		),
		body(
			'lots/[id=uuid]/readings/[readingId]',
			'PATCH',
			'inspector',
			fieldsOf(readingCorrectionSchema),
			json(`/lots/${A.accepted}/readings/${ids.readingOfAcceptedA}`)({
				serial: 'SN-X',
				ocv_v: 3.61,
				temperature_c: 25,
				ac_resistance_mohm: 20,
				reason: 'typed wrongly'
			})
		),
		// The password is a secret, compared and never stored: any character may be in it.
		body(
			'lots/[id=uuid]/decision',
			'POST',
			'qualitySession',
			fieldsOf(overrideRequestSchema, ['password']),
			json(`/lots/${A.on_hold}/decision`)({
				disposition: 'release',
				reason: 'Released after review',
				password: 'not-the-password',
				challenge_id: '00000000-0000-4000-8000-000000000000'
			})
		),
		body(
			'electrochem/cell-potential',
			'POST',
			'buyer',
			fieldsOf(cellPotentialBody),
			json('/electrochem/cell-potential')({ e0_v: 1.1, n: 2, temperature_c: 25, q: 1 })
		),
		body(
			'ocv/evaluate',
			'POST',
			'inspector',
			fieldsOf(evaluateHeader),
			json('/ocv/evaluate')({
				chemistry: 'NMC',
				cells_in_series: 1,
				declared_soc: 0.3,
				meter_accuracy_v: 0.001,
				readings: [{ ocv_v: 3.6, temperature_c: 25 }]
			})
		),
		// The readings of /ocv/evaluate are checked by a loop, not zod (schemas/electrochem.ts): listed here by hand.
		body(
			'ocv/evaluate',
			'POST',
			'inspector',
			[
				{ name: 'ocv_v', kind: 'number' },
				{ name: 'temperature_c', kind: 'number' }
			],
			json('/ocv/evaluate')({ ocv_v: 3.6, temperature_c: 25 }, (r) => ({
				chemistry: 'NMC',
				readings: [{ ocv_v: 3.6, temperature_c: 25 }, r]
			})),
			inside('readings.1.')
		),
		body('ocv/fit', 'POST', 'quality', fieldsOf(fitBody), json('/ocv/fit')({ chemistry: 'NMC', temperature_c: 25, points })),
		body(
			'ocv/fit',
			'POST',
			'quality',
			fieldsOf(curvePoint),
			json('/ocv/fit')(points[6], (p) => ({ chemistry: 'NMC', temperature_c: 25, points: [...points.slice(0, 6), p] })),
			inside('points.6.')
		),
		body(
			'models',
			'POST',
			'quality',
			fieldsOf(saveModelBody),
			json('/models')({ chemistry: 'NMC', temperature_c: 25, points, label: 'strict input' })
		),
		{
			route: 'lots/[id=uuid]/imports',
			method: 'POST',
			who: 'inspector',
			fields: fieldsOf(importMappingSchema),
			send: (field, value) => {
				const form = new FormData();
				form.set('file', new Blob([meterCsv], { type: 'text/csv' }), 'meter.csv');
				form.set('mapping', spoiltJson(mapping, field, value));
				return { path: `/lots/${A.in_inspection}/imports`, body: form };
			},
			names: (field) => [field, 'mapping']
		},
		...queries.map(([route, who, path, schema, base]): StrictEntry => ({
			route,
			method: 'GET',
			who,
			fields: fieldsOf(schema),
			send: (field, value) => ({ path: `${path}?${new URLSearchParams({ [field]: queryValue(base[field], value) })}` }),
			names: top
		}))
	];
}
