// Least-squares fitting of the OCV forms. Both are linear in their coefficients once ε is fixed:
//   combined:       E = K0·1 + K1·(−1/s) + K2·(−s) + K3·ln s + K4·ln(1−s)
//   Redlich–Kister: E − (RT/F)·ln(s/(1−s)) = E0 + Σ (A_k/F)·term_k(1−s)
// so each fit is one QR solve (ml-matrix); ε is chosen from a small grid by rmse when not given.
import { Matrix, QrDecomposition } from 'ml-matrix';
import { FARADAY } from './constants';
import { combinedBasis, combinedFunctions, type FormFunctions, referenceTemperatureVoltage, rkTerm, scaledSoc } from './forms';
import { isIncreasing } from './monotonic';
import { getLibraryModel, isChemistryCode } from './models';
import { correctTo25C } from './thermal';
import type { ChemistryCode, CombinedParams, OcvModel, RedlichKisterParams } from './types';

export interface CurvePoint {
	soc: number;
	ocv_v: number;
}

/** Includes every ε used in the library, so refitting a library curve can recover it. */
export const EPSILON_GRID = [0.0005, 0.001, 0.002, 0.005, 0.01, 0.02, 0.03, 0.05, 0.08] as const;
const MIN_POINTS = 6;

const RANK_TOLERANCE = 1e-10;

interface ScaledQr {
	qr: QrDecomposition;
	norms: number[];
	b: Matrix;
}

/** QR of the weighted design with columns scaled to unit norm (so the rank test on diag(R) is scale-free); null when rank deficient. */
function scaledQr(rows: number[][], target: number[], weights?: number[]): ScaledQr | null {
	const w = weights ?? target.map(() => 1);
	const a = new Matrix(rows.map((r, i) => r.map((v) => v * Math.sqrt(w[i]))));
	const norms = Array.from({ length: a.columns }, (_, j) => a.getColumnVector(j).norm());
	if (norms.some((n) => !(n > 0) || !Number.isFinite(n))) return null;
	for (let j = 0; j < a.columns; j++)
		a.setColumn(
			j,
			a.getColumn(j).map((v) => v / norms[j])
		);
	const b = Matrix.columnVector(target.map((v, i) => v * Math.sqrt(w[i])));
	const qr = new QrDecomposition(a);
	const r = qr.upperTriangularMatrix;
	const diag = Array.from({ length: a.columns }, (_, j) => Math.abs(r.get(j, j)));
	if (Math.min(...diag) <= RANK_TOLERANCE * Math.max(...diag)) return null;
	return { qr, norms, b };
}

/** Weighted linear least squares via QR; null when the design matrix is (numerically) rank deficient. */
export function leastSquares(rows: number[][], target: number[], weights?: number[]): number[] | null {
	const s = scaledQr(rows, target, weights);
	return s
		? s.qr
				.solve(s.b)
				.getColumn(0)
				.map((x, j) => x / s.norms[j])
		: null;
}

/**
 * Leverages h_ii of an unweighted least-squares design (diagonal of the hat matrix X(XᵀX)⁻¹Xᵀ),
 * from R of its QR: h_ii = |R⁻ᵀ x_i|² (Golub & Van Loan, Matrix Computations, least-squares
 * chapter). The leave-one-out residual of point i is then e_i / (1 − h_ii) without refitting
 * (the PRESS residual; Allen 1974, Technometrics 16, 125).
 */
export function leverages(rows: number[][]): number[] | null {
	const s = scaledQr(
		rows,
		rows.map(() => 0)
	);
	if (!s) return null;
	const r = s.qr.upperTriangularMatrix;
	const p = s.norms.length;
	return rows.map((row) => {
		const u = new Array<number>(p);
		let h = 0;
		for (let j = 0; j < p; j++) {
			let acc = row[j] / s.norms[j];
			for (let k = 0; k < j; k++) acc -= r.get(k, j) * u[k];
			u[j] = acc / r.get(j, j);
			h += u[j] * u[j];
		}
		return h;
	});
}

export function residualStats(fn: FormFunctions, points: CurvePoint[]): { rmse_v: number; max_error_v: number } {
	let sq = 0;
	let max = 0;
	for (const p of points) {
		const r = Math.abs(fn.value(p.soc) - p.ocv_v);
		sq += r * r;
		max = Math.max(max, r);
	}
	return { rmse_v: Math.sqrt(sq / points.length), max_error_v: max };
}

export function fitCombinedParams(points: CurvePoint[], epsilon: number, weights?: number[]): CombinedParams | null {
	const rows = points.map((p) => combinedBasis(scaledSoc(p.soc, epsilon)));
	const k = leastSquares(
		rows,
		points.map((p) => p.ocv_v),
		weights
	);
	return k ? { k0: k[0], k1: k[1], k2: k[2], k3: k[3], k4: k[4], epsilon } : null;
}

