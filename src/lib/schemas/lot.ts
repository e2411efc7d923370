/**
 * Lot registration: one set of field rules shared by the register form (declared SOC in %), the
 * JSON API (declared SOC as a fraction 0–1) and the service.
 */
import { z } from 'zod';
import { PACKINGS, dgFamilyOf, familyOfUnNumber, unNumberFor, type Packing } from '$lib/inspection/dangerous-goods';
import { fromText, text, wholeNumber } from './fields';

export const TRANSPORTS = ['air', 'sea', 'road', 'rail'] as const;
export type TransportMode = (typeof TRANSPORTS)[number];
/** How the cells were last moved before shipping: picks the OCV hysteresis branch (LFP); unknown covers both. */
export const LAST_DIRECTIONS = ['unknown', 'after_charge', 'after_discharge'] as const;
export type LastDirection = (typeof LAST_DIRECTIONS)[number];

export { PACKINGS, type Packing };

export const LOT_STATUSES = [
	'draft',
	'awaiting_arrival',
	'in_inspection',
	'pending_decision',
	'accepted',
	'on_hold',
	'rejected',
	'cancelled'
] as const;
export type LotStatus = (typeof LOT_STATUSES)[number];

/** Lithium chemistries (library codes) and the UN numbers their shipments travel under. */
export const LITHIUM_ION_CHEMISTRIES = ['LCO', 'NMC', 'NCA', 'LMO', 'LFP', 'LTO'] as const;
export const LITHIUM_METAL_CHEMISTRIES = ['LIMNO2', 'LISOCL2'] as const;

export const isLithiumIon = (chemistry: string) => (LITHIUM_ION_CHEMISTRIES as readonly string[]).includes(chemistry);
export const isLithiumMetal = (chemistry: string) => (LITHIUM_METAL_CHEMISTRIES as readonly string[]).includes(chemistry);
export const isLithium = (chemistry: string) => isLithiumIon(chemistry) || isLithiumMetal(chemistry);

/** The air-transport SOC ceiling for lithium-ion cells/batteries packed alone (UN 3480), as a fraction. */
export const AIR_LITHIUM_ION_SOC_LIMIT = 0.3;

export const UN_NUMBER_PATTERN = /^UN\d{4}$/;

/**
 * UN numbers the other chemistries may travel under (UN Model Regulations, Dangerous Goods List; from
 * memory): UN2794 batteries, wet, filled with acid; UN2800 batteries, wet, non-spillable; UN2795
 * batteries, wet, filled with alkali (vented NiCd); UN3496 batteries, nickel-metal hydride. Alkaline
 * primary cells travel under none. Restvolt applies no SOC rule to these; it records the number.
 */
const OTHER_UN_NUMBERS: Readonly<Record<string, readonly string[]>> = {
	PBACID: ['UN2794', 'UN2800'],
	NICD: ['UN2795'],
	NIMH: ['UN3496']
};

const FAMILY_WORD = { lithium_ion: 'lithium', lithium_metal: 'lithium', sodium_ion: 'sodium-ion' } as const;

/**
 * Why the UN number does not fit the part's chemistry, or null when it fits. Lithium and sodium-ion
 * shipments need their family's numbers (UN3480/3481 ion, UN3090/3091 metal, UN3551/3552 sodium-ion);
 * other chemistries may leave it empty, or give one of the numbers their batteries travel under.
 */
export function unNumberProblem(chemistry: string, unNumber: string | null | undefined): string | null {
	const value = unNumber?.trim() ? unNumber.trim() : null;
	if (value && !UN_NUMBER_PATTERN.test(value)) return 'Write the UN number as UN followed by four digits, e.g. UN3480';
	const family = dgFamilyOf(chemistry);
	if (family) {
		const allowed = [unNumberFor(family, 'alone'), unNumberFor(family, 'with_equipment')];
		if (!value) return `A ${FAMILY_WORD[family]} shipment needs its UN number (${allowed.join(' or ')})`;
		return allowed.includes(value as (typeof allowed)[number]) ? null : `For this chemistry the UN number is ${allowed.join(' or ')}`;
	}
	if (!value) return null;
	const other = OTHER_UN_NUMBERS[chemistry.toUpperCase()] ?? [];
	if (other.includes(value)) return null;
	return other.length > 0
		? `For this chemistry the UN number is ${other.join(' or ')}, or leave it empty`
		: 'Cells of this chemistry travel under no UN number of their own; leave it empty';
}

