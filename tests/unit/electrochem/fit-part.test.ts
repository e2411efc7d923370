// Part models: the tabulated form (Steffen 1990), isotonic smoothing, leave-one-out CV and 'auto'.
import { describe, expect, it } from 'vitest';
import { fitPartModel, METER_RESOLUTION_V, validateModel, evaluateReading, ocvAt } from '../../../src/lib/electrochem';
import { tabulatedLooErrors } from '../../../src/lib/electrochem/fit-part';
import { formFunctions } from '../../../src/lib/electrochem/forms';
import { nonIncreasingAt, poolAdjacentViolators, steffenSlopes, tabulatedFunctions } from '../../../src/lib/electrochem/tabulated';
import { ALL_PUBLISHED, chen2020Nmc811, ramadass2004Lco, sampled } from './published-curves';

function rmsOver(f: (z: number) => number, g: (z: number) => number, from: number, to: number): number {
	let sq = 0;
	let n = 0;
	for (let i = 0; i <= 160; i++) {
		const z = from + ((to - from) * i) / 160;
		sq += (f(z) - g(z)) ** 2;
		n++;
	}
	return Math.sqrt(sq / n);
}

describe('Steffen interpolant', () => {
	it('passes through its knots and is increasing with a positive slope between them', () => {
		// Steffen 1990, A&A 239, 443: the interpolant goes through the data and is monotone between them
		const pts = sampled(chen2020Nmc811);
		const fn = tabulatedFunctions({ soc: pts.map((p) => p.soc), ocv_v: pts.map((p) => p.ocv_v) });
		for (const p of pts) expect(fn.value(p.soc)).toBeCloseTo(p.ocv_v, 12);
		let prev = -Infinity;
		for (let i = 0; i <= 2000; i++) {
			const v = fn.value(i / 2000);
			expect(v).toBeGreaterThan(prev);
			expect(fn.slope(i / 2000)).toBeGreaterThan(0);
			prev = v;
		}
	});

	it('does not overshoot a step: between two equal-ish neighbours it stays inside their range', () => {
		// Steffen 1990, section 2: no spurious extrema; a sharp step stays within the data's range per interval
		const x = [0, 0.1, 0.2, 0.3, 0.4, 0.5];
		const y = [3.0, 3.001, 3.002, 3.6, 3.601, 3.602];
		const fn = tabulatedFunctions({ soc: x, ocv_v: y });
		for (let i = 0; i < x.length - 1; i++)
			for (let k = 1; k < 20; k++) {
				const v = fn.value(x[i] + ((x[i + 1] - x[i]) * k) / 20);
				expect(v).toBeGreaterThanOrEqual(y[i]);
				expect(v).toBeLessThanOrEqual(y[i + 1]);
			}
	});

	it('matches its slope to a numerical derivative of its value', () => {
		// consistency of value and slope (the inversion's Newton steps use both); central differences
		const pts = sampled(ramadass2004Lco);
		const fn = tabulatedFunctions({ soc: pts.map((p) => p.soc), ocv_v: pts.map((p) => p.ocv_v) });
		for (const z of [0.03, 0.21, 0.5, 0.77, 0.98]) expect(fn.slope(z)).toBeCloseTo((fn.value(z + 1e-6) - fn.value(z - 1e-6)) / 2e-6, 3);
	});

	it('reproduces a straight line exactly (slopes equal the secant)', () => {
		// a cubic Hermite with the secant as both slopes is the line itself (from memory)
		const d = steffenSlopes([0, 0.3, 0.5, 1], [3, 3.3, 3.5, 4]);
		for (const s of d) expect(s).toBeCloseTo(1, 12);
	});
});

describe('isotonic pooling', () => {
	it('names the points that do not rise and pools them into strictly increasing points', () => {
		// pool-adjacent-violators (Barlow et al. 1972): each violating run becomes its mean
		const pts = [
			{ soc: 0, ocv_v: 3.0 },
			{ soc: 0.25, ocv_v: 3.5 },
			{ soc: 0.5, ocv_v: 3.4 },
			{ soc: 0.75, ocv_v: 3.8 },
			{ soc: 1, ocv_v: 4.0 }
		];
		expect(nonIncreasingAt(pts)).toEqual([2]);
		const pooled = poolAdjacentViolators(pts);
		expect(pooled).toHaveLength(4);
		expect(pooled[1].soc).toBeCloseTo(0.375, 12);
		expect(pooled[1].ocv_v).toBeCloseTo(3.45, 12);
		expect(nonIncreasingAt(pooled)).toEqual([]);
	});
});

