// Forward model: OCV per cell at z and temperature.
import { checkCelsius, checkPositiveInteger, checkRange, fail, throwIf } from './errors';
import { formFunctions } from './forms';
import { entropicShiftV } from './thermal';
import type { OcvModel } from './types';

/** OCV per cell in volts at z ∈ [0, 1] and temperatureC (default 25 °C). */
export function ocvAt(model: OcvModel, soc: number, temperatureC = 25): number {
	throwIf(checkRange(soc, 0, 1, 'soc'));
	throwIf(checkCelsius(temperatureC, 'temperature_c'));
	return formFunctions(model).value(soc) + entropicShiftV(model.entropic_mv_per_k, soc, temperatureC);
}

/** `points` evenly spaced samples from z = 0 to z = 1 (points >= 2). */
export function curve(model: OcvModel, temperatureC: number, points: number): Array<{ soc: number; ocv_v: number }> {
	throwIf(checkPositiveInteger(points, 'points'));
	if (points < 2) throwIf(fail('out_of_range', 'points', 'points must be >= 2'));
	throwIf(checkCelsius(temperatureC, 'temperature_c'));
	const fn = formFunctions(model);
	const out: Array<{ soc: number; ocv_v: number }> = [];
	for (let i = 0; i < points; i++) {
		const soc = i / (points - 1);
		out.push({ soc, ocv_v: fn.value(soc) + entropicShiftV(model.entropic_mv_per_k, soc, temperatureC) });
	}
	return out;
}
