// Published full-cell OCV curves used to calibrate the library models' error (sigma_model).
// Each cell is a positive- and a negative-electrode open-circuit potential from the open literature
// and the stoichiometry window that maps the cell's state of charge z onto them:
//   OCV(z) = U_pos(y0 + z·(y100 − y0)) − U_neg(x0 + z·(x100 − x0)).
// These are outside references for tests and the derivation only; no demo data comes from here.

export interface ElectrodeWindow {
	/** negative-electrode stoichiometry at 0 % and 100 % SOC */
	x0: number;
	x100: number;
	/** positive-electrode stoichiometry at 0 % and 100 % SOC */
	y0: number;
	y100: number;
}

export interface PublishedCell {
	id: string;
	chemistry: 'NMC' | 'LFP';
	source: string;
	window: ElectrodeWindow;
	uPos: (y: number) => number;
	uNeg: (x: number) => number;
}

/** Graphite(-SiOx) OCP fit, Chen et al., J. Electrochem. Soc. 167 (2020) 080534, eq. for U_n (as also typed in PyBaMM's Chen2020 set). */
export function graphiteChen2020(x: number): number {
	return (
		1.9793 * Math.exp(-39.3631 * x) +
		0.2482 -
		0.0909 * Math.tanh(29.8538 * (x - 0.1234)) -
		0.04478 * Math.tanh(14.9159 * (x - 0.2769)) -
		0.0205 * Math.tanh(30.4444 * (x - 0.6103))
	);
}

/** NMC811 OCP fit, Chen et al., J. Electrochem. Soc. 167 (2020) 080534, eq. for U_p. */
export function nmc811Chen2020(y: number): number {
	return (
		-0.809 * y +
		4.4875 -
		0.0428 * Math.tanh(18.5138 * (y - 0.5542)) -
		17.7326 * Math.tanh(15.789 * (y - 0.3117)) +
		17.5842 * Math.tanh(15.9308 * (y - 0.312))
	);
}

/** LiFePO4 OCP, Afshar, Morris & Khajepour, arXiv:1709.03970 (2017), as used with Prada et al., J. Electrochem. Soc. 160 (2013) A616. */
export function lfpAfshar2017(y: number): number {
	return 3.4077 - 0.020269 * y + 0.5 * Math.exp(-150 * y) - 0.9 * Math.exp(-30 * (1 - y));
}

/**
 * The stoichiometry window of a cell from its fully charged stoichiometries, the capacity ratio
 * Q_neg/Q_pos and the 0 % SOC cut-off voltage: lithium leaving the negative electrode enters the
 * positive one, so Δy = Δx·Q_neg/Q_pos; Δx is found by bisection where the OCV meets the cut-off.
 */
export function windowFromCutoff(
	x100: number,
	y100: number,
	capacityRatio: number,
	cutoffV: number,
	uPos: (y: number) => number,
	uNeg: (x: number) => number
): ElectrodeWindow {
	let lo = 0;
	let hi = Math.min(x100, (1 - y100) / capacityRatio);
	for (let i = 0; i < 200; i++) {
		const mid = (lo + hi) / 2;
		const v = uPos(y100 + mid * capacityRatio) - uNeg(x100 - mid);
		if (v > cutoffV) lo = mid;
		else hi = mid;
	}
	const dx = (lo + hi) / 2;
	return { x0: x100 - dx, x100, y0: y100 + dx * capacityRatio, y100 };
}

/** Prada 2013 LFP/graphite cell: volume fraction × thickness × c_max per electrode (PyBaMM Prada2013 set). */
const PRADA_CAPACITY_RATIO = (0.58 * 34e-6 * 30555) / (0.374 * 80e-6 * 22806);

export const PUBLISHED_CELLS: readonly PublishedCell[] = [
	{
		id: 'chen2020-nmc811',
		chemistry: 'NMC',
		source:
			'Chen et al., J. Electrochem. Soc. 167 (2020) 080534: NMC811 / graphite-SiOx 21700 cell; electrode OCP fits as published; ' +
			'stoichiometry window x 0.0279–0.9014, y 0.9084–0.2661 from the paper’s parameter table (typed from memory).',
		window: { x0: 0.0279, x100: 0.9014, y0: 0.9084, y100: 0.2661 },
		uPos: nmc811Chen2020,
		uNeg: graphiteChen2020
	},
	{
		id: 'prada2013-lfp',
		chemistry: 'LFP',
		source:
			'Prada et al., J. Electrochem. Soc. 160 (2013) A616, as parameterised in PyBaMM’s Prada2013 set: LFP OCP of Afshar 2017, graphite OCP of Chen 2020; ' +
			'100 % SOC at x = 0.81, y = 0.0038, 0 % SOC where the OCV reaches the 2.0 V cut-off.',
		window: windowFromCutoff(0.81, 0.0038, PRADA_CAPACITY_RATIO, 2.0, lfpAfshar2017, graphiteChen2020),
		uPos: lfpAfshar2017,
		uNeg: graphiteChen2020
	}
];

export function publishedOcv(cell: PublishedCell, z: number): number {
	const w = cell.window;
	return cell.uPos(w.y0 + z * (w.y100 - w.y0)) - cell.uNeg(w.x0 + z * (w.x100 - w.x0));
}
