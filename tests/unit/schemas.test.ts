/**
 * The shared zod schemas: what the register form, the API and the part forms accept and refuse.
 * UN numbers per the UN Model Regulations' Dangerous Goods List (UN3480 lithium-ion batteries,
 * UN3481 lithium-ion batteries in/with equipment, UN3090 lithium metal batteries, UN3091 lithium
 * metal batteries in/with equipment) — from memory of the list, checked against the codes' pattern.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
	lotApiSchema,
	lotFormSchema,
	lotInputFromApi,
	lotInputFromForm,
	lotListQuerySchema,
	unNumberProblem,
	unNumberGuide,
	packingProblem,
	isLithium,
	isLithiumIon
} from '../../src/lib/schemas/lot';
import { partDescriptiveSchema, partLimitsSchema, partListQuerySchema } from '../../src/lib/schemas/part';
import { contactSchema } from '../../src/lib/schemas/supplier';
import { documentKindSchema, MAX_DOCUMENT_BYTES } from '../../src/lib/schemas/document';

const SUPPLIER = '6f1c1a9e-3c55-4d8e-9a57-2a4f7a1f0b11';
const PART = '0b7f2f62-9f3e-4b0a-8a1e-5d2c6c3b9e44';
const api = {
	po_number: '  PO-4471 ',
	supplier_id: SUPPLIER,
	part_id: PART,
	quantity: 1200,
	declared_soc: 0.3,
	transport: 'air',
	un_number: 'un3480'
};
const paths = (r: { success: boolean; error?: { issues: Array<{ path: PropertyKey[] }> } }) =>
	r.success ? [] : r.error!.issues.map((i) => i.path.join('.'));

describe('lotApiSchema', () => {
	it('accepts a valid body, trims the PO and upper-cases the UN number', () => {
		const parsed = lotApiSchema.parse(api);
		expect(parsed.po_number).toBe('PO-4471');
		expect(parsed.un_number).toBe('UN3480');
		expect(lotInputFromApi(parsed)).toEqual({
			poNumber: 'PO-4471',
			supplierId: SUPPLIER,
			partId: PART,
			quantity: 1200,
			declaredSoc: 0.3,
			transport: 'air',
			lastDirection: 'unknown',
			packing: 'alone',
			unNumber: 'UN3480',
			expectedArrival: null,
			resubmitted: false
		});
	});

	it('resubmitted defaults to false, takes a boolean and refuses text, naming the field (ISO 2859-1:1999 9.3)', () => {
		expect(lotInputFromApi(lotApiSchema.parse({ ...api, resubmitted: true })).resubmitted).toBe(true);
		const bad = lotApiSchema.safeParse({ ...api, resubmitted: 'yes' });
		expect(bad.success).toBe(false);
		expect(bad.error?.issues[0].path).toEqual(['resubmitted']);
	});

	it('last_direction defaults to unknown and refuses other words, naming the field', () => {
		expect(lotApiSchema.parse({ ...api, last_direction: 'after_charge' }).last_direction).toBe('after_charge');
		const bad = lotApiSchema.safeParse({ ...api, last_direction: 'sideways' });
		expect(bad.success).toBe(false);
		expect(bad.error?.issues[0].path).toEqual(['last_direction']);
	});

	it.each([
		['quantity', '1200'],
		['quantity', 'NaN'],
		['quantity', Number.NaN],
		['quantity', -1],
		['quantity', 0],
		['quantity', 1.5],
		['quantity', 10_000_001],
		['quantity', Number.POSITIVE_INFINITY],
		['declared_soc', 'NaN'],
		['declared_soc', Number.NaN],
		['declared_soc', -0.01],
		['declared_soc', 30],
		['transport', 'boat'],
		['supplier_id', 'not-a-uuid'],
		['part_id', 42],
		['po_number', ''],
		['po_number', 'x'.repeat(41)],
		['un_number', 'UN348'],
		['un_number', 'ID8000'],
		['expected_arrival', '2026-13-01'],
		['expected_arrival', '31/03/2026']
	])('refuses %s = %s with an issue on that field', (field, value) => {
		const r = lotApiSchema.safeParse({ ...api, [field]: value });
		expect(r.success).toBe(false);
		expect(paths(r)).toContain(field);
	});

	it('takes the boundaries: quantity 1 and 10,000,000; SOC 0 and 1; a 40-character PO', () => {
		for (const patch of [
			{ quantity: 1 },
			{ quantity: 10_000_000 },
			{ declared_soc: 0 },
			{ declared_soc: 1 },
			{ po_number: 'P'.repeat(40) }
		]) {
			expect(lotApiSchema.safeParse({ ...api, ...patch }).success).toBe(true);
		}
	});

	it('never accepts a non-integer or out-of-range quantity (property)', () => {
		fc.assert(
			fc.property(fc.double({ noNaN: false }), (q) => {
				const ok = lotApiSchema.safeParse({ ...api, quantity: q }).success;
				expect(ok).toBe(Number.isInteger(q) && q >= 1 && q <= 10_000_000);
			})
		);
	});
});

describe('lotFormSchema', () => {
	const form = { ...api, declared_soc: undefined, declared_soc_pct: 30, un_number: 'UN3480', expected_arrival: '' };

	it('takes SOC in percent and stores a fraction', () => {
		const parsed = lotFormSchema.parse(form);
		expect(lotInputFromForm(parsed).declaredSoc).toBe(0.3);
		expect(lotInputFromForm({ ...parsed, declared_soc_pct: 12.5 }).declaredSoc).toBe(0.125);
		expect(lotInputFromForm(parsed).expectedArrival).toBeNull();
	});

	it('asks for the declared SOC when it was left empty, and refuses > 100 %', () => {
		expect(paths(lotFormSchema.safeParse({ ...form, declared_soc_pct: null }))).toEqual(['declared_soc_pct']);
		expect(paths(lotFormSchema.safeParse({ ...form, declared_soc_pct: 101 }))).toEqual(['declared_soc_pct']);
	});
});

describe('packing and UN number (UN Model Regulations Dangerous Goods List, from memory)', () => {
	it('the API takes packing (default alone) and the UN number must fit it', () => {
		expect(
			lotApiSchema.safeParse({
				po_number: 'P',
				supplier_id: SUPPLIER,
				part_id: PART,
				quantity: 1,
				declared_soc: 0.2,
				transport: 'air',
				packing: 'boxed'
			}).success
		).toBe(false);
		expect(packingProblem('UN3480', 'alone')).toBeNull();
		expect(packingProblem('UN3480', 'with_equipment')).toMatch(/UN3481/);
		expect(packingProblem('UN3091', 'alone')).toMatch(/UN3090/);
		expect(packingProblem('UN3552', 'in_equipment')).toBeNull();
	});
});

describe('unNumberProblem', () => {
	it('requires a lithium UN number for lithium chemistries', () => {
		expect(unNumberProblem('NMC', null)).toMatch(/UN3480 or UN3481/);
		expect(unNumberProblem('LFP', '')).toMatch(/needs its UN number/);
		expect(unNumberProblem('NMC', 'UN3480')).toBeNull();
		expect(unNumberProblem('NCA', 'UN3481')).toBeNull();
		expect(unNumberProblem('NMC', 'UN3090')).toMatch(/UN3480 or UN3481/);
		expect(unNumberProblem('LIMNO2', 'UN3090')).toBeNull();
		expect(unNumberProblem('LISOCL2', 'UN3091')).toBeNull();
		expect(unNumberProblem('LIMNO2', 'UN3480')).toMatch(/UN3090 or UN3091/);
	});

	it('asks sodium-ion shipments for UN3551 or UN3552 (UN Model Regulations, 23rd rev. ed., from memory)', () => {
		expect(unNumberProblem('SIB', null)).toMatch(/sodium-ion shipment needs its UN number \(UN3551 or UN3552\)/);
		expect(unNumberProblem('SIB', 'UN3551')).toBeNull();
		expect(unNumberProblem('SIB', 'UN3552')).toBeNull();
		expect(unNumberProblem('SIB', 'UN3480')).toMatch(/UN3551 or UN3552/);
	});

	it('guides the lot form to the number the packing needs (UN Model Regulations, from memory)', () => {
		expect(unNumberGuide('NMC', 'alone')).toMatchObject({ required: true, placeholder: 'UN3480' });
		expect(unNumberGuide('NMC', 'in_equipment')).toMatchObject({ required: true, placeholder: 'UN3481' });
		expect(unNumberGuide('LIMNO2', 'with_equipment').hint).toMatch(/^Required: UN3091 /);
		expect(unNumberGuide('SIB', 'alone').placeholder).toBe('UN3551');
		expect(unNumberGuide('PBACID', 'alone')).toMatchObject({ required: false, hint: 'If the shipment carried one: UN2794 or UN2800.' });
		expect(unNumberGuide(null, 'alone').required).toBe(false);
	});

	it('lets other chemistries go without one, and accepts only the numbers their batteries travel under', () => {
		// UN Model Regulations, Dangerous Goods List (from memory): UN2794 wet, acid; UN2800 wet, non-spillable;
		// UN2795 wet, alkali; UN3496 nickel-metal hydride; alkaline primary cells: none.
		expect(unNumberProblem('PBACID', null)).toBeNull();
		expect(unNumberProblem('NIMH', '')).toBeNull();
		expect(unNumberProblem('PBACID', 'UN2800')).toBeNull();
		expect(unNumberProblem('PBACID', 'UN2794')).toBeNull();
		expect(unNumberProblem('NICD', 'UN2795')).toBeNull();
		expect(unNumberProblem('NIMH', 'UN3496')).toBeNull();
		expect(unNumberProblem('PBACID', 'UN3480')).toMatch(/UN2794 or UN2800, or leave it empty/);
		expect(unNumberProblem('NIMH', 'UN1234')).toMatch(/UN3496, or leave it empty/);
		expect(unNumberProblem('ALKALINE', 'UN3496')).toMatch(/no UN number of their own/);
		expect(unNumberProblem('NIMH', 'U-3496')).toMatch(/four digits/);
	});

	it('classifies the library chemistries', () => {
		expect(['LCO', 'NMC', 'NCA', 'LMO', 'LFP', 'LTO'].every(isLithiumIon)).toBe(true);
		expect(isLithiumIon('LIMNO2')).toBe(false);
		expect(isLithium('LIMNO2')).toBe(true);
		expect(['NIMH', 'NICD', 'PBACID', 'ALKALINE'].some(isLithium)).toBe(false);
	});
});

describe('lotListQuerySchema', () => {
	it('defaults limit to 25 and coerces numeric strings', () => {
		expect(lotListQuerySchema.parse({}).limit).toBe(25);
		expect(lotListQuerySchema.parse({ limit: '100' }).limit).toBe(100);
	});
	it.each([{ limit: '0' }, { limit: '101' }, { limit: 'NaN' }, { limit: '2.5' }, { status: 'lost' }, { supplier_id: 'x' }])(
		'refuses %o',
		(q) => expect(lotListQuerySchema.safeParse(q).success).toBe(false)
	);
});

describe('part schemas', () => {
	const descriptive = {
		supplier_id: SUPPLIER,
		part_number: 'VC-X',
		description: 'Test cell',
		chemistry: 'NMC',
		cells_in_series: 1,
		cells_in_parallel: 1,
		nominal_capacity_ah: 3.5,
		required_documents: ['coc']
	};
	const limits = {
		model_id: PART,
		ocv_min_cell_v: 2.5,
		ocv_max_cell_v: 4.2,
		residual_tolerance_mv: 60,
		spread_limit_mv: 50,
		outlier_k: 4,
		self_discharge_limit_mv_per_day: 2,
		declared_soc_tolerance_pct: 10,
		meter_accuracy_mv: 2,
		aql: 0.65,
		inspection_level: 'II'
	};

	it('accepts valid parts and limits', () => {
		expect(partDescriptiveSchema.safeParse(descriptive).success).toBe(true);
		expect(partLimitsSchema.safeParse(limits).success).toBe(true);
	});

	it('refuses unknown chemistries, zero cells and an unknown document kind', () => {
		expect(paths(partDescriptiveSchema.safeParse({ ...descriptive, chemistry: 'UNOBTAINIUM' }))).toEqual(['chemistry']);
		expect(paths(partDescriptiveSchema.safeParse({ ...descriptive, cells_in_series: 0 }))).toEqual(['cells_in_series']);
		expect(paths(partDescriptiveSchema.safeParse({ ...descriptive, required_documents: ['invoice'] }))).toEqual(['required_documents.0']);
	});

	it('requires an AQL from the ISO 2859-1 preferred series and an ordered OCV window', () => {
		// ISO 2859-1 Table II-A preferred AQLs include 0.65 and 1.0 but not 0.7 or 2.0.
		expect(partLimitsSchema.safeParse({ ...limits, aql: 1 }).success).toBe(true);
		expect(paths(partLimitsSchema.safeParse({ ...limits, aql: 0.7 }))).toEqual(['aql']);
		expect(paths(partLimitsSchema.safeParse({ ...limits, aql: 2 }))).toEqual(['aql']);
		expect(paths(partLimitsSchema.safeParse({ ...limits, ocv_min_cell_v: 4.3 }))).toEqual(['ocv_max_cell_v']);
		expect(paths(partLimitsSchema.safeParse({ ...limits, inspection_level: 'IV' }))).toEqual(['inspection_level']);
		expect(paths(partLimitsSchema.safeParse({ ...limits, outlier_k: -1 }))).toEqual(['outlier_k']);
	});
});

describe('contact and document schemas', () => {
	it('checks contact e-mail addresses', () => {
		expect(contactSchema.safeParse({ name: 'A', email: 'a@b.example', receives_notices: true }).success).toBe(true);
		expect(paths(contactSchema.safeParse({ name: 'A', email: 'not-mail' }))).toEqual(['email']);
		expect(paths(contactSchema.safeParse({ name: '', email: 'a@b.example' }))).toEqual(['name']);
	});
	it('knows the upload kinds and the 20 MB limit', () => {
		expect(documentKindSchema.options).toEqual(['coc', 'un38_3_summary', 'sds', 'other']);
		expect(documentKindSchema.safeParse('corrective_action').success).toBe(false);
		expect(MAX_DOCUMENT_BYTES).toBe(20 * 1024 * 1024);
	});
});

describe('list queries from HTML GET forms', () => {
	it('treats empty parameters as no filter', () => {
		expect(lotListQuerySchema.parse({ status: 'cancelled', supplier_id: '', search: '', limit: '' })).toEqual({
			status: 'cancelled',
			limit: 25
		});
	});
});

describe('partListQuerySchema', () => {
	it('treats empty parameters as no filter and refuses a malformed supplier id', () => {
		expect(partListQuerySchema.parse({ supplier_id: '', search: '' })).toEqual({});
		expect(partListQuerySchema.safeParse({ supplier_id: 'x' }).success).toBe(false);
	});
});
