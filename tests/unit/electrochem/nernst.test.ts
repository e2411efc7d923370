// Constants and Nernst relations checked against CODATA 2018 and open-textbook worked examples.
import { describe, expect, it } from 'vitest';
import {
	FARADAY,
	GAS_CONSTANT,
	cellPotentialReport,
	nernstPotential,
	nernstPotentialLog10,
	standardPotentialFromK,
	thermalVoltage
} from '../../../src/lib/electrochem';

// CODATA 2018 exact defining constants (NIST, "CODATA Recommended Values of the Fundamental Physical Constants: 2018").
const AVOGADRO = 6.02214076e23;
const ELEMENTARY_CHARGE = 1.602176634e-19;
const BOLTZMANN = 1.380649e-23;

describe('constants (CODATA 2018)', () => {
	it('F and R equal the CODATA 2018 values', () => {
		// CODATA 2018: F = 96 485.332 12 C/mol, R = 8.314 462 618 J/(mol·K)
		expect(FARADAY).toBe(96485.33212);
		expect(GAS_CONSTANT).toBe(8.314462618);
	});

	it('F = N_A·e and R = N_A·k from the exact SI defining constants', () => {
		// CODATA 2018 / SI Brochure 9th ed. (2019): N_A, e, k exact; F and R follow from them
		expect(FARADAY / (AVOGADRO * ELEMENTARY_CHARGE)).toBeCloseTo(1, 10);
		expect(GAS_CONSTANT / (AVOGADRO * BOLTZMANN)).toBeCloseTo(1, 9);
	});

	it('RT/F at 298.15 K is 25.693 mV and ln10·RT/F is 59.16 mV', () => {
		// CODATA 2018 arithmetic: 8.314462618 × 298.15 / 96485.33212 = 0.0256926 V
		expect(thermalVoltage(298.15) * 1000).toBeCloseTo(25.693, 3);
		// "0.0592 V per decade at 25 °C" (common practice; OpenStax Chemistry 2e §17.4 uses 0.0592 V/n)
		expect(Math.LN10 * thermalVoltage(298.15) * 1000).toBeCloseTo(59.16, 2);
		expect(Math.LN10 * thermalVoltage(298.15)).toBeCloseTo(0.0592, 4);
	});
});

