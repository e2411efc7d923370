// Shapes of readings, meter-file mappings and sampling-plan queries, shared by the API, the
// services and the browser grid.
import { z } from 'zod';
import { MAX_GROUP_V } from '$lib/inspection/cell-groups';
import { decimal, fromText, plausibleInstant, text, wholeNumber } from './fields';

/** Most readings accepted in one call; beyond it the API answers 413. */
export const MAX_READINGS_PER_CALL = 10_000;
/** Largest meter file accepted (CSV or XLSX). */
export const MAX_IMPORT_BYTES = 10 * 1024 * 1024;
/**
 * Highest AC resistance accepted, in mΩ: 100 Ω. Cells measure a few to a few hundred mΩ and the
 * longest pack here (400 cells in series) stays well below this (common practice, from memory);
 * beyond it the value is a typo or a unit mix-up (Ω typed as mΩ … times a thousand).
 */
export const MAX_AC_RESISTANCE_MOHM = 100_000;

const finite = (what: string) => z.number({ error: `${what} must be a number` }).refine(Number.isFinite, `${what} must be finite`);

export const readingSchema = z.object({
	serial: text({ error: 'serial is required' }).trim().min(1, 'serial is required').max(64, 'serial is at most 64 characters'),
	// Pack voltage for packs (the server divides by the cells in series), cell voltage for cells.
	ocv_v: finite('ocv_v').min(0, 'ocv_v must be ≥ 0 V (check the probe polarity)').lt(1000, 'ocv_v must be below 1000 V'),
	temperature_c: finite('temperature_c').gt(-60, 'temperature_c must be above −60 °C').lt(120, 'temperature_c must be below 120 °C'),
	ac_resistance_mohm: finite('ac_resistance_mohm')
		.positive('ac_resistance_mohm must be > 0 mΩ')
		.max(MAX_AC_RESISTANCE_MOHM, 'ac_resistance_mohm must be at most 100,000 mΩ (100 Ω); check the unit')
		.nullish(),
	measured_at: plausibleInstant('measured_at').nullish(),
	client_key: text().min(8).max(64).nullish(),
	// The inspector confirms an OCV the entry guard found implausible (src/lib/inspection/entry-guard.ts).
	confirmed: z.boolean({ error: 'confirmed must be true or false' }).nullish(),
	// A pack's cell-group voltages (one per cell in series, V); the service checks the count against the part.
	cell_group_voltages: z
		.array(
			finite('cell_group_voltages')
				.min(0, 'cell_group_voltages must be ≥ 0 V')
				.max(MAX_GROUP_V, `cell_group_voltages must be at most ${MAX_GROUP_V} V per group; check the unit`),
			{ error: 'cell_group_voltages must be a list of numbers' }
		)
		.min(2, 'cell_group_voltages needs one voltage per cell in series (at least 2)')
		.max(1000, 'cell_group_voltages holds at most 1000 groups')
		.nullish()
});
export type ReadingInputRow = z.infer<typeof readingSchema>;

/** A correction of a wrong value before the lot is decided; the reason goes to the audit trail. */
export const readingCorrectionSchema = z
	.object({
		serial: readingSchema.shape.serial.optional(),
		ocv_v: readingSchema.shape.ocv_v.optional(),
		temperature_c: readingSchema.shape.temperature_c.optional(),
		ac_resistance_mohm: readingSchema.shape.ac_resistance_mohm,
		confirmed: readingSchema.shape.confirmed,
		reason: text({ multiline: true }).trim().min(3, 'say why the value was wrong').max(500)
	})
	.refine((c) => c.serial !== undefined || c.ocv_v !== undefined || c.temperature_c !== undefined || c.ac_resistance_mohm !== undefined, {
		error: 'change at least one value'
	});
export type ReadingCorrection = z.infer<typeof readingCorrectionSchema>;

/** Which column (0-based) holds which value; the OCV unit is V or mV. */
export const importMappingSchema = z.object({
	serial: z.int().min(0),
	ocv: z.int().min(0),
	ocv_unit: z.enum(['V', 'mV']).default('V'),
	temperature: z.int().min(0).nullish(),
	/** Used when the file has no temperature column. */
	default_temperature_c: z.number().gt(-60).lt(120).nullish(),
	ac_resistance: z.int().min(0).nullish(),
	time: z.int().min(0).nullish(),
	/** First data row (0-based); rows before it (headers) are skipped. */
	first_row: z.int().min(0).default(1),
	/** Leave rows with errors out instead of refusing the file. */
	skip_invalid: z.boolean().default(false)
});
export type ImportMapping = z.infer<typeof importMappingSchema>;

export const INSPECTION_LEVELS = ['I', 'II', 'III', 'S-1', 'S-2', 'S-3', 'S-4'] as const;

export const planQuerySchema = z.object({
	lot_size: fromText(wholeNumber('lot_size must be a whole number').min(1, 'lot_size must be ≥ 1').max(100_000_000), { whole: true }),
	aql: fromText(decimal('aql must be a number').positive('aql must be > 0')),
	level: z.enum(INSPECTION_LEVELS).default('II'),
	severity: z.enum(['normal', 'tightened', 'reduced']).default('normal')
});
