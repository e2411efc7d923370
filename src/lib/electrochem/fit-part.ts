// A part model from the supplier's OCV points: the Nernst-type combined form (least squares) or the
// tabulated form (Steffen interpolant), or whichever cross-validates better ('auto'). Every fitted
// model carries its own σ_model from leave-one-out cross-validation over the interior points (10–90 % SOC), never
// below the meter's resolution: an interpolant has no residual at its own points, so only points it
// has not seen can say how far the cell's curve may lie from it.
import { EPSILON_GRID, type CurvePoint, fitCombinedParams, leverages, residualStats } from './fit';
import { combinedBasis, combinedFunctions, type FormFunctions, scaledSoc } from './forms';
import { isIncreasing } from './monotonic';
import { getLibraryModel, isChemistryCode } from './models';
import { curve } from './ocv';
import { nonIncreasingAt, poolAdjacentViolators, tabulatedFunctions, type TabulatedParams } from './tabulated';
import { correctTo25C } from './thermal';
import type { ChemistryCode, CombinedParams, OcvModel } from './types';
import { MAX_TABULATED_POINTS, MIN_TABULATED_POINTS } from './validate';

export type FitFormChoice = 'auto' | 'nernst' | 'tabulated';
export type FittedForm = 'nernst' | 'tabulated';

/**
 * Resolution of the inspectors' meter on a single cell: 1 mV, the last digit of a 4½-digit
 * multimeter on its 20 V range (common practice). σ_model is never reported below it.
 */
export const METER_RESOLUTION_V = 0.001;

export interface PartFitInput {
	chemistry: ChemistryCode;
	temperature_c: number;
	points: CurvePoint[];
	form?: FitFormChoice;
	/** Pool non-increasing points by isotonic regression instead of refusing them. */
	smooth?: boolean;
}

export interface FitIssue {
	path: string;
	message: string;
}

export interface Candidate {
	form: FittedForm;
	/** Leave-one-out RMS error over the interior points in CV_SOC_RANGE, V; null when it cannot be cross-validated. */
	cv_rmse_v: number | null;
	rejected: string | null;
}

export type PartFit =
	| {
			ok: true;
			form: FittedForm;
			model: OcvModel;
			rmse_v: number;
			max_error_v: number;
			monotonic: true;
			sigma_model_v: number;
			cv_rmse_v: number;
			smoothed: boolean;
			candidates: Candidate[];
			/** The model's curve at the points' temperature, soc 0…1 in steps of 0.01. */
			curve: CurvePoint[];
	  }
	| { ok: false; code: 'invalid_points' | 'non_monotonic' | 'fit_rejected'; message: string; issues: FitIssue[]; candidates: Candidate[] };

const refuse = (
	code: 'invalid_points' | 'non_monotonic' | 'fit_rejected',
	message: string,
	issues: FitIssue[],
	candidates: Candidate[] = []
) => ({ ok: false, code, message, issues, candidates }) as const;

/** Bad input, each issue naming its point; the same rules the API's schema states. */
export function pointIssues(points: CurvePoint[]): FitIssue[] {
	if (points.length < MIN_TABULATED_POINTS) return [{ path: 'points', message: `at least ${MIN_TABULATED_POINTS} points are needed` }];
	if (points.length > MAX_TABULATED_POINTS) return [{ path: 'points', message: `at most ${MAX_TABULATED_POINTS} points are allowed` }];
	const issues: FitIssue[] = [];
	const seen = new Map<number, number>();
	points.forEach((p, i) => {
		if (!(typeof p.soc === 'number' && p.soc >= 0 && p.soc <= 1))
			issues.push({ path: `points.${i}.soc`, message: 'must be a number from 0 to 1' });
		if (!(typeof p.ocv_v === 'number' && Number.isFinite(p.ocv_v) && p.ocv_v > 0))
			issues.push({ path: `points.${i}.ocv_v`, message: 'must be a finite voltage above 0 V' });
		const first = seen.get(p.soc);
		if (first !== undefined) issues.push({ path: `points.${i}.soc`, message: `repeats the soc ${p.soc} of point ${first}` });
		else seen.set(p.soc, i);
	});
	return issues;
}

interface Prepared {
	/** Sorted by soc, corrected to 25 °C. */
	points: CurvePoint[];
	/** What is fitted: the points, or their isotonic pooling when smoothed. */
	knots: CurvePoint[];
	smoothed: boolean;
}