/** What the lot form says beside the UN number for this chemistry and packing (same table as unNumberProblem). */
export function unNumberGuide(chemistry: string | null, packing: Packing): { required: boolean; hint: string; placeholder: string } {
	const family = chemistry ? dgFamilyOf(chemistry) : null;
	if (family) {
		const expected = unNumberFor(family, packing);
		return {
			required: true,
			hint: `Required: ${expected} for cells and batteries ${PACKING_WORDS[packing]} (${unNumberFor(family, 'alone')} on their own, ${unNumberFor(family, 'with_equipment')} with or in equipment).`,
			placeholder: expected
		};
	}
	const other = chemistry ? (OTHER_UN_NUMBERS[chemistry.toUpperCase()] ?? []) : [];
	return {
		required: false,
		hint: other.length > 0 ? `If the shipment carried one: ${other.join(' or ')}.` : 'Required for lithium and sodium-ion parts only.',
		placeholder: ''
	};
}

const PACKING_WORDS: Record<Packing, string> = {
	alone: 'on their own',
	with_equipment: 'packed with equipment',
	in_equipment: 'contained in equipment'
};

/** Why the UN number does not fit the packing (e.g. UN3480 is for batteries on their own), or null. */
export function packingProblem(unNumber: string | null | undefined, packing: Packing): string | null {
	const family = unNumber ? familyOfUnNumber(unNumber.trim()) : null;
	if (!family || !unNumber) return null;
	const expected = unNumberFor(family, packing);
	return expected === unNumber.trim()
		? null
		: `Cells and batteries ${PACKING_WORDS[packing]} travel under ${expected}, not ${unNumber.trim()}`;
}

const poNumber = text({ error: 'Enter the purchase order number' })
	.trim()
	.min(1, 'Enter the purchase order number')
	.max(40, 'A PO number has at most 40 characters');
const uuidField = (what: string) => z.uuid({ error: `Choose a ${what}` });
const quantity = wholeNumber('Enter the number of units as a whole number')
	.positive('The quantity must be at least 1')
	.max(10_000_000, 'The quantity can be at most 10,000,000');
const transport = z.enum(TRANSPORTS, { error: 'Choose air, sea, road or rail' });
const lastDirection = z.enum(LAST_DIRECTIONS, { error: 'Choose unknown, after charge or after discharge' });
const unNumber = text({ error: 'Write the UN number as text, e.g. UN3480' })
	.trim()
	.toUpperCase()
	.refine((v) => v === '' || UN_NUMBER_PATTERN.test(v), 'Write the UN number as UN followed by four digits, e.g. UN3480');
// ISO dates compare as text; anything outside this century is a typo.
const isoDate = z.iso
	.date({ error: 'Use a date like 2026-03-31' })
	.refine((v) => v >= '2000-01-01' && v <= '2099-12-31', 'Use a date between 2000 and 2099');

/** The register form: declared SOC in percent; empty optional fields arrive as ''. */
export const lotFormSchema = z
	.object({
		po_number: poNumber,
		supplier_id: uuidField('supplier'),
		part_id: uuidField('part'),
		quantity,
		// Nullable so an untouched field reads as "not entered" rather than a silent 0 %.
		declared_soc_pct: z
			.number({ error: 'Enter the declared SOC in %' })
			.min(0, 'The declared SOC is between 0 and 100 %')
			.max(100, 'The declared SOC is between 0 and 100 %')
			.nullable()
			.default(null),
		transport,
		last_direction: lastDirection.default('unknown'),
		packing: z.enum(PACKINGS, { error: 'Choose how the cells travel: alone, with equipment or in equipment' }).default('alone'),
		un_number: unNumber.default(''),
		expected_arrival: z.union([z.literal(''), isoDate]).default(''),
		resubmitted: z.boolean({ error: 'Resubmitted is yes or no' }).default(false)
	})
	.refine((v) => v.declared_soc_pct !== null, {
		path: ['declared_soc_pct'],
		message: 'Enter the declared SOC at shipment in %'
	});
export type LotForm = z.infer<typeof lotFormSchema>;

