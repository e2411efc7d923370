/**
 * The field building blocks every schema uses (src/lib/schemas/fields.ts) and the strict number
 * reading of form posts (src/lib/server/forms.ts). Control characters per Unicode's general
 * category Cc (C0, DEL, C1) plus the bidirectional formatting characters of UAX #9.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { z } from 'zod';
import { zod4 } from 'sveltekit-superforms/adapters';
import { superValidate } from 'sveltekit-superforms';
import {
	decimal,
	EARLIEST_INSTANT,
	fromText,
	hasControlCharacters,
	plausibleInstant,
	strictNumberFromText,
	text,
	wholeNumber,
	wholeNumberParam
} from '../../../src/lib/schemas/fields';
import { numberFields, strictNumbers, validateForm } from '../../../src/lib/server/forms';
import { brokenValueAt, jsonSyntaxIssues } from '../../../src/lib/server/http';
import { lotFormSchema } from '../../../src/lib/schemas/lot';

const CONTROLS = [...Array.from({ length: 32 }, (_, i) => i), ...Array.from({ length: 33 }, (_, i) => 0x7f + i)].map((c) =>
	String.fromCharCode(c)
);
const BIDI = ['\u202A', '\u202B', '\u202C', '\u202D', '\u202E', '\u2066', '\u2067', '\u2068', '\u2069'];

describe('text()', () => {
	const oneLine = text().trim().max(40);
	const multiLine = text({ multiline: true }).trim().max(400);

	it('refuses every C0/C1 control, DEL and direction override anywhere in a one-line field', () => {
		for (const c of [...CONTROLS, ...BIDI, '\u2028', '\u2029']) {
			for (const value of [`${c}`, `PO${c}1`, `PO-1${c}`]) expect(oneLine.safeParse(value).success, JSON.stringify(value)).toBe(false);
		}
	});

	it('keeps tab and line breaks in multi-line text but refuses NUL and the other controls', () => {
		expect(multiLine.safeParse('line one\r\nline two\tcolumn').success).toBe(true);
		for (const c of [...CONTROLS, ...BIDI].filter((c) => !'\t\n\r'.includes(c))) {
			expect(multiLine.safeParse(`reason ${c} here`).success, JSON.stringify(c)).toBe(false);
		}
	});

	it('accepts ordinary text of any script, and says what to remove', () => {
		fc.assert(
			fc.property(fc.string({ unit: 'grapheme', maxLength: 30 }), (s) => {
				const clean = [...s].filter((ch) => !hasControlCharacters(ch)).join('');
				expect(oneLine.safeParse(clean).success).toBe(clean.trim().length <= 40);
			})
		);
		expect(oneLine.safeParse('Kühlakku — 電池 ✓').success).toBe(true);
		const refused = z.object({ po_number: oneLine }).safeParse({ po_number: 'PO\u00001' });
		expect(refused.success).toBe(false);
		expect(refused.error!.issues[0]).toMatchObject({ path: ['po_number'], message: expect.stringMatching(/control characters/) });
	});

	it('still refuses what is not text with the given message', () => {
		const r = text({ error: 'Enter the purchase order number' }).safeParse(12);
		expect(r.error?.issues[0].message).toBe('Enter the purchase order number');
	});
});

describe('numbers written as text', () => {
	it('reads plain whole numbers and decimals', () => {
		expect(strictNumberFromText('12', { whole: true })).toBe(12);
		expect(strictNumberFromText(' -3 ', { whole: true })).toBe(-3);
		expect(strictNumberFromText('0.25')).toBe(0.25);
		expect(strictNumberFromText('.5')).toBe(0.5);
		expect(strictNumberFromText('3.')).toBe(3);
	});

	it.each([
		'1e7',
		'1E7',
		'1,5',
		'1e309',
		'12abc',
		'0x10',
		'0b1',
		'',
		' ',
		'Infinity',
		'NaN',
		'1_000',
		'١٢',
		'1.5.1',
		'+',
		'\u00001',
		'1\u0000'
	])('refuses %j', (raw) => {
		expect(strictNumberFromText(raw)).toBeUndefined();
		expect(strictNumberFromText(raw, { whole: true })).toBeUndefined();
	});

	it('refuses a decimal where a whole number belongs', () => {
		expect(strictNumberFromText('1.5', { whole: true })).toBeUndefined();
		expect(strictNumberFromText('10.0', { whole: true })).toBeUndefined();
	});

	it('agrees with Number() on every plainly written number (property)', () => {
		fc.assert(
			fc.property(fc.integer({ min: -1e9, max: 1e9 }), fc.nat({ max: 999_999 }), (whole, fraction) => {
				expect(strictNumberFromText(String(whole), { whole: true })).toBe(whole);
				const decimalText = `${whole}.${String(fraction).padStart(6, '0')}`;
				expect(strictNumberFromText(decimalText)).toBe(Number(decimalText));
			})
		);
	});

	it('fromText gives a query parameter its number or the number schema’s own refusal', () => {
		const limit = fromText(wholeNumber('limit must be a whole number').min(1).max(100), { whole: true });
		expect(limit.parse('25')).toBe(25);
		expect(limit.parse(25)).toBe(25);
		for (const raw of ['1e1', '2,5', '0x10', '', '12abc']) {
			expect(limit.safeParse(raw).error?.issues[0].message, raw).toBe('limit must be a whole number');
		}
		const aql = fromText(decimal('aql must be a number').positive());
		expect(aql.parse('0.65')).toBe(0.65);
		expect(aql.safeParse('6,5').success).toBe(false);
		expect(aql.safeParse('6.5e-1').success).toBe(false);
	});

	it('wholeNumber refuses fractions, NaN, infinities and unsafe integers', () => {
		const quantity = wholeNumber('Enter the number of units as a whole number');
		for (const v of [1.5, Number.NaN, Infinity, -Infinity, 2 ** 53, '12']) expect(quantity.safeParse(v).success, String(v)).toBe(false);
		expect(quantity.parse(1e7)).toBe(10_000_000);
	});

	it('wholeNumberParam reads only plain positive ids', () => {
		expect(wholeNumberParam('42')).toBe(42);
		for (const raw of ['0', '-1', '+1', '1e3', '0x10', ' 1', '1.0', '', '9999999999999999']) expect(wholeNumberParam(raw), raw).toBeNull();
	});
});

describe('plausibleInstant()', () => {
	const measuredAt = plausibleInstant('measured_at');
	it('accepts times from 2000 to a day ahead and refuses the rest, naming the field', () => {
		expect(measuredAt.safeParse('2000-01-01T00:00:00Z').success).toBe(true);
		expect(measuredAt.safeParse(new Date(Date.now() + 3_600_000).toISOString()).success).toBe(true);
		const early = measuredAt.safeParse('1999-12-31T23:59:59Z');
		expect(early.error?.issues.map((i) => i.message)).toEqual(['measured_at is before the year 2000']);
		const ahead = measuredAt.safeParse(new Date(Date.now() + 2 * 86_400_000).toISOString());
		expect(ahead.error?.issues.map((i) => i.message)).toEqual(['measured_at is more than a day in the future']);
		expect(measuredAt.safeParse('0001-01-01T00:00:00Z').success).toBe(false);
		expect(measuredAt.safeParse('2026-03-01 10:00').success).toBe(false);
		expect(EARLIEST_INSTANT).toBe(Date.parse('2000-01-01T00:00:00Z'));
	});
});

describe('form posts (validateForm)', () => {
	const post = (fields: Record<string, string>) => {
		const body = new FormData();
		for (const [k, v] of Object.entries(fields)) body.set(k, v);
		return { request: new Request('http://x.test/lots/new', { method: 'POST', body }) };
	};
	const lot = {
		po_number: 'PO-1',
		supplier_id: '6f1c1a9e-3c55-4d8e-9a57-2a4f7a1f0b11',
		part_id: '0b7f2f62-9f3e-4b0a-8a1e-5d2c6c3b9e44',
		declared_soc_pct: '30',
		transport: 'road',
		un_number: 'UN3480'
	};

	it('finds the number fields of a form schema from its JSON schema', () => {
		expect([...numberFields(zod4(lotFormSchema).jsonSchema as never)]).toEqual([
			['quantity', true],
			['declared_soc_pct', false]
		]);
	});

	it.each(['1e7', '1,5', '1e309', '12abc', '0x10', '1.5'])('refuses quantity %j with the quantity field’s message', async (quantity) => {
		const form = await validateForm(post({ ...lot, quantity }), zod4(lotFormSchema));
		expect(form.valid).toBe(false);
		expect(form.errors.quantity).toEqual(['Enter the number of units as a whole number']);
	});

	it('accepts a plainly written quantity and decimal SOC', async () => {
		const form = await validateForm(post({ ...lot, quantity: '1200', declared_soc_pct: '27.5' }), zod4(lotFormSchema));
		expect(form.errors).toEqual({});
		expect(form.data).toMatchObject({ quantity: 1200, declared_soc_pct: 27.5 });
	});

	it('is needed: superforms alone reads 1e7 and 1,5 as 1', async () => {
		const body = new FormData();
		for (const [k, v] of Object.entries({ ...lot, quantity: '1,5' })) body.set(k, v);
		const loose = await superValidate(body, zod4(lotFormSchema));
		expect(loose.data.quantity).toBe(1);
		expect(strictNumbers(body, numberFields(zod4(lotFormSchema).jsonSchema as never)).get('quantity')).toBe('not-a-number');
	});
});

describe('a broken JSON body names the field where it broke', () => {
	const named = (text: string) => {
		let error: Error | undefined;
		try {
			JSON.parse(text);
		} catch (e) {
			error = e as Error;
		}
		expect(error, text).toBeDefined();
		return jsonSyntaxIssues(text, error!)?.map((i) => i.path);
	};
	it.each([
		['{"po_number":"PO-1","quantity":1,5,"transport":"road"}', 'quantity'],
		['{"quantity":12abc}', 'quantity'],
		['{"declared_soc":.5,"transport":"road"}', 'declared_soc'],
		['{"a":"x,\\"y\\":1","ocv_v":NaN}', 'ocv_v'],
		['{"readings":[{"serial":"A","ocv_v":3,6}]}', 'ocv_v'],
		['{"readings":[{"serial":"A"},{"serial":"B","temperature_c":-}]}', 'temperature_c'],
		['{"quantity":0x10}', 'quantity']
	])('%s → %s', (text, field) => {
		expect(named(text)).toEqual([field]);
	});
	it('finds nothing broken in valid JSON', () => {
		fc.assert(
			fc.property(fc.jsonValue(), (v) => {
				expect(brokenValueAt(JSON.stringify(v))).toBeUndefined();
			})
		);
		expect(brokenValueAt('{ "a" : [ 1 , -2.5e+3 , true , null , { } ] , "b" : "\\"}" }')).toBeUndefined();
	});
});
