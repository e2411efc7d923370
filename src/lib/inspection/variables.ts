// Variables check in the style of ISO 3951-1 (s-method, "form k"), plus a normality warning.
// The k values below are recalled FROM MEMORY from the MIL-STD-414 Table B-1 / ISO 3951-1 s-method
// layout (normal inspection, one-sided form k); they are approximate (about ±0.03) and must be
// checked against the standard before contractual use. The attributes plan stays the decision rule;
// this check is advisory.

/** Tabulated sample sizes and AQLs of the k table. */
const K_SAMPLE_SIZES = [3, 4, 5, 7, 10, 15, 20, 25, 35, 50, 75, 100] as const;
const K_AQLS = [0.65, 1.0, 1.5, 2.5, 4.0, 6.5] as const;
/** k by sample size row, AQL column; null where the table has no plan for that n (use a larger n). */
const K_TABLE: ReadonlyArray<ReadonlyArray<number | null>> = [
	/*   3 */ [null, null, 1.12, 0.958, 0.765, 0.566],
	/*   4 */ [null, 1.45, 1.34, 1.17, 1.01, 0.814],
	/*   5 */ [1.65, 1.53, 1.4, 1.24, 1.07, 0.874],
	/*   7 */ [1.75, 1.62, 1.5, 1.33, 1.15, 0.955],
	/*  10 */ [1.84, 1.72, 1.58, 1.41, 1.23, 1.03],
	/*  15 */ [1.91, 1.79, 1.65, 1.47, 1.3, 1.09],
	/*  20 */ [1.96, 1.82, 1.69, 1.51, 1.33, 1.12],
	/*  25 */ [1.98, 1.85, 1.72, 1.53, 1.35, 1.14],
	/*  35 */ [2.03, 1.89, 1.76, 1.57, 1.39, 1.18],
	/*  50 */ [2.08, 1.93, 1.8, 1.61, 1.42, 1.21],
	/*  75 */ [2.12, 1.98, 1.84, 1.65, 1.46, 1.24],
	/* 100 */ [2.14, 2.0, 1.86, 1.67, 1.48, 1.26]
];

/**
 * k for a sample of n at an AQL: the row of the largest tabulated n not above the actual n (the k of a
 * smaller sample is the smaller, more lenient one, matching the sample actually backing s). Null when
 * the AQL is not tabulated or no row has a plan.
 */
export function formK(n: number, aql: number): number | null {
	const col = K_AQLS.findIndex((a) => Math.abs(a - aql) < 1e-9);
	if (col < 0 || n < 3) return null;
	for (let row = K_SAMPLE_SIZES.length - 1; row >= 0; row--) {
		if (K_SAMPLE_SIZES[row] <= n && K_TABLE[row][col] !== null) return K_TABLE[row][col];
	}
	return null;
}

export interface Moments {
	n: number;
	mean: number;
	sd: number;
	/** Adjusted Fisher–Pearson skewness G1. */
	skewness: number | null;
	/** Sample excess kurtosis G2. */
	kurtosis: number | null;
}

export function moments(values: readonly number[]): Moments {
	const n = values.length;
	let sum = 0;
	for (const v of values) sum += v;
	const mean = n ? sum / n : NaN;
	let m2 = 0;
	let m3 = 0;
	let m4 = 0;
	for (const v of values) {
		const d = v - mean;
		const d2 = d * d;
		m2 += d2;
		m3 += d2 * d;
		m4 += d2 * d2;
	}
	const sd = n >= 2 ? Math.sqrt(m2 / (n - 1)) : NaN;
	const skewness = n >= 3 && m2 > 0 ? (n * m3) / ((n - 1) * (n - 2) * sd ** 3) : null;
	const kurtosis = n >= 4 && m2 > 0 ? ((n - 1) / ((n - 2) * (n - 3))) * ((n * (n + 1) * m4) / (m2 * m2) - 3 * (n - 1)) : null;
	return { n, mean, sd, skewness, kurtosis };
}

/** Bimodality coefficient BC = (G1² + 1) / (G2 + 3(n−1)²/((n−2)(n−3))); 5/9 ≈ 0.555 is the uniform's value. */
export function bimodalityCoefficient(m: Moments): number | null {
	if (m.skewness === null || m.kurtosis === null) return null;
	return (m.skewness ** 2 + 1) / (m.kurtosis + (3 * (m.n - 1) ** 2) / ((m.n - 2) * (m.n - 3)));
}

/** Jarque–Bera statistic n/6 · (G1² + G2²/4); ~χ²(2) for large normal samples. */
export function jarqueBera(m: Moments): number | null {
	if (m.skewness === null || m.kurtosis === null) return null;
	return (m.n / 6) * (m.skewness ** 2 + m.kurtosis ** 2 / 4);
}

/** χ²(2) upper 1 % point: −2·ln(0.01). */
export const JB_CRITICAL_1PCT = -2 * Math.log(0.01);
export const BC_THRESHOLD = 5 / 9;
/**
 * Below this many values skewness/kurtosis are too noisy to warn on (our choice): with a dozen values
 * even a normal or evenly spread sample often shows BC > 5/9.
 */
export const NORMALITY_MIN_N = 20;

export interface VariablesCheck {
	status: 'accept' | 'reject' | 'not_applicable';
	reason: string | null;
	n: number;
	mean: number | null;
	sd: number | null;
	k: number | null;
	q_upper: number | null;
	q_lower: number | null;
	bimodality_coefficient: number | null;
	jarque_bera: number | null;
	normality_warning: boolean;
}

/**
 * s-method: Q_U = (U − x̄)/s, Q_L = (x̄ − L)/s, accept when both ≥ k. The method assumes a normal
 * distribution, so a mixed lot (two populations, e.g. two production dates) raises a warning when the
 * bimodality coefficient exceeds 5/9 or Jarque–Bera exceeds the χ²(2) 1 % point.
 */
export function variablesCheck(values: readonly number[], lower: number, upper: number, aql: number | null): VariablesCheck {
	const m = moments(values);
	const bc = bimodalityCoefficient(m);
	const jb = jarqueBera(m);
	const base = {
		n: m.n,
		mean: m.n ? m.mean : null,
		sd: m.n >= 2 ? m.sd : null,
		bimodality_coefficient: bc,
		jarque_bera: jb,
		normality_warning: m.n >= NORMALITY_MIN_N && ((bc ?? 0) > BC_THRESHOLD || (jb ?? 0) > JB_CRITICAL_1PCT)
	};
	const k = aql === null ? null : formK(m.n, aql);
	const na = (reason: string): VariablesCheck => ({ ...base, status: 'not_applicable', reason, k, q_upper: null, q_lower: null });
	if (m.n < 3) return na('Fewer than 3 values.');
	if (k === null) return na('No k tabulated for this sample size and AQL.');
	if (!(m.sd > 0)) return na('No spread (s = 0): the s-method is undefined.');
	const qU = (upper - m.mean) / m.sd;
	const qL = (m.mean - lower) / m.sd;
	const ok = qU >= k && qL >= k;
	return { ...base, status: ok ? 'accept' : 'reject', reason: ok ? null : 'Q below k.', k, q_upper: qU, q_lower: qL };
}