/** The API body: declared SOC as a fraction; strict types (a string where a number belongs is refused). */
export const lotApiSchema = z.object({
	po_number: poNumber,
	supplier_id: z.uuid({ error: 'supplier_id must be a UUID' }),
	part_id: z.uuid({ error: 'part_id must be a UUID' }),
	quantity,
	declared_soc: z
		.number({ error: 'declared_soc must be a number between 0 and 1' })
		.min(0, 'declared_soc is a fraction between 0 and 1')
		.max(1, 'declared_soc is a fraction between 0 and 1'),
	transport,
	last_direction: z.enum(LAST_DIRECTIONS, { error: 'last_direction must be unknown, after_charge or after_discharge' }).default('unknown'),
	packing: z.enum(PACKINGS, { error: 'packing must be alone, with_equipment or in_equipment' }).default('alone'),
	un_number: unNumber.nullish(),
	expected_arrival: isoDate.nullish(),
	/** Submitted again after it was not accepted (ISO 2859-1:1999 9.3: does not count for switching). */
	resubmitted: z.boolean({ error: 'resubmitted must be true or false' }).default(false)
});
export type LotApiInput = z.infer<typeof lotApiSchema>;

/** What the lot service takes (both entry points map to it). */
export interface LotInput {
	poNumber: string;
	supplierId: string;
	partId: string;
	quantity: number;
	declaredSoc: number;
	transport: TransportMode;
	lastDirection: LastDirection;
	packing: Packing;
	unNumber: string | null;
	expectedArrival: string | null;
	resubmitted: boolean;
}

export function lotInputFromForm(form: LotForm): LotInput {
	return {
		poNumber: form.po_number,
		supplierId: form.supplier_id,
		partId: form.part_id,
		quantity: form.quantity,
		declaredSoc: Math.round((form.declared_soc_pct ?? 0) * 100) / 10_000,
		transport: form.transport,
		lastDirection: form.last_direction,
		packing: form.packing,
		unNumber: form.un_number || null,
		expectedArrival: form.expected_arrival || null,
		resubmitted: form.resubmitted
	};
}

export function lotInputFromApi(body: LotApiInput): LotInput {
	return {
		poNumber: body.po_number,
		supplierId: body.supplier_id,
		partId: body.part_id,
		quantity: body.quantity,
		declaredSoc: body.declared_soc,
		transport: body.transport,
		lastDirection: body.last_direction,
		packing: body.packing,
		unNumber: body.un_number || null,
		expectedArrival: body.expected_arrival ?? null,
		resubmitted: body.resubmitted
	};
}

/** Field names of the service input in API (snake_case) spelling, for field errors. */
export const LOT_FIELD: Record<keyof LotInput, string> = {
	poNumber: 'po_number',
	supplierId: 'supplier_id',
	partId: 'part_id',
	quantity: 'quantity',
	declaredSoc: 'declared_soc',
	transport: 'transport',
	lastDirection: 'last_direction',
	packing: 'packing',
	unNumber: 'un_number',
	expectedArrival: 'expected_arrival',
	resubmitted: 'resubmitted'
};

/** An empty query parameter (`?status=`) means "no filter", as HTML GET forms send it. */
export const blankAsMissing = <T extends z.ZodType>(schema: T) => z.preprocess((v) => (v === '' ? undefined : v), schema.optional());

/** GET /api/v1/lots query. */
export const lotListQuerySchema = z.object({
	status: blankAsMissing(z.enum(LOT_STATUSES, { error: `status is one of ${LOT_STATUSES.join(', ')}` })),
	supplier_id: blankAsMissing(z.uuid({ error: 'supplier_id must be a UUID' })),
	part_id: blankAsMissing(z.uuid({ error: 'part_id must be a UUID' })),
	search: blankAsMissing(text().trim().max(60)),
	/** A serial trace: only lots holding a reading of this unit (exact serial). */
	serial: blankAsMissing(text().trim().max(64, 'serial is at most 64 characters')),
	limit: z.preprocess(
		(v) => (v === '' || v === undefined ? 25 : v),
		fromText(
			wholeNumber('limit must be a whole number from 1 to 100')
				.min(1, 'limit must be a whole number from 1 to 100')
				.max(100, 'limit must be a whole number from 1 to 100'),
			{ whole: true }
		)
	),
	cursor: blankAsMissing(text().max(200))
});