describe('fitPartModel on published curves (21 points, as a datasheet gives them)', () => {
	it.each(ALL_PUBLISHED)('%s (%s): the tabulated fit is within 3 mV RMSE over 10–90 %% SOC', (_name, chemistry, f) => {
		// target of issue 14: ≤ 3 mV over 10–90 % from 21 points
		const fit = fitPartModel({ chemistry, temperature_c: 25, points: sampled(f), form: 'tabulated' });
		if (!fit.ok) throw new Error(fit.message);
		expect(fit.form).toBe('tabulated');
		expect(rmsOver((z) => formFunctions(fit.model).value(z), f, 0.1, 0.9)).toBeLessThan(0.003);
		expect(fit.rmse_v).toBeLessThan(1e-9); // an interpolant has no residual at its own points
		expect(fit.monotonic).toBe(true);
	});

	it.each(ALL_PUBLISHED)(
		'%s (%s): σ_model from cross-validation is at least the true error over 10–90 %% and at least the meter resolution',
		(_name, chemistry, f) => {
			// leave-one-out predicts with twice the spacing, so it overstates the error of the full fit (conservative)
			const fit = fitPartModel({ chemistry, temperature_c: 25, points: sampled(f) });
			if (!fit.ok) throw new Error(fit.message);
			const trueRms = rmsOver((z) => formFunctions(fit.model).value(z), f, 0.1, 0.9);
			expect(fit.sigma_model_v).toBeGreaterThanOrEqual(trueRms);
			expect(fit.sigma_model_v).toBeGreaterThanOrEqual(METER_RESOLUTION_V);
			expect(fit.model.sigma_model_v).toBe(fit.sigma_model_v);
		}
	);

	it.each(ALL_PUBLISHED)(
		'%s (%s): a model fitted from 21 points holds the true SOC in ≥ 90 %% of probes, sharply outside the LFP plateau',
		(_name, chemistry, f) => {
			// issue 14: coverage ≥ 90 % and a median half-width ≤ 5 SOC points (LFP's plateau excepted) for fitted models
			const fit = fitPartModel({ chemistry, temperature_c: 25, points: sampled(f) });
			if (!fit.ok) throw new Error(fit.message);
			const probes = Array.from({ length: 81 }, (_, i) => 0.1 + i * 0.01);
			const results = probes.map((z) => ({ z, r: evaluateReading(fit.model, { ocv_v: f(z), temperature_c: 25 }) }));
			const inside = results.filter(({ z, r }) => r.soc_low <= z && z <= r.soc_high).length;
			expect(inside / results.length).toBeGreaterThanOrEqual(0.9);
			const halves = results.map(({ r }) => (r.soc_high - r.soc_low) / 2).sort((a, b) => a - b);
			// a flat curve cannot resolve SOC that finely: LFP's plateau, and Marquis 2019's Dualfoil LCO, which rises only
			// 0.22 V from 10 to 90 % SOC (its median half-width is about 6 points); the others rise 0.49–0.84 V
			const flat = chemistry === 'LFP' || f(0.9) - f(0.1) < 0.3;
			if (!flat) expect(halves[halves.length >> 1]).toBeLessThanOrEqual(0.05);
		}
	);

	it('auto picks the form with the smaller leave-one-out error and reports both', () => {
		// selection by cross-validation (Stone 1974, J. R. Stat. Soc. B 36, 111)
		const fit = fitPartModel({ chemistry: 'NMC', temperature_c: 25, points: sampled(ramadass2004Lco) });
		if (!fit.ok) throw new Error(fit.message);
		expect(fit.candidates.map((c) => c.form).sort()).toEqual(['nernst', 'tabulated']);
		const best = Math.min(...fit.candidates.map((c) => c.cv_rmse_v ?? Infinity));
		expect(fit.cv_rmse_v).toBe(best);
		expect(fit.candidates.find((c) => c.form === fit.form)?.cv_rmse_v).toBe(best);
	});

	it('the Nernst form can still be asked for, and is worse than the interpolant on a real cell', () => {
		// issue 14: the 5-parameter form leaves 8–25 mV on published cells; the interpolant ≤ 2 mV
		const nernst = fitPartModel({ chemistry: 'NMC', temperature_c: 25, points: sampled(chen2020Nmc811), form: 'nernst' });
		const tab = fitPartModel({ chemistry: 'NMC', temperature_c: 25, points: sampled(chen2020Nmc811), form: 'tabulated' });
		if (!nernst.ok || !tab.ok) throw new Error('both forms should fit');
		expect(nernst.model.form).toBe('combined');
		const err = (m: typeof nernst.model) => rmsOver((z) => formFunctions(m).value(z), chen2020Nmc811, 0.1, 0.9);
		expect(err(tab.model)).toBeLessThan(err(nernst.model));
	});

	it('the fitted model survives JSON and evaluates a reading back to its SOC inside the interval', () => {
		// round trip: the model object is self-contained (issue 14 item 3)
		const fit = fitPartModel({ chemistry: 'NMC', temperature_c: 25, points: sampled(chen2020Nmc811), form: 'tabulated' });
		if (!fit.ok) throw new Error(fit.message);
		const model = validateModel(JSON.parse(JSON.stringify(fit.model)));
		expect(model).not.toBeNull();
		const truth = 0.43;
		const r = evaluateReading(model!, { ocv_v: chen2020Nmc811(truth), temperature_c: 25 });
		expect(r.soc_low).toBeLessThanOrEqual(truth);
		expect(r.soc_high).toBeGreaterThanOrEqual(truth);
		expect(r.soc_high - r.soc_low).toBeLessThan(0.1);
	});

	it('gives 101 curve points from 0 to 1 in steps of 0.01 at the points’ temperature', () => {
		const fit = fitPartModel({ chemistry: 'NMC', temperature_c: 35, points: sampled(chen2020Nmc811) });
		if (!fit.ok) throw new Error(fit.message);
		expect(fit.curve).toHaveLength(101);
		expect(fit.curve[37].soc).toBe(0.37);
		expect(fit.curve[37].ocv_v).toBeCloseTo(ocvAt(fit.model, 0.37, 35), 12);
	});
});