function prepare(input: PartFitInput): Prepared | ReturnType<typeof refuse> {
	const entropic = getLibraryModel(input.chemistry).entropic_mv_per_k;
	const order = input.points.map((p, i) => ({ ...p, i })).sort((a, b) => a.soc - b.soc);
	const points = order.map((p) => ({ soc: p.soc, ocv_v: correctTo25C(p.ocv_v, entropic, p.soc, input.temperature_c) }));
	const falling = nonIncreasingAt(points);
	if (falling.length === 0) return { points, knots: points, smoothed: false };
	if (!input.smooth) {
		const issues = falling.map((k) => ({
			path: `points.${order[k].i}`,
			message: `OCV ${order[k].ocv_v} V at soc ${order[k].soc} does not rise above ${order[k - 1].ocv_v} V at soc ${order[k - 1].soc} (point ${order[k - 1].i})`
		}));
		const message = `OCV must rise with SOC; ${falling.length} point(s) do not. Check them, or send smooth: true to pool them by isotonic regression.`;
		return refuse('non_monotonic', message, issues);
	}
	const knots = poolAdjacentViolators(points);
	if (knots.length < MIN_TABULATED_POINTS)
		return refuse(
			'non_monotonic',
			`After pooling the non-increasing points only ${knots.length} remain; at least ${MIN_TABULATED_POINTS} are needed.`,
			[{ path: 'points', message: 'too few increasing points' }]
		);
	return { points, knots, smoothed: true };
}

const rms = (xs: number[]) => Math.sqrt(xs.reduce((a, x) => a + x * x, 0) / xs.length);

/**
 * The SOC range whose leave-one-out errors make σ_model: 10–90 % SOC, where inspections read
 * cells and the curve is flattest (so a voltage error costs most SOC there). Near empty and full
 * the curve is steep: a point left out there misses by tens of mV yet means little SOC, and would
 * swamp the mean (common practice: the 10–90 % window of OCV–SOC comparisons).
 */
export const CV_SOC_RANGE: [number, number] = [0.1, 0.9];

/** RMS of the errors at interior knots inside CV_SOC_RANGE (all interior knots when fewer than 3 lie there). */
function cvRms(knots: CurvePoint[], errors: number[]): number | null {
	const inside = errors.filter((_, k) => knots[k + 1].soc >= CV_SOC_RANGE[0] && knots[k + 1].soc <= CV_SOC_RANGE[1]);
	const used = inside.length >= 3 ? inside : errors;
	return used.length > 0 ? rms(used) : null;
}

/** Leave-one-out errors of the tabulated form at the interior knots; Steffen slopes are local, so a window of ±3 knots is exact. */
export function tabulatedLooErrors(knots: CurvePoint[]): number[] {
	const errors: number[] = [];
	for (let i = 1; i < knots.length - 1; i++) {
		const window = knots.slice(Math.max(0, i - 3), Math.min(knots.length, i + 4)).filter((_, k, w) => w[k] !== knots[i]);
		const fn = tabulatedFunctions({ soc: window.map((p) => p.soc), ocv_v: window.map((p) => p.ocv_v) });
		errors.push(fn.value(knots[i].soc) - knots[i].ocv_v);
	}
	return errors;
}

interface FormFit {
	form: FittedForm;
	fn: FormFunctions;
	params: Record<string, unknown>;
	cv: number | null;
	epsilon?: number;
}

function tabulatedFit(knots: CurvePoint[]): FormFit | string {
	const params: TabulatedParams = { soc: knots.map((p) => p.soc), ocv_v: knots.map((p) => p.ocv_v) };
	const fn = tabulatedFunctions(params);
	if (!isIncreasing(fn)) return 'the interpolant is not strictly increasing (points too close in voltage)';
	return { form: 'tabulated', fn, params: { ...params }, cv: cvRms(knots, tabulatedLooErrors(knots)) };
}

/** PRESS residuals of the combined form at fixed ε (chosen on all points first, so slightly optimistic). */
function combinedLooErrors(knots: CurvePoint[], params: CombinedParams): number[] | null {
	const h = leverages(knots.map((p) => combinedBasis(scaledSoc(p.soc, params.epsilon))));
	if (!h) return null;
	const fn = combinedFunctions(params);
	const errors: number[] = [];
	for (let i = 1; i < knots.length - 1; i++) {
		if (!(1 - h[i] > 1e-9)) return null; // a point the fit passes through by construction says nothing
		errors.push((fn.value(knots[i].soc) - knots[i].ocv_v) / (1 - h[i]));
	}
	return errors;
}

function nernstFit(knots: CurvePoint[]): FormFit | string {
	let best: { params: CombinedParams; rmse: number } | null = null;
	for (const epsilon of EPSILON_GRID) {
		const params = fitCombinedParams(knots, epsilon);
		if (!params) continue;
		const fn = combinedFunctions(params);
		if (!isIncreasing(fn)) continue;
		const { rmse_v } = residualStats(fn, knots);
		if (!best || rmse_v < best.rmse) best = { params, rmse: rmse_v };
	}
	if (!best) return 'no ε gives an increasing Nernst-form curve through these points';
	const errors = combinedLooErrors(knots, best.params);
	const cv = errors ? cvRms(knots, errors) : null;
	return { form: 'nernst', fn: combinedFunctions(best.params), params: { ...best.params }, cv, epsilon: best.params.epsilon };
}

