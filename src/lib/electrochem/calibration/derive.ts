// The derivation of a chemistry's model error from published cells: at each SOC node the RMS
// difference between the published full-cell OCV and the library curve over node ± 0.05, the
// largest over the cells of that chemistry, floored at 5 mV and rounded up to whole millivolts.
// Recomputed by tests/unit/electrochem/calibration.test.ts against the numbers stored in the models.
import { ocvAt } from '../ocv';
import type { OcvModel } from '../types';
import { type PublishedCell, publishedOcv } from './published-cells';

/** Chemistries whose library model carries a derived sigma_model_curve_v. */
export const CALIBRATED_CHEMISTRIES = ['NMC', 'LFP'] as const;

export const SIGMA_NODES = [0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1];
const HALF_BAND = 0.05;
const SAMPLES = 11;
/** Below this the spread is dominated by how the curves were read, not by the cells (common practice, not derived). */
export const SIGMA_FLOOR_V = 0.005;

function rmsAround(cell: PublishedCell, model: OcvModel, node: number): number {
	let sum = 0;
	let n = 0;
	for (let i = 0; i < SAMPLES; i++) {
		const z = Math.min(1, Math.max(0, node - HALF_BAND + (2 * HALF_BAND * i) / (SAMPLES - 1)));
		sum += (publishedOcv(cell, z) - ocvAt(model, z)) ** 2;
		n++;
	}
	return Math.sqrt(sum / n);
}

export function deriveSigmaCurve(model: OcvModel, cells: readonly PublishedCell[]): Array<[number, number]> {
	return SIGMA_NODES.map((node) => {
		const worst = Math.max(SIGMA_FLOOR_V, ...cells.map((c) => rmsAround(c, model, node)));
		return [node, Math.ceil(worst * 1000) / 1000];
	});
}
