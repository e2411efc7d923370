/**
 * Request shapes of the electrochemistry API and the model pages. The readings array of
 * /ocv/evaluate is checked by a hand-written loop (readingsIssues) instead of a per-element zod
 * object: the call carries up to 10,000 readings and must stay close to a static file in speed.
 */
import { z } from 'zod';
import { fromText, text, wholeNumber } from './fields';
import { CHEMISTRY_CODES, type ChemistryCode, type ReadingInput } from '$lib/electrochem';

export const MAX_READINGS = 10_000;
export const MAX_CURVE_POINTS = 5_000;

// zod 4's z.number() already refuses NaN and ±Infinity.
const finite = () => z.number();
const celsius = () => finite().gt(-273.15, 'must be above absolute zero (−273.15 °C)');

export const chemistryCode = z.enum(CHEMISTRY_CODES as [ChemistryCode, ...ChemistryCode[]], {
	error: `must be one of ${CHEMISTRY_CODES.join(', ')}`
});

export const cellPotentialBody = z.object({
	e0_v: finite(),
	n: z.number().int('must be a whole number of electrons').positive(),
	temperature_c: celsius(),
	q: finite().positive('must be > 0 (a reaction quotient)')
});

export const curveQuery = z.object({
	temperature_c: fromText(celsius()).default(25),
	points: fromText(wholeNumber('points must be a whole number from 2 to 1001').min(2).max(1001), { whole: true }).default(101)
});

/** Everything of an evaluate body except the readings themselves; exactly one of chemistry, model, model_id. */
export const evaluateHeader = z.object({
	chemistry: chemistryCode.optional(),
	/** A model object as /ocv/fit returns it; checked by validateModel. */
	model: z.record(z.string(), z.unknown()).optional(),
	model_id: z.uuid().optional(),
	cells_in_series: z.number().int().positive().max(1000).optional(),
	declared_soc: finite().min(0).max(1).nullable().optional(),
	meter_accuracy_v: finite().min(0).max(10).optional(),
	readings: z.array(z.unknown()).min(1, 'at least one reading is needed')
});

export interface ReadingIssue {
	path: string;
	message: string;
}

const MAX_REPORTED_ISSUES = 20;

/** Each reading must be {ocv_v ≥ 0, temperature_c > −273.15}, both finite numbers. */
export function readingsIssues(readings: unknown[]): ReadingIssue[] {
	const issues: ReadingIssue[] = [];
	for (let i = 0; i < readings.length && issues.length < MAX_REPORTED_ISSUES; i++) {
		const r = readings[i] as Partial<ReadingInput> | null;
		if (typeof r !== 'object' || r === null || Array.isArray(r)) {
			issues.push({ path: `readings.${i}`, message: 'must be an object {ocv_v, temperature_c}' });
			continue;
		}
		const v = r.ocv_v;
		const t = r.temperature_c;
		if (typeof v !== 'number' || !Number.isFinite(v)) issues.push({ path: `readings.${i}.ocv_v`, message: 'must be a finite number (V)' });
		else if (v < 0) issues.push({ path: `readings.${i}.ocv_v`, message: 'must be >= 0 V (check the probe polarity)' });
		if (typeof t !== 'number' || !Number.isFinite(t))
			issues.push({ path: `readings.${i}.temperature_c`, message: 'must be a finite number (°C)' });
		else if (t <= -273.15) issues.push({ path: `readings.${i}.temperature_c`, message: 'must be above absolute zero (−273.15 °C)' });
	}
	return issues;
}

export const curvePoint = z.object({
	soc: finite().min(0).max(1),
	ocv_v: finite().positive()
});

export const fitBody = z.object({
	chemistry: chemistryCode,
	temperature_c: celsius(),
	points: z
		.array(curvePoint)
		.min(5, 'at least 5 points are needed')
		.max(MAX_CURVE_POINTS, `at most ${MAX_CURVE_POINTS} points are allowed`),
	/** 'nernst' is the combined (Nernst-type) form; 'auto' picks by leave-one-out cross-validation. */
	form: z.enum(['auto', 'nernst', 'tabulated']).default('auto'),
	/** Pool non-increasing points by isotonic regression instead of refusing them. */
	smooth: z.boolean().default(false)
});

/** Saving a fitted version: the server refits from the points, so stored parameters are its own. */
export const saveModelBody = fitBody.extend({
	label: text().trim().max(80).optional(),
	/** Where the points come from (a datasheet, an own measurement). */
	data_source: text().trim().max(200).optional()
});

export const modelListQuery = z.object({
	chemistry: chemistryCode.optional(),
	status: z.enum(['approved', 'awaiting_approval']).optional()
});

/** The page's save form: the pasted (or uploaded) CSV travels as text and is parsed on the server too. */
export const saveFitForm = z.object({
	chemistry: chemistryCode,
	temperature_c: celsius().default(25),
	csv: text({ multiline: true }).min(1, 'paste or upload a reference curve first').max(400_000),
	label: text().trim().max(80).default('')
});

/** Approving a version is e-signed: password re-entered and a reason (services/models.ts approveModel). */
export const approveForm = z.object({
	id: z.uuid(),
	password: z.string().min(1, 'enter your password to sign').max(200),
	reason: text().trim().min(5, 'give a reason (at least 5 characters)').max(500)
});

export const approveModelBody = approveForm.omit({ id: true });

/** A stored model version as the API and pages show it. */
export type ModelStatus = 'approved' | 'awaiting_approval';

export interface ModelVersion {
	id: string;
	chemistry: string;
	version: string;
	name: string;
	origin: 'library' | 'fitted';
	status: ModelStatus;
	source: string;
	fit_temperature_c: number | null;
	fit_rmse_v: number | null;
	fit_max_error_v: number | null;
	/** Leave-one-out cross-validated σ of a fitted version, V. */
	fit_sigma_v: number | null;
	form: string | null;
	point_count: number | null;
	data_source: string | null;
	approval_reason: string | null;
	created_at: string;
	created_by: string | null;
	approved_at: string | null;
	approved_by: string | null;
}