describe('Nernst equation worked examples', () => {
	it('Daniell cell Zn|Zn²⁺(0.010 M)||Cu²⁺(1.0 M)|Cu gives ≈1.159 V', () => {
		// E° = 1.10 V, n = 2, Q = [Zn²⁺]/[Cu²⁺] = 0.010 → E = 1.10 + 0.0592 = 1.159 V.
		// Nernst example of OpenStax Chemistry 2e §17.4 (from memory); same numbers in Pearson's
		// general-chemistry Nernst equation calculator, example 1 (pearson.com/channels/general-chemistry).
		const e = nernstPotential({ e0_v: 1.1, n: 2, temperature_k: 298.15, q: 0.01 });
		expect(e.ok).toBe(true);
		if (e.ok) expect(e.value).toBeCloseTo(1.159, 3);
	});

	it('Fe³⁺/Fe²⁺ half-cell with [Fe²⁺]/[Fe³⁺] = 0.10 gives ≈0.829 V (log10 form agrees)', () => {
		// Pearson general-chemistry Nernst equation calculator, example 2: E = 0.77 − 0.05916·log(0.10) ≈ 0.829 V
		const ln = nernstPotential({ e0_v: 0.77, n: 1, temperature_k: 298.15, q: 0.1 });
		const lg = nernstPotentialLog10({ e0_v: 0.77, n: 1, temperature_k: 298.15, log10_q: -1 });
		expect(ln.ok && lg.ok).toBe(true);
		if (ln.ok && lg.ok) {
			expect(ln.value).toBeCloseTo(0.829, 3);
			expect(lg.value).toBeCloseTo(ln.value, 12);
		}
	});

	it('ΔG° ≈ −212 kJ/mol for E° = 1.10 V, n = 2', () => {
		// OpenStax Chemistry 2e §17.4, ΔG° = −nFE° (from memory): −2 × 96 485 × 1.10 J/mol = −212.3 kJ/mol
		const r = cellPotentialReport({ e0_v: 1.1, n: 2, temperature_c: 25, q: 1 });
		expect(r.ok).toBe(true);
		if (r.ok) {
			expect(r.value.delta_g0_kj_per_mol).toBeCloseTo(-212.3, 1);
			expect(r.value.delta_g_kj_per_mol).toBeCloseTo(r.value.delta_g0_kj_per_mol, 9); // Q = 1 → E = E°
			// Daniell cell K ≈ 1.5 × 10^37 (from memory); own arithmetic: log10 K = 2·1.10/0.0591597 = 37.19
			expect(r.value.log10_k).toBeCloseTo(37.19, 2);
		}
	});

	it('K for Cu + 2Ag⁺ ⇌ Cu²⁺ + 2Ag with E° = 0.46 V is ≈3.5 × 10^15', () => {
		// OpenStax Chemistry 2e §17.4 example (K ≈ 3.5 × 10^15; from memory).
		// Own arithmetic: log10 K = 2 × 0.46 / 0.0591597 = 15.551 → K = 3.56 × 10^15.
		const r = cellPotentialReport({ e0_v: 0.46, n: 2, temperature_c: 25, q: 1 });
		expect(r.ok).toBe(true);
		if (r.ok) {
			expect(r.value.log10_k).toBeCloseTo(15.551, 3);
			expect(r.value.k).toBeGreaterThan(3.4e15);
			expect(r.value.k).toBeLessThan(3.7e15);
			// ΔG° = −2 × 96 485 × 0.46 J/mol = −88.8 kJ/mol (same section, from memory)
			expect(r.value.delta_g0_kj_per_mol).toBeCloseTo(-88.77, 2);
		}
	});

	it('E° from K inverts K from E°', () => {
		// E° = (RT/nF)·ln K (OpenStax Chemistry 2e §17.4, from memory): K = 3.56 × 10^15, n = 2 → 0.46 V
		const k = Math.pow(10, 15.551);
		const e0 = standardPotentialFromK({ k, n: 2, temperature_k: 298.15 });
		expect(e0.ok).toBe(true);
		if (e0.ok) expect(e0.value).toBeCloseTo(0.46, 4);
	});

	it('standard potentials from a handbook table give E°cell = 1.1037 V for Zn/Cu', () => {
		// CRC Handbook of Chemistry and Physics, "Electrochemical Series" (also OpenStax Chemistry 2e
		// Appendix L): Zn²⁺/Zn −0.7618 V, Cu²⁺/Cu +0.3419 V (from memory). E°cell = cathode − anode.
		const e0 = 0.3419 - -0.7618;
		const r = nernstPotential({ e0_v: e0, n: 2, temperature_k: 298.15, q: 1 });
		expect(r.ok).toBe(true);
		if (r.ok) expect(r.value).toBeCloseTo(1.1037, 4);
		// ten-fold Q drops E by 59.16/2 mV for n = 2 (Nernst slope, common practice 0.0592/n V per decade)
		const r10 = nernstPotential({ e0_v: e0, n: 2, temperature_k: 298.15, q: 10 });
		if (r10.ok) expect((1.1037 - r10.value) * 1000).toBeCloseTo(29.58, 2);
		expect(r10.ok).toBe(true);
	});

	it('RT/F scales with absolute temperature (Nernst slope at 310.15 K)', () => {
		// Nernst equation E = E° − (RT/nF) ln Q; own arithmetic at 37 °C: RT/F = 8.314462618·310.15/96485.33212 = 26.727 mV
		const r = cellPotentialReport({ e0_v: 0, n: 1, temperature_c: 37, q: Math.E });
		expect(r.ok).toBe(true);
		if (r.ok) expect(r.value.e_v * 1000).toBeCloseTo(-26.727, 3);
	});
});

describe('input validation returns typed errors', () => {
	const base = { e0_v: 1.1, n: 2, temperature_k: 298.15, q: 0.01 };
	it.each([
		['n = 0', { n: 0 }, 'n', 'not_positive'],
		['n = 1.5', { n: 1.5 }, 'n', 'not_integer'],
		['n = −2', { n: -2 }, 'n', 'not_positive'],
		['T = 0 K', { temperature_k: 0 }, 'temperature_k', 'not_positive'],
		['T < 0 K', { temperature_k: -5 }, 'temperature_k', 'not_positive'],
		['Q = 0', { q: 0 }, 'q', 'not_positive'],
		['Q < 0', { q: -1 }, 'q', 'not_positive'],
		['Q = NaN', { q: NaN }, 'q', 'not_finite'],
		['E° = NaN', { e0_v: NaN }, 'e0_v', 'not_finite'],
		['n = NaN', { n: NaN }, 'n', 'not_finite'],
		['T = Infinity', { temperature_k: Infinity }, 'temperature_k', 'not_finite']
	] as const)('%s is rejected', (_label, patch, field, code) => {
		// Nernst equation is defined for n a positive integer, T > 0 K and Q > 0 (ln Q); OpenStax Chemistry 2e §17.4
		const r = nernstPotential({ ...base, ...patch });
		expect(r.ok).toBe(false);
		if (!r.ok) {
			expect(r.error.field).toBe(field);
			expect(r.error.code).toBe(code);
			expect(r.error.message.length).toBeGreaterThan(0);
		}
	});

	it('cellPotentialReport names temperature_c when T is at or below absolute zero', () => {
		// 0 K = −273.15 °C (SI Brochure 9th ed.)
		const r = cellPotentialReport({ e0_v: 1.1, n: 2, temperature_c: -273.15, q: 1 });
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.error.field).toBe('temperature_c');
	});

	it('E° from K rejects K ≤ 0', () => {
		// ln K is undefined for K ≤ 0 (OpenStax Chemistry 2e §17.4 relation E° = (RT/nF) ln K)
		const r = standardPotentialFromK({ k: 0, n: 2, temperature_k: 298.15 });
		expect(r.ok).toBe(false);
	});
});
