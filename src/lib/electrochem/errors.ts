// One error shape for the whole core. Functions whose contract returns a Result carry it in
// `{ ok: false, error }`; functions whose contract returns a plain value throw it as ElectrochemError.

export type ElectrochemErrorCode = 'not_finite' | 'not_positive' | 'not_integer' | 'out_of_range' | 'unknown_chemistry' | 'invalid_model';

export interface ElectrochemErrorInfo {
	code: ElectrochemErrorCode;
	message: string;
	field: string;
}

export type Result<T> = { ok: true; value: T } | { ok: false; error: ElectrochemErrorInfo };

export class ElectrochemError extends Error {
	readonly code: ElectrochemErrorCode;
	readonly field: string;
	constructor(info: ElectrochemErrorInfo) {
		super(info.message);
		this.name = 'ElectrochemError';
		this.code = info.code;
		this.field = info.field;
	}
}

export function fail(code: ElectrochemErrorCode, field: string, message: string): ElectrochemErrorInfo {
	return { code, field, message };
}

/** Throws when a check returned an error; used by the throwing API. */
export function throwIf(info: ElectrochemErrorInfo | null): void {
	if (info) throw new ElectrochemError(info);
}

export function checkFinite(x: number, field: string): ElectrochemErrorInfo | null {
	return Number.isFinite(x) ? null : fail('not_finite', field, `${field} must be a finite number`);
}

export function checkPositive(x: number, field: string): ElectrochemErrorInfo | null {
	return checkFinite(x, field) ?? (x > 0 ? null : fail('not_positive', field, `${field} must be > 0`));
}

export function checkPositiveInteger(x: number, field: string): ElectrochemErrorInfo | null {
	return checkPositive(x, field) ?? (Number.isInteger(x) ? null : fail('not_integer', field, `${field} must be a positive integer`));
}

export function checkRange(x: number, lo: number, hi: number, field: string): ElectrochemErrorInfo | null {
	return checkFinite(x, field) ?? (x >= lo && x <= hi ? null : fail('out_of_range', field, `${field} must be within [${lo}, ${hi}]`));
}

/** A Celsius temperature must be finite and above absolute zero. */
export function checkCelsius(t_c: number, field: string): ElectrochemErrorInfo | null {
	return checkFinite(t_c, field) ?? (t_c > -273.15 ? null : fail('out_of_range', field, `${field} must be above -273.15 °C`));
}
