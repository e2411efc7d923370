// Reading evaluation: SOC with uncertainty, determinacy, pack handling, temperature correction, flags.
import { describe, expect, it } from 'vitest';
import {
	ElectrochemError,
	NO_INFORMATION_SIGMA,
	entropicMvPerK,
	evaluateReading,
	evaluateReadings,
	getLibraryModel,
	invertSoc,
	ocvAt,
	type ReadingInput
} from '../../../src/lib/electrochem';

const NMC = getLibraryModel('NMC');
const LFP = getLibraryModel('LFP');

/** numerical dE/dz by central difference, independent of the analytic slope */
const numericSlope = (m = NMC, z: number) => (ocvAt(m, z + 1e-5) - ocvAt(m, z - 1e-5)) / 2e-5;

describe('determinacy', () => {
	it('NMC at 50 %: σ_SOC is the combined σ over the slope, with the calibrated model error', () => {
		// GUM (JCGM 100:2008) §5.1.2 first-order propagation: σ_SOC = σ_V / |dE/dz|
		const r = evaluateReading(NMC, { ocv_v: ocvAt(NMC, 0.5), temperature_c: 25 }, { meter_accuracy_v: 0.002 });
		expect(r.soc).toBeCloseTo(0.5, 6);
		const u = r.uncertainty;
		// the model term is at least the calibrated value at 50 % (23 mV, derived from published cells)
		expect(u.model_v).toBeGreaterThanOrEqual(0.023);
		const sigmaV = Math.sqrt(u.meter_v ** 2 + u.model_v ** 2 + u.temperature_v ** 2);
		expect(r.soc_sigma).toBeCloseTo(Math.min(sigmaV / numericSlope(NMC, r.soc), NO_INFORMATION_SIGMA), 6);
	});

	it('LTO at 50 % with its single 8 mV model error is determinate', () => {
		// a model without a calibrated curve keeps its single σ_model (LTO sloping curve: common practice)
		const LTO = getLibraryModel('LTO');
		const r = evaluateReading(LTO, { ocv_v: ocvAt(LTO, 0.5), temperature_c: 25 }, { meter_accuracy_v: 0.002 });
		expect(r.determinate).toBe(true);
		expect(r.flags).toEqual([]);
		expect(r.uncertainty.model_v).toBe(LTO.sigma_model_v);
	});

	it('LFP mid-plateau (50 %) is indeterminate', () => {
		// LFP two-phase plateau: OCV nearly flat mid-SOC, so OCV cannot locate SOC (Restvolt physics rule; common practice)
		const r = evaluateReading(LFP, { ocv_v: ocvAt(LFP, 0.5), temperature_c: 25 });
		expect(r.determinate).toBe(false);
		expect(r.flags).toContain('soc_indeterminate');
		expect(r.soc_high - r.soc_low).toBeGreaterThan(0.3);
		expect(r.soc_sigma).toBeLessThanOrEqual(NO_INFORMATION_SIGMA);
	});

	it('Li-SOCl2 is indeterminate across mid-range', () => {
		// Li-SOCl2 OCV stays ≈3.6–3.67 V for most of its life (common practice): OCV carries little information
		const m = getLibraryModel('LISOCL2');
		for (const z of [0.2, 0.4, 0.6, 0.8]) {
			expect(evaluateReading(m, { ocv_v: ocvAt(m, z), temperature_c: 25 }).determinate).toBe(false);
		}
	});

	it('the indeterminate width is configurable', () => {
		// threshold is a product setting (Restvolt issue: default 0.30)
		const reading = { ocv_v: ocvAt(NMC, 0.5), temperature_c: 25 };
		const r = evaluateReading(NMC, reading);
		expect(evaluateReading(NMC, reading, { indeterminate_width: (r.soc_high - r.soc_low) / 2 }).determinate).toBe(false);
	});

	it('the interval is OCV ± 2σ mapped through the curve', () => {
		// coverage factor k = 2 (GUM JCGM 100:2008 §6.3) applied in voltage, then inverted through the monotonic curve
		const LTO = getLibraryModel('LTO');
		const ocv = ocvAt(LTO, 0.4);
		const r = evaluateReading(LTO, { ocv_v: ocv, temperature_c: 25 });
		const u = r.uncertainty;
		const sigma = Math.sqrt(u.meter_v ** 2 + u.model_v ** 2 + u.temperature_v ** 2);
		expect(ocvAt(LTO, r.soc_low)).toBeCloseTo(ocv - 2 * sigma, 9);
		expect(ocvAt(LTO, r.soc_high)).toBeCloseTo(ocv + 2 * sigma, 9);
	});
});

