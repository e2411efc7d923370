// Variables check (MIL-STD-414 (1957) Section B, standard deviation method) and the normality warning.
// Q_U/Q_L are recomputed here from simple-statistics' mean and sample SD (outside reference). Table B-1 k
// and Table B-3 M values below are FROM MEMORY (no printed copy at hand); marked beside each check.
import { describe, expect, it } from 'vitest';
import * as ss from 'simple-statistics';
import { formK, moments, variablesCheck, bimodalityCoefficient } from '../../../src/lib/inspection';
import { fractionBeyond, incompleteBeta } from '../../../src/lib/inspection/variables';
import { normalSample } from './helpers';

describe('s-method Q and k', () => {
	const x = normalSample(21, 20, 3.65, 0.005);
	it('Q_U = (U − x̄)/s and Q_L = (x̄ − L)/s; two limits are judged by Form 2, p̂U + p̂L ≤ M', () => {
		const v = variablesCheck(x, 3.6, 3.7, 1.0);
		const mean = ss.mean(x);
		const s = ss.sampleStandardDeviation(x);
		expect(v.q_upper).toBeCloseTo((3.7 - mean) / s, 10);
		expect(v.q_lower).toBeCloseTo((mean - 3.6) / s, 10);
		expect(v.k).toBe(formK(20, 1.0));
		expect(v.max_p).toBeCloseTo(fractionBeyond(v.k!, 20), 12);
		expect(v.status).toBe(v.p_upper! + v.p_lower! <= v.max_p! ? 'accept' : 'reject');
		expect(v.method).toMatch(/^MIL-STD-414 \(1957\) Section B/);
	});
	it('rejects when a limit moves inside k·s of the mean', () => {
		const mean = ss.mean(x);
		const s = ss.sampleStandardDeviation(x);
		const k = formK(20, 1.0)!;
		expect(variablesCheck(x, mean - (k + 0.01) * s, mean + 10 * s, 1.0).status).toBe('accept');
		expect(variablesCheck(x, mean - (k - 0.01) * s, mean + 10 * s, 1.0).status).toBe('reject');
	});
	it('not applicable below 3 values', () => {
		expect(variablesCheck([3.6, 3.61], 3, 4, 1.0).status).toBe('not_applicable');
	});
	it('k grows with n and falls with AQL, as in the published s-method tables', () => {
		const ns = [5, 7, 10, 15, 20, 25, 35, 50, 75, 100];
		const aqls = [0.65, 1.0, 1.5, 2.5, 4.0, 6.5];
		for (const aql of aqls) for (let i = 1; i < ns.length; i++) expect(formK(ns[i], aql)!).toBeGreaterThan(formK(ns[i - 1], aql)!);
		for (const n of ns) for (let j = 1; j < aqls.length; j++) expect(formK(n, aqls[j])!).toBeLessThan(formK(n, aqls[j - 1])!);
	});
});