export function fitRedlichKisterParams(
	points: CurvePoint[],
	epsilon: number,
	order: number,
	weights?: number[]
): RedlichKisterParams | null {
	const vt = referenceTemperatureVoltage();
	const rows = points.map((p) => {
		const x = 1 - scaledSoc(p.soc, epsilon);
		return [1, ...Array.from({ length: order }, (_, k) => rkTerm(k, x) / FARADAY)];
	});
	const target = points.map((p) => {
		const s = scaledSoc(p.soc, epsilon);
		return p.ocv_v - vt * Math.log(s / (1 - s));
	});
	const c = leastSquares(rows, target, weights);
	return c ? { e0_v: c[0], a_j_per_mol: c.slice(1), epsilon } : null;
}

type FitOutput = {
	ok: boolean;
	parameters: Record<string, number>;
	rmse_v: number;
	max_error_v: number;
	monotonic: boolean;
	model: OcvModel | null;
	error?: string;
};

function failed(error: string): FitOutput {
	return { ok: false, parameters: {}, rmse_v: NaN, max_error_v: NaN, monotonic: false, model: null, error };
}

function inputError(input: { chemistry: unknown; temperature_c: number; points: CurvePoint[] }): string | null {
	if (!isChemistryCode(input.chemistry)) return 'unknown chemistry code';
	if (!Number.isFinite(input.temperature_c) || input.temperature_c <= -273.15) return 'temperature_c must be a finite °C value';
	if (!Array.isArray(input.points) || input.points.length < MIN_POINTS) return `at least ${MIN_POINTS} points are needed`;
	const bad = input.points.some((p) => !(p.soc >= 0 && p.soc <= 1) || !Number.isFinite(p.ocv_v));
	if (bad) return 'every point needs soc in [0, 1] and a finite ocv_v';
	if (new Set(input.points.map((p) => p.soc)).size < MIN_POINTS) return `at least ${MIN_POINTS} distinct soc values are needed`;
	return null;
}

function round(x: number, digits: number): number {
	const f = 10 ** digits;
	return Math.round(x * f) / f;
}

function fittedModel(
	chemistry: ChemistryCode,
	params: CombinedParams,
	temperature_c: number,
	n: number,
	stats: { rmse_v: number; max_error_v: number }
): OcvModel {
	// the library's calibrated error curve belongs to its generic curve, not to a curve fitted to a supplier's cell
	const { sigma_model_soc_curve: _genericCurve, ...base } = getLibraryModel(chemistry);
	const fn = combinedFunctions(params);
	return {
		...base,
		entropic_mv_per_k: base.entropic_mv_per_k.map(([z, m]) => [z, m] as [number, number]),
		temperature_range_c: [...base.temperature_range_c],
		version: 'fitted',
		form: 'combined',
		params: { ...params },
		ocv_empty_v: round(fn.value(0), 4),
		ocv_full_v: round(fn.value(1), 4),
		// the fit residual is one more source of model error
		sigma_model_v: Math.sqrt(base.sigma_model_v ** 2 + stats.rmse_v ** 2),
		source: `Combined model fitted by least squares to ${n} reference points at ${temperature_c} °C (rmse ${(stats.rmse_v * 1000).toFixed(2)} mV); limits and entropic table from library ${chemistry} ${base.version}`,
		fit: { temperature_c, point_count: n, ...stats, epsilon: params.epsilon }
	};
}

/** Fits Plett's combined model to a reference curve measured at temperature_c. */
export function fitCombinedModel(input: {
	chemistry: ChemistryCode;
	temperature_c: number;
	points: CurvePoint[];
	epsilon?: number;
}): FitOutput {
	const error = inputError(input);
	if (error) return failed(error);
	const entropic = getLibraryModel(input.chemistry).entropic_mv_per_k;
	const points = input.points.map((p) => ({ soc: p.soc, ocv_v: correctTo25C(p.ocv_v, entropic, p.soc, input.temperature_c) }));
	const grid = input.epsilon === undefined ? EPSILON_GRID : [input.epsilon];
	let best: FitOutput | null = null;
	for (const epsilon of grid) {
		const candidate = fitAtEpsilon(input.chemistry, points, epsilon, input.temperature_c);
		if (!best || better(candidate, best)) best = candidate;
	}
	return best ?? failed('no fit');
}

function better(a: FitOutput, b: FitOutput): boolean {
	if (a.ok !== b.ok) return a.ok;
	if (!Number.isFinite(b.rmse_v)) return Number.isFinite(a.rmse_v);
	return a.rmse_v < b.rmse_v;
}

function fitAtEpsilon(chemistry: ChemistryCode, points: CurvePoint[], epsilon: number, temperature_c: number): FitOutput {
	if (!(epsilon > 0 && epsilon < 0.5)) return failed('epsilon must be in (0, 0.5)');
	const params = fitCombinedParams(points, epsilon);
	if (!params) return failed('points do not determine all five parameters (rank deficient)');
	const fn = combinedFunctions(params);
	const stats = residualStats(fn, points);
	const monotonic = isIncreasing(fn, 0.02, 0.98, 193);
	const parameters = { ...params };
	if (!monotonic)
		return { ok: false, parameters, ...stats, monotonic, model: null, error: 'fitted curve is not increasing over [0.02, 0.98]' };
	if (!isIncreasing(fn))
		return { ok: false, parameters, ...stats, monotonic, model: null, error: 'fitted curve is not increasing near z = 0 or z = 1' };
	return { ok: true, parameters, ...stats, monotonic, model: fittedModel(chemistry, params, temperature_c, points.length, stats) };
}
