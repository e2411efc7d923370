// The sodium-ion library model: its coefficients are the fit to its typed anchor points (from memory,
// marked in the model), it is monotonic over its window and its limits bracket the curve.
import { describe, expect, it } from 'vitest';
import { CHEMISTRY_CODES, evaluateReading, fitCombinedModel, getLibraryModel, ocvAt } from '../../../src/lib/electrochem';
import { SIB_ANCHORS } from '../../../src/lib/electrochem/models/sodium-ion';

const SIB = getLibraryModel('SIB');

describe('sodium-ion (SIB)', () => {
	it('is a library chemistry, not lithium-ion', () => {
		expect(CHEMISTRY_CODES).toContain('SIB');
		expect(SIB.lithium_ion).toBe(false);
	});

	it('its coefficients are the least-squares fit to its anchor points', () => {
		const fit = fitCombinedModel({ chemistry: 'SIB', temperature_c: 25, points: SIB_ANCHORS.map(([soc, ocv_v]) => ({ soc, ocv_v })) });
		if (!fit.ok) throw new Error('the anchors should fit');
		for (const k of ['k0', 'k1', 'k2', 'k3', 'k4', 'epsilon'] as const) {
			expect((SIB.params as Record<string, number>)[k]).toBeCloseTo(fit.parameters[k], 6);
		}
		expect(fit.rmse_v).toBeLessThan(0.005);
	});

	it('rises over the window and stays inside its limits', () => {
		let last = -Infinity;
		for (let i = 0; i <= 100; i++) {
			const v = ocvAt(SIB, i / 100);
			expect(v).toBeGreaterThan(last);
			last = v;
		}
		expect(ocvAt(SIB, 0)).toBeGreaterThan(SIB.min_safe_v);
		expect(ocvAt(SIB, 1)).toBeLessThan(SIB.max_v);
	});

	it('a 1.4 V reading is a deep discharge', () => {
		// below the 1.5 V discharge cut-off (common practice, from memory; see the model)
		expect(evaluateReading(SIB, { ocv_v: 1.4, temperature_c: 25 }).flags).toContain('deep_discharge');
	});
});
