// The invented Voltaria VC-21700-50G datasheet table and the tabulated model the seed fits to it.
// No database here: tests import it to generate readings from the model the part uses.
import { fitPartModel } from '../src/lib/electrochem';

/** Invented: the rested OCV table a supplier might print, 25 °C, mV resolution. */
export const VC21_DATASHEET_POINTS: Array<[soc: number, ocv_v: number]> = [
	[0, 2.997],
	[0.05, 3.435],
	[0.1, 3.508],
	[0.15, 3.537],
	[0.2, 3.556],
	[0.25, 3.575],
	[0.3, 3.595],
	[0.35, 3.616],
	[0.4, 3.639],
	[0.45, 3.664],
	[0.5, 3.69],
	[0.55, 3.719],
	[0.6, 3.749],
	[0.65, 3.781],
	[0.7, 3.816],
	[0.75, 3.854],
	[0.8, 3.896],
	[0.85, 3.942],
	[0.9, 3.996],
	[0.95, 4.064],
	[1, 4.172]
];

export const VC21_VERSION = 'fit-vc21-1';
/** The tabulated model fitted to the datasheet table, as stored (tests generate readings from it). */
export function vc21Fit() {
	const points = VC21_DATASHEET_POINTS.map(([soc, ocv_v]) => ({ soc, ocv_v }));
	const fit = fitPartModel({ chemistry: 'NMC', temperature_c: 25, points, form: 'tabulated' });
	if (!fit.ok) throw new Error(`seed: the VC-21700-50G model does not fit: ${fit.message}`);
	const model = { ...fit.model, version: VC21_VERSION, name: 'NMC — VC-21700-50G datasheet' };
	return { points, fit, model };
}