describe('fitPartModel refusals', () => {
	const good = sampled(chen2020Nmc811);

	it('refuses non-increasing points, naming each, and pools them only when asked', () => {
		// OCV rises with SOC (Nernst equation); a falling point is a measuring or typing error
		const bad = good.map((p, i) => (i === 7 ? { ...p, ocv_v: good[5].ocv_v } : p));
		const refused = fitPartModel({ chemistry: 'NMC', temperature_c: 25, points: bad });
		expect(refused.ok).toBe(false);
		if (refused.ok) return;
		expect(refused.code).toBe('non_monotonic');
		expect(refused.issues.map((i) => i.path)).toEqual(['points.7']);
		const smoothed = fitPartModel({ chemistry: 'NMC', temperature_c: 25, points: bad, smooth: true });
		expect(smoothed.ok && smoothed.smoothed).toBe(true);
	});

	it.each([
		['fewer than 5 points', good.slice(0, 4), 'points'],
		['soc above 1', good.map((p, i) => (i === 3 ? { ...p, soc: 1.2 } : p)), 'points.3.soc'],
		['a duplicate soc', good.map((p, i) => (i === 4 ? { ...p, soc: good[3].soc } : p)), 'points.4.soc'],
		['a non-finite voltage', good.map((p, i) => (i === 2 ? { ...p, ocv_v: NaN } : p)), 'points.2.ocv_v'],
		['more than 5,000 points', Array.from({ length: 5001 }, (_, i) => ({ soc: i / 5000, ocv_v: 3 + i / 5000 })), 'points']
	])('refuses %s, naming the field', (_label, points, path) => {
		const fit = fitPartModel({ chemistry: 'NMC', temperature_c: 25, points });
		expect(fit.ok).toBe(false);
		if (!fit.ok) expect(fit.issues.map((i) => i.path)).toContain(path);
	});
});

describe('leave-one-out of the tabulated form', () => {
	it('equals a full refit without the point (the ±3-knot window is exact)', () => {
		// Steffen's knot slopes use only neighbouring secants (Steffen 1990, eq. 11)
		const pts = sampled(ramadass2004Lco, 15);
		const fast = tabulatedLooErrors(pts);
		for (const i of [1, 2, 7, 12, 13]) {
			const rest = pts.filter((_, k) => k !== i);
			const fn = tabulatedFunctions({ soc: rest.map((p) => p.soc), ocv_v: rest.map((p) => p.ocv_v) });
			expect(fast[i - 1]).toBeCloseTo(fn.value(pts[i].soc) - pts[i].ocv_v, 12);
		}
	});
});