function round(x: number, digits: number): number {
	const f = 10 ** digits;
	return Math.round(x * f) / f;
}

function describe(fit: FormFit, n: number, temperatureC: number, sigma: number, smoothed: boolean): string {
	const what =
		fit.form === 'tabulated'
			? `Monotone cubic interpolant (Steffen 1990) through ${n} points`
			: `Nernst-type combined form fitted by least squares to ${n} points`;
	const pooled = smoothed ? ', non-increasing points pooled by isotonic regression' : '';
	return `${what} measured at ${temperatureC} °C${pooled}; leave-one-out σ ${(sigma * 1000).toFixed(2)} mV`;
}

function buildModel(
	input: PartFitInput,
	fit: FormFit,
	prepared: Prepared,
	sigma: number,
	stats: { rmse_v: number; max_error_v: number }
): OcvModel {
	// the library's calibrated error curve belongs to its generic curve; a fitted model carries its own σ
	const { sigma_model_soc_curve: _genericCurve, ...base } = getLibraryModel(input.chemistry);
	const { knots } = prepared;
	return {
		...base,
		entropic_mv_per_k: base.entropic_mv_per_k.map(([z, m]) => [z, m] as [number, number]),
		temperature_range_c: [...base.temperature_range_c],
		version: 'fitted',
		form: fit.form === 'tabulated' ? 'tabulated' : 'combined',
		params: fit.params,
		ocv_empty_v: round(fit.fn.value(0), 4),
		ocv_full_v: round(fit.fn.value(1), 4),
		sigma_model_v: sigma,
		source: `${describe(fit, prepared.points.length, input.temperature_c, sigma, prepared.smoothed)}; limits and entropic table from library ${input.chemistry} ${base.version}`,
		fit: {
			temperature_c: input.temperature_c,
			point_count: prepared.points.length,
			...stats,
			...(fit.epsilon === undefined ? {} : { epsilon: fit.epsilon }),
			cv_rmse_v: fit.cv ?? undefined,
			soc_range: [knots[0].soc, knots[knots.length - 1].soc],
			smoothed: prepared.smoothed
		}
	};
}

const candidateOf = (fit: FormFit | string, form: FittedForm): Candidate =>
	typeof fit === 'string'
		? { form, cv_rmse_v: null, rejected: fit }
		: { form, cv_rmse_v: fit.cv, rejected: fit.cv === null ? 'too few points to cross-validate' : null };

/** Fit a part model; see the file comment. Pure: the same points give the same model. */
export function fitPartModel(input: PartFitInput): PartFit {
	if (!isChemistryCode(input.chemistry))
		return refuse('invalid_points', 'Unknown chemistry code', [{ path: 'chemistry', message: 'unknown chemistry code' }]);
	if (!Number.isFinite(input.temperature_c) || input.temperature_c <= -273.15)
		return refuse('invalid_points', 'temperature_c must be a finite °C value', [
			{ path: 'temperature_c', message: 'must be a finite °C value' }
		]);
	const issues = pointIssues(input.points);
	if (issues.length > 0) return refuse('invalid_points', 'Some points are not valid', issues);
	const prepared = prepare(input);
	if ('ok' in prepared) return prepared;
	const choice = input.form ?? 'auto';
	const fits: Array<FormFit | string> = [];
	const candidates: Candidate[] = [];
	if (choice !== 'nernst') {
		fits.push(tabulatedFit(prepared.knots));
		candidates.push(candidateOf(fits[fits.length - 1], 'tabulated'));
	}
	if (choice !== 'tabulated') {
		fits.push(nernstFit(prepared.knots));
		candidates.push(candidateOf(fits[fits.length - 1], 'nernst'));
	}

	const usable = fits.filter((f): f is FormFit & { cv: number } => typeof f !== 'string' && f.cv !== null);
	if (usable.length === 0) {
		const why = candidates.map((c) => `${c.form}: ${c.rejected}`).join('; ');
		return refuse('fit_rejected', `No form could be fitted and cross-validated: ${why}`, [{ path: 'points', message: why }], candidates);
	}
	const chosen = usable.reduce((a, b) => (b.cv < a.cv ? b : a));
	const sigma = Math.max(chosen.cv, METER_RESOLUTION_V);
	const stats = residualStats(chosen.fn, prepared.points);
	const model = buildModel(input, chosen, prepared, sigma, stats);
	return {
		ok: true,
		form: chosen.form,
		model,
		...stats,
		monotonic: true,
		sigma_model_v: sigma,
		cv_rmse_v: chosen.cv,
		smoothed: prepared.smoothed,
		candidates,
		curve: curve(model, input.temperature_c, 101).map((p, i) => ({ soc: i / 100, ocv_v: p.ocv_v }))
	};
}
