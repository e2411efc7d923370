// Shape and sanity check for models read back from JSON (e.g. a database row or an API body).
// checkModel returns a clean copy or names the first bad field (the optional uncertainty fields
// included); validateModel is the same check as a copy or null. A model that is not increasing over
// [0, 1] at 25 °C is refused because it cannot be inverted.
import { formFunctions } from './forms';
import { isIncreasing } from './monotonic';
import { isChemistryCode } from './models';
import { type ElectrochemErrorInfo, type Result, fail } from './errors';
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

/** A piecewise-linear table over z whose values lie in [0, max]; null when absent, false when bad. */
function cleanOptionalTable(x: unknown, max: number): Array<[number, number]> | null | false {
	if (x === undefined) return null;
	const table = cleanEntropic(x);
	return table && table.every(([, v]) => v >= 0 && v <= max) ? table : false;
}

type Optional = Pick<OcvModel, 'sigma_model_soc_curve' | 'hysteresis_half_v' | 'plateau' | 'determinate_width'>;

/** The optional uncertainty fields, each checked; the first bad one is named. */
function cleanOptional(x: Obj): Result<Optional> {
	const out: Optional = {};
	const curve = cleanOptionalTable(x.sigma_model_soc_curve, 1);
	if (curve === false)
		return bad('sigma_model_soc_curve', 'sigma_model_soc_curve must be [soc, sigma] pairs, soc rising within 0–1, sigma within 0–1');
	if (curve) out.sigma_model_soc_curve = curve;
	const hysteresis = cleanOptionalTable(x.hysteresis_half_v, MAX_HYSTERESIS_HALF_V);
	if (hysteresis === false)
		return bad(
			'hysteresis_half_v',
			`hysteresis_half_v must be [soc, volts] pairs, soc rising within 0–1, volts within 0–${MAX_HYSTERESIS_HALF_V}`
		);
	if (hysteresis) out.hysteresis_half_v = hysteresis;
	if (x.plateau !== undefined) {
		const plateau = cleanRange(x.plateau);
		if (!plateau || plateau[0] < 0 || plateau[1] > 1) return bad('plateau', 'plateau must be [from, to] with 0 <= from < to <= 1');
		out.plateau = plateau;
	}
	if (x.determinate_width !== undefined) {
		const w = x.determinate_width;
		if (!isNum(w) || w <= 0 || w > 1)
			return bad('determinate_width', 'determinate_width must be a number above 0 and at most 1 (a fraction of SOC)');
		out.determinate_width = w;
	}
	return { ok: true, value: out };
}

/** Half the branch gap of any lithium-ion chemistry is tens of mV; 0.5 V would be a unit mistake (common practice). */
export const MAX_HYSTERESIS_HALF_V = 0.5;

const bad = (field: string, message: string): { ok: false; error: ElectrochemErrorInfo } => ({
	ok: false,
	error: fail('invalid_model', field, message)
});

function checkCore(x: Obj): ElectrochemErrorInfo | null {
	if (!isChemistryCode(x.chemistry)) return fail('invalid_model', 'chemistry', 'chemistry must be a known chemistry code');
	if (!isStr(x.name) || !isStr(x.version))
		return fail('invalid_model', isStr(x.name) ? 'version' : 'name', 'name and version must be non-empty text');
	if (x.form !== 'combined' && x.form !== 'redlich_kister' && x.form !== 'tabulated')
		return fail('invalid_model', 'form', 'form must be combined, redlich_kister or tabulated');
	if (!cleanParams(x.form, x.params)) return fail('invalid_model', 'params', `params do not fit the ${x.form} form`);
	if (!cleanEntropic(x.entropic_mv_per_k))
		return fail('invalid_model', 'entropic_mv_per_k', 'entropic_mv_per_k must be [soc, mV/K] pairs, soc rising within 0–1');
	if (!cleanRange(x.temperature_range_c))
		return fail('invalid_model', 'temperature_range_c', 'temperature_range_c must be [low, high] with low < high');
	if (!limitsConsistent(x))
		return fail(
			'invalid_model',
			'limits',
			'voltages must be finite with ocv_empty_v < ocv_full_v, 0 < min_safe_v < max_v and sigma_model_v >= 0'
		);
	if (!isBool(x.rechargeable) || !isBool(x.lithium_ion))
		return fail('invalid_model', 'rechargeable', 'rechargeable and lithium_ion must be true or false');
	if (typeof x.source !== 'string') return fail('invalid_model', 'source', 'source must be text');
	if (x.soc_meaning !== 'state_of_charge' && x.soc_meaning !== 'capacity_remaining')
		return fail('invalid_model', 'soc_meaning', 'soc_meaning must be state_of_charge or capacity_remaining');
	return null;
}

/** A model read back from JSON, checked field by field: a clean copy, or the first bad field named. */
export function checkModel(x: unknown): Result<OcvModel> {
	if (!isObj(x)) return bad('model', 'the model must be an object');
	const core = checkCore(x);
	if (core) return { ok: false, error: core };
	const optional = cleanOptional(x);
	if (!optional.ok) return optional;
	const { sigma_model_soc_curve: _c, hysteresis_half_v: _h, plateau: _p, determinate_width: _w, ...rest } = x as unknown as OcvModel;
	const model: OcvModel = {
		...rest,
		...optional.value,
		params: cleanParams(x.form, x.params)!,
		entropic_mv_per_k: cleanEntropic(x.entropic_mv_per_k)!,
		temperature_range_c: cleanRange(x.temperature_range_c)!
	};
	if (!isIncreasing(formFunctions(model)))
		return bad('params', 'the curve must rise over 0–100 % SOC at 25 °C (it cannot be inverted otherwise)');
	return { ok: true, value: model };
}

export function validateModel(x: unknown): OcvModel | null {
	const result = checkModel(x);
	return result.ok ? result.value : null;
}
