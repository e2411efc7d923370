// Monotonicity check of a model's 25 °C curve: inversion needs dE/dz > 0 everywhere it is used.
import type { FormFunctions } from './forms';

export function isIncreasing(fn: FormFunctions, from = 0, to = 1, samples = 1001): boolean {
	let prev = fn.value(from);
	if (!Number.isFinite(prev)) return false;
	for (let i = 1; i < samples; i++) {
		const z = from + ((to - from) * i) / (samples - 1);
		const v = fn.value(z);
		if (!Number.isFinite(v) || !(v > prev) || !(fn.slope(z) > 0)) return false;
		prev = v;
	}
	return fn.slope(from) > 0;
}