describe('pack handling', () => {
	it('10s NMC pack at 36.8 V → 3.68 V per cell', () => {
		// series string: pack voltage is the sum of cell voltages (Kirchhoff's voltage law)
		const r = evaluateReading(NMC, { ocv_v: 36.8, temperature_c: 25 }, { cells_in_series: 10 });
		expect(r.ocv_cell_v).toBeCloseTo(3.68, 12);
		const single = evaluateReading(NMC, { ocv_v: 3.68, temperature_c: 25 }, { meter_accuracy_v: 0.0002 });
		// meter error on the pack divides by the series count too: 2 mV / 10 = 0.2 mV per cell
		expect(r.soc).toBeCloseTo(single.soc, 12);
		expect(r.soc_sigma).toBeCloseTo(single.soc_sigma, 12);
	});
});

describe('expected OCV and residual', () => {
	it('expected OCV is the model at the declared SOC and reading temperature', () => {
		// residual = measured − predicted (definition used in the Restvolt issue)
		const r = evaluateReading(NMC, { ocv_v: 3.75, temperature_c: 30 }, { declared_soc: 0.6 });
		expect(r.expected_ocv_v).toBeCloseTo(ocvAt(NMC, 0.6, 30), 12);
		expect(r.residual_v).toBeCloseTo(3.75 - ocvAt(NMC, 0.6, 30), 12);
		const none = evaluateReading(NMC, { ocv_v: 3.75, temperature_c: 30 });
		expect(none.expected_ocv_v).toBeNull();
		expect(none.residual_v).toBeNull();
	});
});

describe('temperature correction', () => {
	it('shifts OCV by (T − 25)·dU/dT with the sign of the entropic coefficient', () => {
		// dE/dT = ΔS/(nF) (Gibbs–Helmholtz with ΔG = −nFE; e.g. Atkins' Physical Chemistry, electrochemistry chapter, from memory)
		// NMC table: −0.2 mV/K at z = 0.2 and −0.1 mV/K at z = 0.4 → −0.15 mV/K at z = 0.3
		expect(entropicMvPerK(NMC.entropic_mv_per_k, 0.3)).toBeCloseTo(-0.15, 12);
		const shift = ocvAt(NMC, 0.3, 35) - ocvAt(NMC, 0.3, 25);
		expect(shift * 1000).toBeCloseTo(-1.5, 9); // 10 K × −0.15 mV/K: warmer reads lower
	});

	it('corrects a warm reading back to 25 °C and recovers the SOC', () => {
		// ocv_at_25c = ocv − (T − 25)·dU/dT(z)/1000 (entropic correction; Gibbs–Helmholtz, from memory)
		const ocv35 = ocvAt(NMC, 0.3, 35);
		const r = evaluateReading(NMC, { ocv_v: ocv35, temperature_c: 35 });
		expect(r.soc).toBeCloseTo(0.3, 8);
		expect(r.ocv_at_25c_v).toBeCloseTo(ocvAt(NMC, 0.3, 25), 9);
		// ignoring the temperature would bias the estimate by ≈ 1.5 mV / slope
		const naive = invertSoc(NMC, ocv35, 25, 0).soc;
		expect(Math.abs(naive - 0.3)).toBeGreaterThan(0.001);
	});

	it('flags readings outside the model temperature range', () => {
		// the entropic table is only trusted near room temperature (model metadata)
		const r = evaluateReading(NMC, { ocv_v: 3.7, temperature_c: 50 });
		expect(r.flags).toContain('temperature_out_of_range');
	});
});

