// The derivation of a chemistry's model error from published cells, in SOC space: for a reading that
// the library curve places at z, how far from z is the true SOC of a real cell of that chemistry?
// At each node the library curve is sampled over node ± 0.05; each sample's OCV is looked up on every
// published cell of the chemistry, giving that cell's own SOC at the same OCV; the node's σ is the root
// mean square of (cell SOC − library z) pooled over cells and samples (an estimate of the spread, not
// its worst case), floored and rounded up to 0.001.
// SOC mapping: a cell's SOC is its own, between its published cut-offs (e.g. 2.5–4.2 V), because that
// is the SOC a supplier declares; the library curve's window (e.g. 3.0–4.18 V) is not stretched to fit.
// The difference of windows is therefore part of the error: little charge sits between 2.5 and 3.0 V
// on these cells (about 3 % on Chen 2020), and that is what the σ near 0 % shows.
// Recomputed by tests/unit/electrochem/calibration.test.ts against the numbers stored in the models.
import { formFunctions } from '../forms';
import type { OcvModel } from '../types';
import { type CalibratedChemistry, type PublishedCell, publishedCurve } from './published-cells';

/** Chemistries whose library model carries a derived sigma_model_soc_curve. */
export const CALIBRATED_CHEMISTRIES: readonly CalibratedChemistry[] = ['NMC', 'LCO', 'NCA', 'LFP'];

export const SIGMA_NODES = [0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1];
const HALF_BAND = 0.05;
const SAMPLES = 11;
/** One SOC point: published curves are read from plots and fits no better than that (from memory, not derived). */
export const SIGMA_SOC_FLOOR = 0.01;

/** The SOC where a rising curve over [0, 1] equals volts (bisection; clamps to 0 or 1 outside it). */
export function socAt(curve: (z: number) => number, volts: number): number {
	if (volts <= curve(0)) return 0;
	if (volts >= curve(1)) return 1;
	let lo = 0;
	let hi = 1;
	for (let i = 0; i < 60; i++) {
		const mid = (lo + hi) / 2;
		if (curve(mid) < volts) lo = mid;
		else hi = mid;
	}
	return (lo + hi) / 2;
}

/** (cell SOC − library z) at the OCV the library curve gives for each sample around node. */
function socDifferences(model: OcvModel, cells: ReadonlyArray<(z: number) => number>, node: number): number[] {
	const value = formFunctions(model).value;
	const out: number[] = [];
	for (let i = 0; i < SAMPLES; i++) {
		const z = Math.min(1, Math.max(0, node - HALF_BAND + (2 * HALF_BAND * i) / (SAMPLES - 1)));
		for (const cell of cells) out.push(socAt(cell, value(z)) - z);
	}
	return out;
}

export function deriveSocSigmaCurve(model: OcvModel, cells: readonly PublishedCell[]): Array<[number, number]> {
	const curves = cells.map(publishedCurve);
	return SIGMA_NODES.map((node) => {
		const d = socDifferences(model, curves, node);
		const rms = Math.sqrt(d.reduce((s, x) => s + x * x, 0) / d.length);
		return [node, Math.ceil(Math.max(SIGMA_SOC_FLOOR, rms) * 1000) / 1000];
	});
}
