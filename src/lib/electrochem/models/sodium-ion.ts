// Sodium-ion: layered-oxide cathode / hard-carbon anode, rechargeable, z = state of charge.
import type { OcvModel } from '../types';
import { COMBINED_FORM_NOTE, ENTROPIC_ASSUMED_ZERO } from './sources';

/**
 * Rested OCV anchor points at 25 °C (from memory: the general shape of published layered-oxide /
 * hard-carbon full-cell curves and cell datasheets, 1.5–4.0 V window, sloping with no long plateau).
 * Kept beside the model so the fit below can be recomputed (tests/unit/electrochem/sodium-ion.test.ts).
 */
export const SIB_ANCHORS: ReadonlyArray<readonly [soc: number, ocv_v: number]> = [
	[0, 2.1],
	[0.05, 2.55],
	[0.1, 2.75],
	[0.2, 2.92],
	[0.3, 3.03],
	[0.4, 3.13],
	[0.5, 3.23],
	[0.6, 3.35],
	[0.7, 3.47],
	[0.8, 3.6],
	[0.9, 3.75],
	[0.95, 3.84],
	[1, 3.95]
];

export const SIB: OcvModel = {
	chemistry: 'SIB',
	name: 'Sodium-ion (layered oxide / hard carbon)',
	version: 'lib-1',
	form: 'combined',
	// least-squares fit of the combined form to SIB_ANCHORS (fitCombinedModel, ε = 0.08; rmse 3.4 mV)
	params: { k0: 1.8478285, k1: 0.16809019, k2: -2.092919, k3: -0.86168471, k4: -0.11251084, epsilon: 0.08 },
	nominal_v: 3.1,
	// the fitted curve's ends at 25 °C
	ocv_empty_v: 2.0999,
	ocv_full_v: 3.9466,
	// 1.5 V: the usual discharge cut-off of these cells (common practice, from memory); makers state that
	// many sodium-ion cells tolerate deeper discharge, but below the cut-off the cell is outside its datasheet
	min_safe_v: 1.5,
	// 4.0 V charge limit + 50 mV tolerance (common practice, from memory)
	max_v: 4.05,
	// no published cells typed for calibration yet and the curve is from memory: 80 mV keeps the interval
	// honest (about ±15 SOC points on the sloping curve, so most readings stay indeterminate)
	sigma_model_v: 0.08,
	determinate_width: 0.3,
	temperature_range_c: [10, 35],
	rechargeable: true,
	lithium_ion: false,
	soc_meaning: 'state_of_charge',
	entropic_mv_per_k: [
		[0, 0],
		[1, 0]
	],
	source: `${COMBINED_FORM_NOTE} Coefficients: least-squares fit to anchor points shaped like published layered-oxide/hard-carbon full-cell curves (from memory); refit to the supplier reference curve. Limits: common practice (from memory). ${ENTROPIC_ASSUMED_ZERO}`,
	ocv_information: 'good'
};
