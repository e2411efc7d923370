// Calibrated model error: the library's sigma_model_curve_v is recomputed from published cells, and the
// 95 % interval is checked against those published curves (each cell's source is named in
// src/lib/electrochem/calibration/published-cells.ts).
import { describe, expect, it } from 'vitest';
import { evaluateReading, getLibraryModel, ocvAt } from '../../../src/lib/electrochem';
import { CALIBRATED_CHEMISTRIES, deriveSocSigmaCurve } from '../../../src/lib/electrochem/calibration/derive';
import {
	PUBLISHED_CELLS,
	type PublishedCell,
	publishedCurve,
	publishedOcv
} from '../../../src/lib/electrochem/calibration/published-cells';
import type { OcvModel } from '../../../src/lib/electrochem/types';

const PROBES = Array.from({ length: 81 }, (_, i) => 0.1 + i * 0.01);

function median(xs: number[]): number {
	const s = [...xs].sort((a, b) => a - b);
	const m = s.length >> 1;
	return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

describe('derivation', () => {
	it.each(CALIBRATED_CHEMISTRIES)(
		'%s: at least two published cells, and the stored SOC sigma curve is the one derived from them',
		(code) => {
			const model = getLibraryModel(code);
			const cells = PUBLISHED_CELLS.filter((c) => c.chemistry === code);
			expect(cells.length).toBeGreaterThanOrEqual(2);
			expect(model.sigma_model_soc_curve).toEqual(deriveSocSigmaCurve(model, cells));
		}
	);

	it.each(PUBLISHED_CELLS.map((c) => [c.id, c] as const))(
		'%s: 0 %% and 100 %% SOC sit on the cell’s published cut-offs, OCV rising between',
		(_id, cell) => {
			// cut-offs as each source states them (named in published-cells.ts)
			expect(publishedOcv(cell, 0)).toBeCloseTo(cell.cutoffs[0], 6);
			expect(publishedOcv(cell, 1)).toBeCloseTo(cell.cutoffs[1], 6);
			const zs = Array.from({ length: 101 }, (_, i) => i / 100);
			for (let i = 1; i < zs.length; i++) expect(publishedOcv(cell, zs[i])).toBeGreaterThan(publishedOcv(cell, zs[i - 1]));
		}
	);

	it.each(PUBLISHED_CELLS.map((c) => [c.id, c] as const))('%s: mid-SOC OCV in the range handbooks give for the chemistry', (_id, cell) => {
		// 50 % SOC OCV of graphite-anode cells: about 3.6–3.9 V for layered oxides, 3.25–3.35 V for LFP
		// (common practice; e.g. Linden’s Handbook of Batteries, 4th ed., ch. 26, from memory)
		const [lo, hi] = cell.chemistry === 'LFP' ? [3.2, 3.35] : [3.6, 3.9];
		const v = publishedOcv(cell, 0.5);
		expect(v).toBeGreaterThan(lo);
		expect(v).toBeLessThan(hi);
	});
});

function coverage(model: OcvModel, cell: PublishedCell) {
	const ocv = publishedCurve(cell);
	const results = PROBES.map((z) => ({ z, r: evaluateReading(model, { ocv_v: ocv(z), temperature_c: 25 }) }));
	const inside = results.filter(({ z, r }) => r.soc_low <= z && z <= r.soc_high).length;
	const medianHalf = median(results.map(({ r }) => (r.soc_high - r.soc_low) / 2));
	return { results, share: inside / results.length, inside, medianHalf };
}

describe('coverage on published curves (10–90 % SOC, 25 °C, branch unknown)', () => {
	it.each(PUBLISHED_CELLS.map((c) => [c.id, c] as const))('%s: the 95 %% interval holds the true SOC in ≥ 90 %% of probes', (_id, cell) => {
		const { results, share, inside, medianHalf } = coverage(getLibraryModel(cell.chemistry), cell);
		console.log(`${cell.id}: coverage ${inside}/${results.length}, median half-width ${(medianHalf * 100).toFixed(1)} SOC points`);
		expect(share).toBeGreaterThanOrEqual(0.9);
		// a determinate reading must be right: its interval holds the truth
		for (const { z, r } of results) if (r.determinate) expect(z >= r.soc_low && z <= r.soc_high).toBe(true);
	});

	it('a mid-SOC NMC reading gets a bounded interval, not 0–100 %', () => {
		// 3.627 V on the generic NMC curve is about 38 % SOC
		const r = evaluateReading(getLibraryModel('NMC'), { ocv_v: 3.627, temperature_c: 25 });
		expect(r.soc_low).toBeGreaterThan(0.1);
		expect(r.soc_high).toBeLessThan(0.7);
		expect(r.soc_low).toBeLessThan(r.soc);
		expect(r.soc_high).toBeGreaterThan(r.soc);
	});
});

describe('LFP hysteresis and plateau', () => {
	const LFP = getLibraryModel('LFP');

	it.each([-0.04, -0.035, -0.03, 0.03, 0.035, 0.04])('a reading %s V off the 50 %% plateau is indeterminate', (offset) => {
		// LFP two-phase plateau: a few tens of mV of hysteresis and relaxation cannot be told from SOC (common practice)
		for (const last_direction of ['unknown', 'after_charge', 'after_discharge'] as const) {
			const r = evaluateReading(LFP, { ocv_v: ocvAt(LFP, 0.5) + offset, temperature_c: 25 }, { last_direction });
			expect(r.determinate).toBe(false);
			expect(r.flags).toContain('soc_indeterminate');
		}
	});

	it('on the plateau the budget names the plateau as the limit', () => {
		const r = evaluateReading(LFP, { ocv_v: ocvAt(LFP, 0.5), temperature_c: 25 });
		expect(r.uncertainty.limited_by).toBe('plateau');
	});

	it('an unknown branch widens the interval to cover both branches', () => {
		const ocv_v = ocvAt(LFP, 0.95);
		const up = evaluateReading(LFP, { ocv_v, temperature_c: 25 }, { last_direction: 'after_charge' });
		const down = evaluateReading(LFP, { ocv_v, temperature_c: 25 }, { last_direction: 'after_discharge' });
		const both = evaluateReading(LFP, { ocv_v, temperature_c: 25 }, { last_direction: 'unknown' });
		// after a charge the reading sits on the upper branch, so the same voltage means a lower SOC
		expect(up.soc).toBeLessThan(down.soc);
		expect(both.soc_low).toBeLessThanOrEqual(Math.min(up.soc_low, down.soc_low) + 1e-12);
		expect(both.soc_high).toBeGreaterThanOrEqual(Math.max(up.soc_high, down.soc_high) - 1e-12);
		expect(both.uncertainty.hysteresis_v).toBeGreaterThan(0);
		expect(up.uncertainty.hysteresis_v).toBe(0);
	});

	it('refuses an unknown direction, naming the field', () => {
		// @ts-expect-error: bad input on purpose
		expect(() => evaluateReading(LFP, { ocv_v: 3.3, temperature_c: 25 }, { last_direction: 'sideways' })).toThrow(/last_direction/);
	});
});

describe('uncertainty budget', () => {
	const NMC = getLibraryModel('NMC');

	it('the temperature term is |dU/dT| × the temperature uncertainty', () => {
		// NMC dU/dT at 20 % SOC: −0.2 mV/K in the library table (from memory); ±2 K surface probe → 0.4 mV
		const r = evaluateReading(NMC, { ocv_v: ocvAt(NMC, 0.2), temperature_c: 25 });
		expect(r.uncertainty.temperature_v).toBeCloseTo(0.0004, 4);
		const wide = evaluateReading(NMC, { ocv_v: ocvAt(NMC, 0.2), temperature_c: 25 }, { temperature_uncertainty_k: 10 });
		expect(wide.uncertainty.temperature_v).toBeCloseTo(0.002, 4);
	});

	it('the budget names the largest term: a coarse meter, else the model', () => {
		// LTO carries a single 8 mV model error; a 50 mV (1σ) meter outweighs it
		const LTO = getLibraryModel('LTO');
		const r = evaluateReading(LTO, { ocv_v: ocvAt(LTO, 0.5), temperature_c: 25 }, { meter_accuracy_v: 0.05 });
		expect(r.uncertainty.limited_by).toBe('meter');
		const fine = evaluateReading(NMC, { ocv_v: ocvAt(NMC, 0.7), temperature_c: 25 }, { meter_accuracy_v: 0.001 });
		expect(fine.uncertainty.limited_by).toBe('model');
	});

	it('the SOC model error widens the interval by 2σ_SOC in quadrature with the voltage terms', () => {
		// with a perfect meter and a known temperature the voltage terms vanish: the interval is z ± 2σ_SOC(z)
		const sigma = NMC.sigma_model_soc_curve!.find(([z]) => z === 0.5)![1];
		const exact = evaluateReading(
			NMC,
			{ ocv_v: ocvAt(NMC, 0.5), temperature_c: 25 },
			{ meter_accuracy_v: 0, temperature_uncertainty_k: 0 }
		);
		expect(exact.soc_low).toBeCloseTo(0.5 - 2 * sigma, 6);
		expect(exact.soc_high).toBeCloseTo(0.5 + 2 * sigma, 6);
		// a coarse meter (50 mV, 1σ) adds its own half-width in quadrature: sqrt(voltage half² + (2σ_SOC)²)
		const opts = { meter_accuracy_v: 0.05, temperature_uncertainty_k: 0 };
		const reading = { ocv_v: ocvAt(NMC, 0.5), temperature_c: 25 };
		const coarse = evaluateReading(NMC, reading, opts);
		const voltageOnly = evaluateReading({ ...NMC, sigma_model_soc_curve: undefined, sigma_model_v: 0 }, reading, opts);
		expect(coarse.soc_high - coarse.soc).toBeCloseTo(Math.hypot(voltageOnly.soc_high - voltageOnly.soc, 2 * sigma), 9);
		expect(coarse.soc - coarse.soc_low).toBeCloseTo(Math.hypot(voltageOnly.soc - voltageOnly.soc_low, 2 * sigma), 9);
		// an uncalibrated chemistry keeps its model error in volts
		const LMO = getLibraryModel('LMO');
		expect(evaluateReading(LMO, { ocv_v: ocvAt(LMO, 0.5), temperature_c: 25 }).uncertainty.model_v).toBe(LMO.sigma_model_v);
	});

	it('the interval is clipped to [0, 1]', () => {
		for (const z of [0, 0.02, 0.98, 1]) {
			const r = evaluateReading(NMC, { ocv_v: ocvAt(NMC, z), temperature_c: 25 });
			expect(r.soc_low).toBeGreaterThanOrEqual(0);
			expect(r.soc_high).toBeLessThanOrEqual(1);
		}
	});
});