describe('MIL-STD-414 Section B tables', () => {
	it('Table B-1, n = 3 (code B): no plan at AQL 1.5, k 1.12 at 2.5, 0.958 at 4.0, 0.765 at 6.5 (from memory; the row was one AQL column off)', () => {
		expect(formK(3, 1.5)).toBeNull();
		expect([formK(3, 2.5), formK(3, 4.0), formK(3, 6.5)]).toEqual([1.12, 0.958, 0.765]);
	});
	it('the B-5 estimator at Q = k gives Table B-3 M for n = 3: 18.86 % at AQL 4.0, 26.94 % at 6.5 (from memory)', () => {
		expect(100 * fractionBeyond(formK(3, 4.0)!, 3)).toBeCloseTo(18.86, 1);
		expect(100 * fractionBeyond(formK(3, 6.5)!, 3)).toBeCloseTo(26.94, 1);
	});
	it('worked example, MIL-STD-414 Section B Example B-1 (Form 1, upper limit 650 Ω, n 10, AQL 2.5; values from memory): x̄ 647, s 17.22, Q_U 0.174 < k 1.41 → not acceptable', () => {
		const resistances = [643, 651, 619, 627, 658, 670, 673, 641, 638, 650];
		const check = variablesCheck(resistances, null, 650, 2.5);
		expect(check.mean).toBe(647);
		expect(check.sd!).toBeCloseTo(17.22, 2);
		expect(check.q_upper!).toBeCloseTo(0.174, 3);
		expect(check.k).toBe(1.41);
		expect(check.status).toBe('reject');
	});
	it('Table B-3 M for n = 10 at AQL 2.5 is 7.26 % (from memory); the B-5 estimator at Q = k = 1.41 gives it within 0.01', () => {
		expect(Math.abs(100 * fractionBeyond(1.41, 10) - 7.26)).toBeLessThanOrEqual(0.01);
		// The same sample against 620–680 Ω is judged by Form 2 against that M, never by k on each side.
		const twoSided = variablesCheck([643, 651, 619, 627, 658, 670, 673, 641, 638, 650], 620, 680, 2.5);
		expect(twoSided.max_p!).toBeCloseTo(fractionBeyond(1.41, 10), 12);
		expect(twoSided.p_upper! + twoSided.p_lower!).toBeLessThan(twoSided.max_p!);
		expect(twoSided.q_lower!).toBeGreaterThan(1.41); // Q_L 1.57 and Q_U 1.92 both pass k alone
	});
	it('incomplete beta: I_x(½, ½) = (2/π)·arcsin √x (closed form, any table of the beta function)', () => {
		for (const x of [0.05, 0.3, 0.5, 0.9]) expect(incompleteBeta(x, 0.5, 0.5)).toBeCloseTo((2 / Math.PI) * Math.asin(Math.sqrt(x)), 12);
		for (const x of [0.2, 0.7]) expect(incompleteBeta(x, 1, 1)).toBeCloseTo(x, 12);
	});
	it('a double limit is not judged with the one-sided k on each side: both Q just above k still rejects', () => {
		const x = normalSample(41, 10, 3.65, 0.005);
		const mean = ss.mean(x);
		const s = ss.sampleStandardDeviation(x);
		const k = formK(10, 1.0)!;
		const v = variablesCheck(x, mean - (k + 0.02) * s, mean + (k + 0.02) * s, 1.0);
		expect(v.q_upper! >= k && v.q_lower! >= k).toBe(true);
		expect(v.status).toBe('reject');
		expect(variablesCheck(x, null, mean + (k + 0.02) * s, 1.0).status).toBe('accept');
	});
});

describe('normality warning', () => {
	it('G1 and G2 match simple-statistics sampleSkewness / sampleKurtosis', () => {
		const x = normalSample(5, 60, 0, 1).map((v) => v * v);
		const m = moments(x);
		expect(m.skewness).toBeCloseTo(ss.sampleSkewness(x), 10);
		expect(m.kurtosis).toBeCloseTo(ss.sampleKurtosis(x), 10);
	});
	it('a mixed lot of two OCV populations 40 mV apart triggers the warning; one population does not', () => {
		const one = normalSample(31, 200, 3.65, 0.004);
		const mixed = [...normalSample(32, 100, 3.63, 0.004), ...normalSample(33, 100, 3.67, 0.004)];
		expect(variablesCheck(one, 3.5, 3.8, 1.0).normality_warning).toBe(false);
		const v = variablesCheck(mixed, 3.5, 3.8, 1.0);
		expect(v.normality_warning).toBe(true);
		expect(v.bimodality_coefficient!).toBeGreaterThan(5 / 9);
	});
	it('BC of a uniform-like sample is near 5/9', () => {
		const u = Array.from({ length: 1001 }, (_, i) => i / 1000);
		expect(bimodalityCoefficient(moments(u))!).toBeCloseTo(5 / 9, 2);
	});
});
