// Shape and sanity check for models read back from JSON (e.g. a database row). Returns a clean
// copy or null; a model that is not increasing over [0, 1] at 25 °C is refused because it
// cannot be inverted.
import { formFunctions } from './forms';
import { isIncreasing } from './monotonic';
import { isChemistryCode } from './models';
import type { OcvModel } from './types';

type Obj = Record<string, unknown>;

export const MIN_TABULATED_POINTS = 5;
export const MAX_TABULATED_POINTS = 5_000;

const isObj = (x: unknown): x is Obj => typeof x === 'object' && x !== null && !Array.isArray(x);
const isNum = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x);
const isStr = (x: unknown): x is string => typeof x === 'string' && x.length > 0;
const isBool = (x: unknown): x is boolean => typeof x === 'boolean';

function validEpsilon(x: unknown): boolean {
	return isNum(x) && x > 0 && x < 0.5;
}

/** Tabulated knots: 5 to 5,000 points, soc strictly increasing in [0, 1], ocv strictly increasing. */
function cleanTabulated(p: Obj): Obj | null {
	const { soc, ocv_v } = p;
	if (!Array.isArray(soc) || !Array.isArray(ocv_v) || soc.length !== ocv_v.length) return null;
	if (soc.length < MIN_TABULATED_POINTS || soc.length > MAX_TABULATED_POINTS) return null;
	if (!soc.every(isNum) || !ocv_v.every(isNum)) return null;
	const rising = (xs: number[]) => xs.every((v, i) => i === 0 || v > xs[i - 1]);
	if (!rising(soc) || !rising(ocv_v) || soc[0] < 0 || soc[soc.length - 1] > 1) return null;
	return { soc: [...soc], ocv_v: [...ocv_v] };
}

function cleanParams(form: unknown, p: unknown): Obj | null {
	if (isObj(p) && form === 'tabulated') return cleanTabulated(p);
	if (!isObj(p) || !validEpsilon(p.epsilon)) return null;
	if (form === 'combined') {
		const keys = ['k0', 'k1', 'k2', 'k3', 'k4'] as const;
		return keys.every((k) => isNum(p[k])) ? { k0: p.k0, k1: p.k1, k2: p.k2, k3: p.k3, k4: p.k4, epsilon: p.epsilon } : null;
	}
	if (form === 'redlich_kister') {
		const a = p.a_j_per_mol;
		const ok = isNum(p.e0_v) && Array.isArray(a) && a.length <= 12 && a.every(isNum);
		return ok ? { e0_v: p.e0_v, a_j_per_mol: [...(a as number[])], epsilon: p.epsilon } : null;
	}
	return null;
}

function cleanEntropic(x: unknown): Array<[number, number]> | null {
	if (!Array.isArray(x) || x.length === 0) return null;
	const rows = x.map((r) => (Array.isArray(r) && r.length === 2 && isNum(r[0]) && isNum(r[1]) ? ([r[0], r[1]] as [number, number]) : null));
	if (rows.some((r) => r === null)) return null;
	const table = rows as Array<[number, number]>;
	const sorted = table.every(([z], i) => z >= 0 && z <= 1 && (i === 0 || z > table[i - 1][0]));
	return sorted ? table : null;
}

function cleanRange(x: unknown): [number, number] | null {
	return Array.isArray(x) && x.length === 2 && isNum(x[0]) && isNum(x[1]) && x[0] < x[1] ? [x[0], x[1]] : null;
}

function limitsConsistent(m: Obj): boolean {
	const nums = ['nominal_v', 'ocv_empty_v', 'ocv_full_v', 'min_safe_v', 'max_v', 'sigma_model_v'];
	if (!nums.every((k) => isNum(m[k]))) return false;
	const n = m as Record<string, number>;
	return n.ocv_empty_v < n.ocv_full_v && n.min_safe_v < n.max_v && n.sigma_model_v >= 0 && n.min_safe_v > 0;
}

export function validateModel(x: unknown): OcvModel | null {
	if (!isObj(x) || !isChemistryCode(x.chemistry) || !isStr(x.name) || !isStr(x.version)) return null;
	if (x.form !== 'combined' && x.form !== 'redlich_kister' && x.form !== 'tabulated') return null;
	const params = cleanParams(x.form, x.params);
	const entropic = cleanEntropic(x.entropic_mv_per_k);
	const range = cleanRange(x.temperature_range_c);
	if (!params || !entropic || !range || !limitsConsistent(x)) return null;
	if (!isBool(x.rechargeable) || !isBool(x.lithium_ion) || typeof x.source !== 'string') return null;
	if (x.soc_meaning !== 'state_of_charge' && x.soc_meaning !== 'capacity_remaining') return null;
	const model = { ...(x as unknown as OcvModel), params, entropic_mv_per_k: entropic, temperature_range_c: range };
	return isIncreasing(formFunctions(model)) ? model : null;
}
