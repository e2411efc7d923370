// What the lot page and the report say about a model's own error: a σ in V where the engine uses one,
// the largest SOC σ where the chemistry is calibrated in SOC (never a voltage the engine ignores).
import { describe, expect, it } from 'vitest';
import { getLibraryModel, modelErrorSummary } from '../../../src/lib/electrochem';

describe('modelErrorSummary', () => {
	it('a SOC-calibrated chemistry reports its largest SOC sigma and no sigma in V', () => {
		const nmc = getLibraryModel('NMC');
		const largest = Math.max(...nmc.sigma_model_soc_curve!.map(([, s]) => s));
		expect(modelErrorSummary(nmc)).toEqual({ sigma_model_soc_max: largest });
	});

	it('an uncalibrated chemistry or a fitted model reports its sigma in V', () => {
		// LTO carries a single 8 mV model error in the library
		expect(modelErrorSummary(getLibraryModel('LTO'))).toEqual({ sigma_model_v: 0.008 });
		expect(modelErrorSummary({ sigma_model_v: 0.0021 })).toEqual({ sigma_model_v: 0.0021 });
	});
});
