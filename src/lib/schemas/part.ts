/**
 * Parts: descriptive fields (buyer, `part:edit`) and acceptance limits + sampling settings
 * (quality, `part:limits`) are separate schemas because different roles own them.
 */
import { z } from 'zod';
import { AQL_SERIES } from '$lib/inspection';
import { CHEMISTRY_CODES } from '$lib/electrochem';
import { blankAsMissing } from './lot';
import { decimal, text, wholeNumber } from './fields';

export const INSPECTION_LEVELS = ['I', 'II', 'III', 'S-1', 'S-2', 'S-3', 'S-4'] as const;
export const REQUIRED_DOCUMENT_KINDS = ['coc', 'un38_3_summary', 'sds'] as const;

const positiveInt = (what: string, max: number) =>
	wholeNumber(`Enter ${what} as a whole number`).min(1, `${what} is at least 1`).max(max, `${what} is at most ${max}`);
const positive = (what: string, max: number) =>
	decimal(`Enter ${what} as a number`).positive(`${what} must be more than 0`).max(max, `${what} is at most ${max}`);

export const partDescriptiveSchema = z.object({
	supplier_id: z.uuid({ error: 'Choose a supplier' }),
	part_number: text().trim().min(1, 'Enter the supplier part number').max(60, 'At most 60 characters'),
	description: text().trim().min(1, 'Describe the part in a few words').max(200, 'At most 200 characters'),
	chemistry: z.enum(CHEMISTRY_CODES as [string, ...string[]], { error: 'Choose a chemistry' }),
	cells_in_series: positiveInt('Cells in series', 400),
	cells_in_parallel: positiveInt('Cells in parallel', 400),
	nominal_capacity_ah: positive('Nominal capacity (Ah)', 100_000),
	required_documents: z.array(z.enum(REQUIRED_DOCUMENT_KINDS)).default([])
});
export type PartDescriptive = z.infer<typeof partDescriptiveSchema>;

const isPreferredAql = (aql: number) => AQL_SERIES.some((v) => Math.abs(v - aql) <= v * 1e-9);

/** Limits as typed in the form: voltages per cell in V, tolerances in mV, SOC tolerance in %. */
export const partLimitsSchema = z
	.object({
		model_id: z.uuid({ error: 'Choose an approved OCV model version' }),
		ocv_min_cell_v: positive('Lowest OCV per cell (V)', 10),
		ocv_max_cell_v: positive('Highest OCV per cell (V)', 10),
		residual_tolerance_mv: positive('Residual tolerance (mV)', 2000),
		spread_limit_mv: positive('Spread limit (mV)', 5000),
		// Packs: largest max − min of the cell-group voltages (50 mV: common practice for a balanced pack at rest).
		imbalance_limit_mv: positive('Cell-group imbalance limit (mV)', 2000).default(50),
		outlier_k: positive('Outlier factor k', 50),
		self_discharge_limit_mv_per_day: positive('Self-discharge limit (mV/day)', 1000),
		declared_soc_tolerance_pct: positive('Declared-SOC tolerance (%)', 100),
		meter_accuracy_mv: positive('Meter accuracy (mV)', 1000),
		aql: z.number({ error: 'Choose an AQL' }).refine(isPreferredAql, 'Choose an AQL from the ISO 2859-1 series'),
		inspection_level: z.enum(INSPECTION_LEVELS, { error: 'Choose an inspection level' })
	})
	.refine((v) => v.ocv_min_cell_v < v.ocv_max_cell_v, {
		path: ['ocv_max_cell_v'],
		message: 'The highest OCV must be above the lowest'
	});
export type PartLimitsForm = z.infer<typeof partLimitsSchema>;

/** GET /api/v1/parts query. */
export const partListQuerySchema = z.object({
	supplier_id: blankAsMissing(z.uuid({ error: 'supplier_id must be a UUID' })),
	chemistry: blankAsMissing(text().trim().max(20)),
	search: blankAsMissing(text().trim().max(60))
});
export type PartListQuery = z.infer<typeof partListQuerySchema>;

export const DOCUMENT_KIND_LABEL: Record<string, string> = {
	coc: 'Certificate of conformity',
	un38_3_summary: 'UN 38.3 test summary',
	sds: 'Safety data sheet',
	other: 'Other',
	corrective_action: 'Corrective action'
};
