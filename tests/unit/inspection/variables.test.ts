// Variables (s-method) check and the normality warning.
// Q_U/Q_L are recomputed here from simple-statistics' mean and sample SD (outside reference); the k values
// are from memory (MIL-STD-414 / ISO 3951-1 s-method layout), so only their published structure is checked.
import { describe, expect, it } from 'vitest';
import * as ss from 'simple-statistics';
import { formK, moments, variablesCheck, bimodalityCoefficient } from '../../../src/lib/inspection';
import { normalSample } from './helpers';

describe('s-method Q and k', () => {
	const x = normalSample(21, 20, 3.65, 0.005);
	it('Q_U = (U − x̄)/s and Q_L = (x̄ − L)/s, accept when both ≥ k', () => {
		const v = variablesCheck(x, 3.6, 3.7, 1.0);
		const mean = ss.mean(x);
		const s = ss.sampleStandardDeviation(x);
		expect(v.q_upper).toBeCloseTo((3.7 - mean) / s, 10);
		expect(v.q_lower).toBeCloseTo((mean - 3.6) / s, 10);
		expect(v.k).toBe(formK(20, 1.0));
		expect(v.status).toBe(v.q_upper! >= v.k! && v.q_lower! >= v.k! ? 'accept' : 'reject');
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
