// Evaluation of the OCV forms (combined, Redlich–Kister; the tabulated one lives in tabulated.ts) at the 25 °C reference. Each form compiles to a pair of plain
// functions (value, slope dE/dz) over closed-over numbers so the hot loop does no lookups.
import { FARADAY, REFERENCE_TEMPERATURE_K, thermalVoltage } from './constants';
import { type TabulatedParams, tabulatedFunctions } from './tabulated';
import type { CombinedParams, OcvModel, RedlichKisterParams } from './types';

export interface FormFunctions {
	value(z: number): number;
	slope(z: number): number;
}

const VT_REF = thermalVoltage(REFERENCE_TEMPERATURE_K);

export function scaledSoc(z: number, epsilon: number): number {
	return epsilon + (1 - 2 * epsilon) * z;
}

/** Regressors of the combined model in K0..K4 order; the model is linear in them. */
export function combinedBasis(s: number): [number, number, number, number, number] {
	return [1, -1 / s, -s, Math.log(s), Math.log(1 - s)];
}

export function combinedFunctions(p: CombinedParams): FormFunctions {
	const { k0, k1, k2, k3, k4, epsilon } = p;
	const span = 1 - 2 * epsilon;
	return {
		value(z) {
			const s = epsilon + span * z;
			return k0 - k1 / s - k2 * s + k3 * Math.log(s) + k4 * Math.log(1 - s);
		},
		slope(z) {
			const s = epsilon + span * z;
			return span * (k1 / (s * s) - k2 + k3 / s - k4 / (1 - s));
		}
	};
}

/** Redlich–Kister excess term k (per unit A_k): (2x−1)^(k+1) − 2k·x(1−x)·(2x−1)^(k−1). */
export function rkTerm(k: number, x: number): number {
	const u = 2 * x - 1;
	const lead = Math.pow(u, k + 1);
	return k === 0 ? lead : lead - 2 * k * x * (1 - x) * Math.pow(u, k - 1);
}

/** Σ A_k·term_k(x), powers of (2x−1) built up incrementally (hot path). */
function rkSum(a: Float64Array, x: number): number {
	if (a.length === 0) return 0;
	const u = 2 * x - 1;
	const g = x * (1 - x);
	let sum = a[0] * u;
	let pkm1 = 1; // u^(k−1)
	for (let k = 1; k < a.length; k++) {
		sum += a[k] * (pkm1 * u * u - 2 * k * g * pkm1);
		pkm1 *= u;
	}
	return sum;
}

/** d/dx of rkSum. */
function rkSumSlope(a: Float64Array, x: number): number {
	if (a.length === 0) return 0;
	const u = 2 * x - 1;
	const g = x * (1 - x);
	const gSlope = 1 - 2 * x;
	let sum = 2 * a[0];
	let pkm2 = 0; // u^(k−2), unused at k = 1
	let pkm1 = 1; // u^(k−1)
	for (let k = 1; k < a.length; k++) {
		const lead = 2 * (k + 1) * pkm1 * u;
		const tail = 2 * k * (gSlope * pkm1 + (k > 1 ? 2 * (k - 1) * g * pkm2 : 0));
		sum += a[k] * (lead - tail);
		pkm2 = pkm1;
		pkm1 *= u;
	}
	return sum;
}

export function redlichKisterFunctions(p: RedlichKisterParams): FormFunctions {
	const { e0_v, epsilon } = p;
	const a = Float64Array.from(p.a_j_per_mol);
	const span = 1 - 2 * epsilon;
	return {
		value(z) {
			const s = epsilon + span * z;
			return e0_v + VT_REF * Math.log(s / (1 - s)) + rkSum(a, 1 - s) / FARADAY;
		},
		slope(z) {
			const s = epsilon + span * z;
			// x = 1 − s, dx/dz = −span
			return span * (VT_REF / (s * (1 - s)) - rkSumSlope(a, 1 - s) / FARADAY);
		}
	};
}

export function formFunctions(model: OcvModel): FormFunctions {
	if (model.form === 'tabulated') return tabulatedFunctions(model.params as unknown as TabulatedParams);
	return model.form === 'combined'
		? combinedFunctions(model.params as unknown as CombinedParams)
		: redlichKisterFunctions(model.params as unknown as RedlichKisterParams);
}

export function referenceTemperatureVoltage(): number {
	return VT_REF;
}
