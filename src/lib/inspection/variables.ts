// Variables check by one published method: MIL-STD-414 (1957), Section B, "variability unknown —
// standard deviation method", normal inspection. One limit: Form 1, accept when Q = (U − x̄)/s (or
// (x̄ − L)/s) ≥ k (Table B-1). Two limits: Form 2, accept when the estimated percent beyond the
// limits p̂U + p̂L ≤ M; a double limit is never judged with the one-sided k on each side (lenient).
// p̂ is the table B-5 estimator, computed here exactly: the regularized incomplete beta
// I_x((n−2)/2, (n−2)/2) at x = ½ − Q·√n / (2(n − 1)). M is that estimate at Q = k, which is how
// Table B-3 relates to Table B-1 (from memory; it reproduces the n = 3 row of B-3, 18.86 / 26.94 /
// 33.69 %, within 0.01). The k values are Table B-1 recalled FROM MEMORY (3 significant figures);
// check them against the standard before contractual use. The attributes plan stays the decision
// rule; this check is advisory.

export const VARIABLES_METHOD = 'MIL-STD-414 (1957) Section B, s-method: Form 1 (k) for one limit, Form 2 (p̂U + p̂L ≤ M) for two';

/** Tabulated sample sizes and AQLs of the k table. */
const K_SAMPLE_SIZES = [3, 4, 5, 7, 10, 15, 20, 25, 35, 50, 75, 100] as const;
const K_AQLS = [0.65, 1.0, 1.5, 2.5, 4.0, 6.5] as const;
/** k by sample size row, AQL column; null where the table has no plan for that n (use a larger n). */
const K_TABLE: ReadonlyArray<ReadonlyArray<number | null>> = [
	/*   3 */ [null, null, null, 1.12, 0.958, 0.765],
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
	/** The published method the numbers come from (VARIABLES_METHOD). */
	method: string;
	n: number;
	mean: number | null;
	sd: number | null;
	k: number | null;
	q_upper: number | null;
	q_lower: number | null;
	/** Form 2 (two limits): estimated fraction beyond each limit, their sum and the allowed maximum M (fractions, 0–1). */
	p_upper: number | null;
	p_lower: number | null;
	max_p: number | null;
	bimodality_coefficient: number | null;
	jarque_bera: number | null;
	normality_warning: boolean;
}

/** ln Γ(x), Lanczos (g = 7, 9 terms); accurate to about 1e-15 for x > 0. */
function logGamma(x: number): number {
	const c = [
		0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059, 12.507343278686905,
		-0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7
	];
	const y = x - 1;
	let sum = c[0];
	for (let i = 1; i < c.length; i++) sum += c[i] / (y + i);
	const t = y + 7.5;
	return 0.5 * Math.log(2 * Math.PI) + (y + 0.5) * Math.log(t) - t + Math.log(sum);
}

/** Continued fraction of the incomplete beta (modified Lentz). */
function betaFraction(a: number, b: number, x: number): number {
	let c = 1;
	let d = 1 / (1 - ((a + b) * x) / (a + 1));
	let h = d;
	for (let m = 1; m < 300; m++) {
		const even = (m * (b - m) * x) / ((a + 2 * m - 1) * (a + 2 * m));
		d = 1 / (1 + even * d);
		c = 1 + even / c;
		h *= d * c;
		const odd = (-(a + m) * (a + b + m) * x) / ((a + 2 * m) * (a + 2 * m + 1));
		d = 1 / (1 + odd * d);
		c = 1 + odd / c;
		h *= d * c;
		if (Math.abs(d * c - 1) < 1e-14) break;
	}
	return h;
}

/** Regularized incomplete beta I_x(a, b). */
export function incompleteBeta(x: number, a: number, b: number): number {
	if (x <= 0) return 0;
	if (x >= 1) return 1;
	const front = Math.exp(logGamma(a + b) - logGamma(a) - logGamma(b) + a * Math.log(x) + b * Math.log(1 - x));
	return x < (a + 1) / (a + b + 2) ? (front * betaFraction(a, b, x)) / a : 1 - (front * betaFraction(b, a, 1 - x)) / b;
}

/** MIL-STD-414 Table B-5 estimate of the fraction beyond one limit from its quality index Q and n (n ≥ 3). */
export function fractionBeyond(q: number, n: number): number {
	const x = Math.min(1, Math.max(0, 0.5 - (q * Math.sqrt(n)) / (2 * (n - 1))));
	return incompleteBeta(x, (n - 2) / 2, (n - 2) / 2);
}

/**
 * MIL-STD-414 Section B: Form 1 (Q ≥ k) with one limit, Form 2 (p̂U + p̂L ≤ M) with two. A mixed lot
 * (two populations) breaks the normal model the method assumes, so the bimodality coefficient above
 * 5/9 or Jarque–Bera above the χ²(2) 1 % point raises a warning.
 */
export function variablesCheck(values: readonly number[], lower: number | null, upper: number | null, aql: number | null): VariablesCheck {
	const m = moments(values);
	const bc = bimodalityCoefficient(m);
	const jb = jarqueBera(m);
	const k = aql === null ? null : formK(m.n, aql);
	const base = {
		method: VARIABLES_METHOD,
		n: m.n,
		mean: m.n ? m.mean : null,
		sd: m.n >= 2 ? m.sd : null,
		k,
		bimodality_coefficient: bc,
		jarque_bera: jb,
		normality_warning: m.n >= NORMALITY_MIN_N && ((bc ?? 0) > BC_THRESHOLD || (jb ?? 0) > JB_CRITICAL_1PCT)
	};
	const none = { q_upper: null, q_lower: null, p_upper: null, p_lower: null, max_p: null };
	const na = (reason: string): VariablesCheck => ({ ...base, ...none, status: 'not_applicable', reason });
	if (lower === null && upper === null) return na('No specification limit.');
	if (m.n < 3) return na('Fewer than 3 values.');
	if (k === null) return na('No k tabulated for this sample size and AQL.');
	if (!(m.sd > 0)) return na('No spread (s = 0): the s-method is undefined.');
	const qU = upper === null ? null : (upper - m.mean) / m.sd;
	const qL = lower === null ? null : (m.mean - lower) / m.sd;
	if (qU === null || qL === null) {
		const q = (qU ?? qL) as number;
		const ok = q >= k;
		return { ...base, ...none, q_upper: qU, q_lower: qL, status: ok ? 'accept' : 'reject', reason: ok ? null : 'Q below k (Form 1).' };
	}
	const pU = fractionBeyond(qU, m.n);
	const pL = fractionBeyond(qL, m.n);
	const maxP = fractionBeyond(k, m.n);
	const ok = pU + pL <= maxP;
	return {
		...base,
		q_upper: qU,
		q_lower: qL,
		p_upper: pU,
		p_lower: pL,
		max_p: maxP,
		status: ok ? 'accept' : 'reject',
		reason: ok ? null : 'Estimated percent beyond the two limits above M (Form 2).'
	};
}