describe('flags', () => {
	it('a Li-ion cell resting below its minimum is deep-discharged and below the window', () => {
		// common practice: a lithium-ion cell resting below ≈2.5 V must not be recharged (safety reject)
		const r = evaluateReading(NMC, { ocv_v: 2.3, temperature_c: 25 });
		expect(r.flags).toEqual(expect.arrayContaining(['deep_discharge', 'below_window']));
		expect(r.soc).toBe(0);
		expect(r.soc_low).toBe(0);
	});

	it('above the charge limit is over_voltage and above the window', () => {
		// common practice: 4.2 V class cells must not rest above ≈4.25 V
		const r = evaluateReading(NMC, { ocv_v: 4.3, temperature_c: 25 });
		expect(r.flags).toEqual(expect.arrayContaining(['over_voltage', 'above_window']));
		expect(r.soc).toBe(1);
		expect(r.soc_high).toBe(1);
	});

	it('between the safety floor and the empty end only below_window is raised', () => {
		// NMC: min_safe 2.5 V < ocv_empty 3.0 V (common practice)
		const r = evaluateReading(NMC, { ocv_v: 2.8, temperature_c: 25 });
		expect(r.flags).toContain('below_window');
		expect(r.flags).not.toContain('deep_discharge');
	});
});

describe('input validation', () => {
	it.each([
		[{ ocv_v: NaN, temperature_c: 25 }, {}],
		[{ ocv_v: -1, temperature_c: 25 }, {}],
		[{ ocv_v: 3.7, temperature_c: -300 }, {}],
		[{ ocv_v: 3.7, temperature_c: 25 }, { cells_in_series: 0 }],
		[{ ocv_v: 3.7, temperature_c: 25 }, { cells_in_series: 1.5 }],
		[{ ocv_v: 3.7, temperature_c: 25 }, { declared_soc: 1.2 }],
		[{ ocv_v: 3.7, temperature_c: 25 }, { meter_accuracy_v: -0.001 }]
	])('rejects %o with %o', (reading, opts) => {
		// voltages are ≥ 0 V, temperatures above absolute zero (−273.15 °C, SI Brochure), SOC ∈ [0, 1]
		expect(() => evaluateReading(NMC, reading, opts)).toThrow(ElectrochemError);
	});
});

describe('batch evaluation', () => {
	const readings: ReadingInput[] = Array.from({ length: 10_000 }, (_, i) => ({
		ocv_v: 10 * (2.9 + (1.4 * ((i * 7919) % 10_000)) / 10_000),
		temperature_c: 5 + (i % 40)
	}));
	const opts = { cells_in_series: 10, declared_soc: 0.5, meter_accuracy_v: 0.01 };

	it('gives the same results as evaluateReading in a loop', () => {
		// batch and single paths must agree exactly (Restvolt contract)
		const batch = evaluateReadings(NMC, readings.slice(0, 500), opts);
		const loop = readings.slice(0, 500).map((r) => evaluateReading(NMC, r, opts));
		expect(batch).toEqual(loop);
		const lfp = readings.slice(0, 200).map((r) => ({ ...r, ocv_v: r.ocv_v * 0.85 }));
		expect(evaluateReadings(LFP, lfp, opts)).toEqual(lfp.map((r) => evaluateReading(LFP, r, opts)));
	});

	it('evaluates 10,000 readings in one call (its speed is measured by npm run bench, not here)', () => {
		const out = evaluateReadings(NMC, readings, opts);
		expect(out).toHaveLength(10_000);
		expect(out.every((r) => r.soc >= 0 && r.soc <= 1)).toBe(true);
	});
});
