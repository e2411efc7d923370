// OCV forms: analytic slopes, the Redlich–Kister terms and the Nernst limit.
import { describe, expect, it } from 'vitest';
import { CHEMISTRY_CODES, getLibraryModel, thermalVoltage, validateModel } from '../../../src/lib/electrochem';
import { formFunctions, redlichKisterFunctions, rkTerm } from '../../../src/lib/electrochem/forms';

describe('analytic slopes', () => {
	it.each(CHEMISTRY_CODES)('%s slope matches a central finite difference', (code) => {
		// central difference f'(z) ≈ (f(z+h) − f(z−h))/2h, error O(h²) (any numerical-analysis text)
		const fn = formFunctions(getLibraryModel(code));
		for (const z of [0.01, 0.1, 0.33, 0.5, 0.77, 0.9, 0.99]) {
			const h = 1e-6;
			const numeric = (fn.value(z + h) - fn.value(z - h)) / (2 * h);
			expect(fn.slope(z)).toBeCloseTo(numeric, 4);
		}
	});
});

describe('Redlich–Kister form', () => {
	it('terms match the written-out expansion (2x−1)^(k+1) − 2kx(1−x)(2x−1)^(k−1)', () => {
		// Redlich–Kister expansion as used for intercalation electrodes (Karthikeyan, Sikha & White,
		// J. Power Sources 185 (2008) 1398; from memory)
		const x = 0.37;
		const u = 2 * x - 1;
		expect(rkTerm(0, x)).toBeCloseTo(u, 14);
		expect(rkTerm(1, x)).toBeCloseTo(u ** 2 - 2 * x * (1 - x), 14);
		expect(rkTerm(2, x)).toBeCloseTo(u ** 3 - 4 * x * (1 - x) * u, 14);
		expect(rkTerm(3, x)).toBeCloseTo(u ** 4 - 6 * x * (1 - x) * u ** 2, 14);
		// the fast summation inside the form agrees with the literal terms
		const a = [1200, -300, 450, 80];
		const fn = redlichKisterFunctions({ e0_v: 1.3, a_j_per_mol: a, epsilon: 0 });
		const z = 1 - x; // x = 1 − s and s = z when ε = 0
		const literal = 1.3 + thermalVoltage(298.15) * Math.log(z / (1 - z)) + a.reduce((s, ak, k) => s + ak * rkTerm(k, x), 0) / 96485.33212;
		expect(fn.value(z)).toBeCloseTo(literal, 12);
	});

	it('with no excess terms it is the Nernst equation: 59.16 mV per decade of s/(1−s)', () => {
		// Nernst equation, n = 1, 25 °C: ln10·RT/F = 59.16 mV (common practice 0.0592 V)
		const fn = redlichKisterFunctions({ e0_v: 3.4, a_j_per_mol: [], epsilon: 0 });
		expect(fn.value(0.5)).toBeCloseTo(3.4, 12);
		expect((fn.value(10 / 11) - fn.value(0.5)) * 1000).toBeCloseTo(59.16, 2);
	});
});

describe('validateModel', () => {
	it('refuses malformed or non-invertible models', () => {
		// models from the database are untrusted JSON; a decreasing curve cannot be inverted (Nernst: OCV rises with charge)
		const good = getLibraryModel('NMC');
		expect(validateModel(good)).not.toBeNull();
		expect(validateModel(null)).toBeNull();
		expect(validateModel({ ...good, chemistry: 'XYZ' })).toBeNull();
		expect(validateModel({ ...good, params: { ...good.params, k0: 'x' } })).toBeNull();
		expect(validateModel({ ...good, params: { ...good.params, epsilon: 0 } })).toBeNull();
		expect(validateModel({ ...good, form: 'other' })).toBeNull();
		expect(validateModel({ ...good, ocv_empty_v: 5 })).toBeNull();
		expect(validateModel({ ...good, temperature_range_c: [30, 10] })).toBeNull();
		expect(
			validateModel({
				...good,
				entropic_mv_per_k: [
					[0.5, 0],
					[0.2, 0]
				]
			})
		).toBeNull();
		const p = good.params as Record<string, number>;
		const flipped = { k0: -p.k0, k1: -p.k1, k2: -p.k2, k3: -p.k3, k4: -p.k4, epsilon: p.epsilon };
		expect(validateModel({ ...good, params: flipped })).toBeNull();
	});
});
