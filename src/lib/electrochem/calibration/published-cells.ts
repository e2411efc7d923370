// Published full-cell OCV curves used to calibrate the library models' error (sigma_model).
// Each cell is a positive- and a negative-electrode open-circuit potential from the open literature,
// typed from the parameter sets that PyBaMM (github.com/pybamm-team/PyBaMM,
// src/pybamm/input/parameters/lithium_ion/<Set>.py) carries, and the stoichiometry window that maps
// the cell's state of charge z onto them:
//   OCV(z) = U_pos(y0 + z·(y100 − y0)) − U_neg(x0 + z·(x100 − x0)).
// The window follows from one published electrode state (the set's initial concentrations ÷ the
// maximum concentrations), the capacity ratio Q_neg/Q_pos (active volume fraction × thickness × c_max
// per electrode) and two cut-off voltages: lithium leaving one electrode enters the other, so
// Δy = −Δx·Q_neg/Q_pos, and each end is where the OCV meets its cut-off.
// These are outside references for tests and the derivation only; no demo data comes from here.

export interface ElectrodeWindow {
	/** negative-electrode stoichiometry at 0 % and 100 % SOC */
	x0: number;
	x100: number;
	/** positive-electrode stoichiometry at 0 % and 100 % SOC */
	y0: number;
	y100: number;
}

export type CalibratedChemistry = 'NMC' | 'LCO' | 'NCA' | 'LFP';

export interface PublishedCell {
	id: string;
	chemistry: CalibratedChemistry;
	source: string;
	/** One published electrode state (any SOC): stoichiometry of the negative (x) and positive (y) electrode. */
	anchor: { x: number; y: number };
	/** Q_neg / Q_pos */
	capacityRatio: number;
	/** The cell's own 0 % and 100 % SOC cut-off voltages, V. */
	cutoffs: [low: number, high: number];
	uPos: (y: number) => number;
	uNeg: (x: number) => number;
}

const tanh = Math.tanh;
const exp = Math.exp;

/** Graphite(-SiOx) OCP, Chen et al., J. Electrochem. Soc. 167 (2020) 080534 (PyBaMM Chen2020.py, graphite_LGM50_ocp_Chen2020). */
export function graphiteChen2020(x: number): number {
	return (
		1.9793 * exp(-39.3631 * x) +
		0.2482 -
		0.0909 * tanh(29.8538 * (x - 0.1234)) -
		0.04478 * tanh(14.9159 * (x - 0.2769)) -
		0.0205 * tanh(30.4444 * (x - 0.6103))
	);
}

/** NMC811 OCP, Chen et al. 2020 (PyBaMM Chen2020.py, nmc_LGM50_ocp_Chen2020). */
export function nmc811Chen2020(y: number): number {
	return (
		-0.809 * y +
		4.4875 -
		0.0428 * tanh(18.5138 * (y - 0.5542)) -
		17.7326 * tanh(15.789 * (y - 0.3117)) +
		17.5842 * tanh(15.9308 * (y - 0.312))
	);
}

/** Graphite OCP, Mohtat et al. 2020 (PyBaMM Mohtat2020.py, graphite_ocp_PeymanMPM). */
export function graphiteMohtat2020(x: number): number {
	return (
		0.063 +
		0.8 * exp(-75 * (x + 0.001)) -
		0.012 * tanh((x - 0.127) / 0.016) -
		0.0118 * tanh((x - 0.155) / 0.016) -
		0.0035 * tanh((x - 0.22) / 0.02) -
		0.0095 * tanh((x - 0.19) / 0.013) -
		0.0145 * tanh((x - 0.49) / 0.02) -
		0.08 * tanh((x - 1.03) / 0.055)
	);
}

/** NMC532 OCP, Mohtat et al. 2020 (PyBaMM Mohtat2020.py, NMC_ocp_PeymanMPM). */
export function nmc532Mohtat2020(y: number): number {
	return (
		4.3452 - 1.6518 * y + 1.6225 * y ** 2 - 2.0843 * y ** 3 + 3.5146 * y ** 4 - 2.2166 * y ** 5 - 0.5623e-4 * exp(109.451 * y - 100.006)
	);
}

/** MCMB 2528 graphite OCP of Dualfoil (PyBaMM Marquis2019.py, graphite_mcmb2528_ocp_Dualfoil1998). */
export function graphiteDualfoil(x: number): number {
	return (
		0.194 +
		1.5 * exp(-120 * x) +
		0.0351 * tanh((x - 0.286) / 0.083) -
		0.0045 * tanh((x - 0.849) / 0.119) -
		0.035 * tanh((x - 0.9233) / 0.05) -
		0.0147 * tanh((x - 0.5) / 0.034) -
		0.102 * tanh((x - 0.194) / 0.142) -
		0.022 * tanh((x - 0.9) / 0.0164) -
		0.011 * tanh((x - 0.124) / 0.0226) +
		0.0155 * tanh((x - 0.105) / 0.029)
	);
}

/** LiCoO2 OCP of Dualfoil, stretch 1.062 (PyBaMM Marquis2019.py, lico2_ocp_Dualfoil1998). */
export function lcoDualfoil(y: number): number {
	const s = 1.062 * y;
	return (
		2.16216 +
		0.07645 * tanh(30.834 - 54.4806 * s) +
		2.1581 * tanh(52.294 - 50.294 * s) -
		0.14169 * tanh(11.0923 - 19.8543 * s) +
		0.2051 * tanh(1.4684 - 5.4888 * s) +
		0.2531 * tanh((-s + 0.56478) / 0.1316) -
		0.02167 * tanh((s - 0.525) / 0.006)
	);
}

/** Carbon OCP, Ramadass et al., J. Electrochem. Soc. 151 (2004) A196 (PyBaMM Ramadass2004.py, graphite_ocp_Ramadass2004). */
export function graphiteRamadass2004(x: number): number {
	return (
		0.7222 + 0.1387 * x + 0.029 * x ** 0.5 - 0.0172 / x + 0.0019 / x ** 1.5 + 0.2808 * exp(0.9 - 15 * x) - 0.7984 * exp(0.4465 * x - 0.4108)
	);
}

/** LiCoO2 OCP, Ramadass et al. 2004, stretch 1.13 (PyBaMM Ramadass2004.py, lico2_ocp_Ramadass2004). */
export function lcoRamadass2004(y: number): number {
	const s = 1.13 * y;
	const num = -4.656 + 88.669 * s ** 2 - 401.119 * s ** 4 + 342.909 * s ** 6 - 462.471 * s ** 8 + 433.434 * s ** 10;
	const den = -1 + 18.933 * s ** 2 - 79.532 * s ** 4 + 37.311 * s ** 6 - 73.083 * s ** 8 + 95.96 * s ** 10;
	return num / den;
}

/** Graphite OCP, Kim et al., J. Electrochem. Soc. 158 (2011) A955 (PyBaMM NCA_Kim2011.py, graphite_ocp_Kim2011). */
export function graphiteKim2011(x: number): number {
	return (
		0.124 +
		1.5 * exp(-70 * x) -
		0.0351 * tanh((x - 0.286) / 0.083) -
		0.0045 * tanh((x - 0.9) / 0.119) -
		0.035 * tanh((x - 0.99) / 0.05) -
		0.0147 * tanh((x - 0.5) / 0.034) -
		0.102 * tanh((x - 0.194) / 0.142) -
		0.022 * tanh((x - 0.98) / 0.0164) -
		0.011 * tanh((x - 0.124) / 0.0226) +
		0.0155 * tanh((x - 0.105) / 0.029)
	);
}

/** NCA OCP, Kim et al. 2011 (PyBaMM NCA_Kim2011.py, nca_ocp_Kim2011). */
export function ncaKim2011(y: number): number {
	return (
		1.638 * y ** 10 -
		2.222 * y ** 9 +
		15.056 * y ** 8 -
		23.488 * y ** 7 +
		81.246 * y ** 6 -
		344.566 * y ** 5 +
		621.3475 * y ** 4 -
		554.774 * y ** 3 +
		264.427 * y ** 2 -
		66.3691 * y +
		11.8058 -
		0.61386 * exp(5.8201 * y ** 136.4)
	);
}

/** LiNiCoO2 OCP, Ecker et al., J. Electrochem. Soc. 162 (2015) A1836 (PyBaMM Ecker2015.py, nco_ocp_Ecker2015). */
export function ncoEcker2015(y: number): number {
	return (
		-2.35211 * y -
		0.0747061 * tanh(31.886 * (y - 0.0219921)) +
		6.34984 * tanh(2.66395 * (y - 0.174352)) -
		0.640243 * tanh(5.48623 * (y - 0.439245)) -
		3.82383 * tanh(4.12167 * (y - 0.176187)) -
		0.0542123 * tanh(18.2919 * (y - 0.762272)) +
		4.23285
	);
}

/** LiFePO4 OCP, Afshar, Morris & Khajepour, arXiv:1709.03970 (2017) (PyBaMM Prada2013.py, LFP_ocp_Afshar2017). */
export function lfpAfshar2017(y: number): number {
	return 3.4077 - 0.020269 * y + 0.5 * exp(-150 * y) - 0.9 * exp(-30 * (1 - y));
}

/**
 * LiFePO4 OCP, Safari & Delacourt, J. Electrochem. Soc. 158 (2011) A562 (doi 10.1149/1.3567007), as typed in
 * github.com/wenzlern/ma python/BESTparam/GenerateLFPOCP.py; y is the lithium fraction of the LFP.
 */
export function lfpSafari2011(y: number): number {
	const u = 1 - y;
	return 3.4323 - 0.8428 * exp(-80.2493 * u ** 1.3198) - 3.2474e-6 * exp(20.2645 * u ** 3.8003) + 3.2482e-6 * exp(20.2646 * u ** 3.7995);
}

/** Q_neg/Q_pos from active volume fraction ε, thickness L (m) and c_max (mol/m³) of each electrode. */
function capacityRatio(neg: [eps: number, l: number, cMax: number], pos: [eps: number, l: number, cMax: number]): number {
	return (neg[0] * neg[1] * neg[2]) / (pos[0] * pos[1] * pos[2]);
}

const PRADA_RATIO = capacityRatio([0.58, 34e-6, 30555], [0.374, 80e-6, 22806]);
const KIM_RATIO = capacityRatio([0.51, 70e-6, 28700], [0.41, 50e-6, 49000]);

export const PUBLISHED_CELLS: readonly PublishedCell[] = [
	{
		id: 'chen2020-nmc811',
		chemistry: 'NMC',
		source:
			'Chen et al., J. Electrochem. Soc. 167 (2020) 080534: NMC811 / graphite-SiOx 21700 cell, 2.5–4.2 V; electrode OCPs as in PyBaMM Chen2020.py; ' +
			'stoichiometries at 100 % SOC x 0.9014, y 0.2661 and capacity ratio from the paper’s window (x 0.0279–0.9014, y 0.9084–0.2661; typed from memory).',
		anchor: { x: 0.9014, y: 0.2661 },
		capacityRatio: (0.9084 - 0.2661) / (0.9014 - 0.0279),
		cutoffs: [2.5, 4.2],
		uPos: nmc811Chen2020,
		uNeg: graphiteChen2020
	},
	{
		id: 'mohtat2020-nmc532',
		chemistry: 'NMC',
		source:
			'Mohtat et al. 2020, NMC532 / graphite pouch cell, 2.8–4.2 V, as parameterised in PyBaMM Mohtat2020.py: OCPs graphite_ocp_PeymanMPM and NMC_ocp_PeymanMPM; ' +
			'initial state x = 48.8682/28746, y = 31513/35380; capacity ratio from ε, thickness and c_max of each electrode.',
		anchor: { x: 48.8682 / 28746, y: 31513 / 35380 },
		capacityRatio: capacityRatio([0.61, 62e-6, 28746], [0.445, 67e-6, 35380]),
		cutoffs: [2.8, 4.2],
		uPos: nmc532Mohtat2020,
		uNeg: graphiteMohtat2020
	},
	{
		id: 'marquis2019-lco',
		chemistry: 'LCO',
		source:
			'Marquis et al., J. Electrochem. Soc. 166 (2019) A3693: Kokam LCO / graphite cell, 3.105–4.1 V, as parameterised in PyBaMM Marquis2019.py (Dualfoil OCPs); ' +
			'initial state x = 19986.61/24983.26, y = 30730.76/51217.93; capacity ratio from ε, thickness and c_max.',
		anchor: { x: 19986.609595075 / 24983.2619938437, y: 30730.7554385565 / 51217.9257309275 },
		capacityRatio: capacityRatio([0.6, 100e-6, 24983.2619938437], [0.5, 100e-6, 51217.9257309275]),
		cutoffs: [3.105, 4.1],
		uPos: lcoDualfoil,
		uNeg: graphiteDualfoil
	},
	{
		id: 'ramadass2004-lco',
		chemistry: 'LCO',
		source:
			'Ramadass et al., J. Electrochem. Soc. 151 (2004) A196: LCO / carbon cell, 2.8–4.2 V, as parameterised in PyBaMM Ramadass2004.py; ' +
			'initial state x = 22610.7/30555, y = 25777.5/51555; capacity ratio from ε, thickness and c_max.',
		anchor: { x: 22610.7 / 30555, y: 25777.5 / 51555 },
		capacityRatio: capacityRatio([0.49, 88e-6, 30555], [0.59, 80e-6, 51555]),
		cutoffs: [2.8, 4.2],
		uPos: lcoRamadass2004,
		uNeg: graphiteRamadass2004
	},
	{
		id: 'kim2011-nca',
		chemistry: 'NCA',
		source:
			'Kim et al., J. Electrochem. Soc. 158 (2011) A955: NCA / graphite pouch cell, 2.7–4.2 V, as parameterised in PyBaMM NCA_Kim2011.py; ' +
			'initial state x = 18081/28700, y = 20090/49000; capacity ratio from ε, thickness and c_max.',
		anchor: { x: 18081 / 28700, y: 20090 / 49000 },
		capacityRatio: KIM_RATIO,
		cutoffs: [2.7, 4.2],
		uPos: ncaKim2011,
		uNeg: graphiteKim2011
	},
	{
		id: 'ecker2015-nco',
		chemistry: 'NCA',
		source:
			'Ecker et al., J. Electrochem. Soc. 162 (2015) A1836: Kokam LiNiCoO2 / graphite cell, 2.5–4.2 V, as parameterised in PyBaMM Ecker2015.py ' +
			'(nco_ocp_Ecker2015; initial state x = 26120.05/31920, y = 12630.8/48580; capacity ratio from ε, thickness and c_max). ' +
			'A pairing: Ecker’s graphite OCP is a data table, so the Kim 2011 graphite OCP stands in for it; nickel-cobalt oxide is the nearest published kin of NCA.',
		anchor: { x: 26120.05 / 31920, y: 12630.8 / 48580 },
		capacityRatio: capacityRatio([0.372403, 74e-6, 31920], [0.40832, 54e-6, 48580]),
		cutoffs: [2.5, 4.2],
		uPos: ncoEcker2015,
		uNeg: graphiteKim2011
	},
	{
		id: 'prada2013-lfp',
		chemistry: 'LFP',
		source:
			'Prada et al., J. Electrochem. Soc. 160 (2013) A616, as parameterised in PyBaMM Prada2013.py: LFP OCP of Afshar 2017, graphite OCP of Chen 2020; ' +
			'100 % SOC at x = 0.81, y = 0.0038; cut-offs 2.0 and 3.6 V.',
		anchor: { x: 0.81, y: 0.0038 },
		capacityRatio: PRADA_RATIO,
		cutoffs: [2.0, 3.6],
		uPos: lfpAfshar2017,
		uNeg: graphiteChen2020
	},
	{
		id: 'safari2011-lfp',
		chemistry: 'LFP',
		source:
			'Safari & Delacourt, J. Electrochem. Soc. 158 (2011) A562: LFP OCP (typed from github.com/wenzlern/ma, GenerateLFPOCP.py). ' +
			'A pairing: placed in the Prada 2013 cell (graphite OCP of Chen 2020, 100 % SOC at x = 0.81, y = 0.0038, same capacity ratio), cut-offs 2.0 and 3.6 V.',
		anchor: { x: 0.81, y: 0.0038 },
		capacityRatio: PRADA_RATIO,
		cutoffs: [2.0, 3.6],
		uPos: lfpSafari2011,
		uNeg: graphiteChen2020
	}
];

/** OCV of the cell after moving dx of the negative electrode's lithium out of it (dx < 0: into it). */
function ocvAfterShift(cell: PublishedCell, dx: number): number {
	return cell.uPos(cell.anchor.y + dx * cell.capacityRatio) - cell.uNeg(cell.anchor.x - dx);
}

/** dx where the OCV meets `volts`, by bisection between lo (OCV above) and hi (OCV below). */
function shiftAt(cell: PublishedCell, volts: number, lo: number, hi: number): number {
	for (let i = 0; i < 200; i++) {
		const mid = (lo + hi) / 2;
		if (ocvAfterShift(cell, mid) > volts) lo = mid;
		else hi = mid;
	}
	return (lo + hi) / 2;
}

/**
 * The stoichiometry window between two voltages: with the cell's own cut-offs this is its published
 * 0–100 % SOC; with the library curve's ocv_empty_v/ocv_full_v it renormalises the cell's SOC to the
 * library's voltage window (see calibration/derive.ts).
 */
export function windowBetween(cell: PublishedCell, lowV: number, highV: number): ElectrodeWindow {
	const { x, y } = cell.anchor;
	// dx may range while both stoichiometries stay inside (0, 1)
	const most = Math.min(x, (1 - y) / cell.capacityRatio) - 1e-9;
	const least = -Math.min(1 - x, y / cell.capacityRatio) + 1e-9;
	const empty = shiftAt(cell, lowV, least, most);
	const full = shiftAt(cell, highV, least, most);
	return { x0: x - empty, x100: x - full, y0: y + empty * cell.capacityRatio, y100: y + full * cell.capacityRatio };
}

export function publishedWindow(cell: PublishedCell): ElectrodeWindow {
	return windowBetween(cell, cell.cutoffs[0], cell.cutoffs[1]);
}

export function ocvInWindow(cell: PublishedCell, w: ElectrodeWindow, z: number): number {
	return cell.uPos(w.y0 + z * (w.y100 - w.y0)) - cell.uNeg(w.x0 + z * (w.x100 - w.x0));
}

/** The cell's OCV over its own (published) SOC, the window worked out once. */
export function publishedCurve(cell: PublishedCell): (z: number) => number {
	const w = publishedWindow(cell);
	return (z) => ocvInWindow(cell, w, z);
}

/** OCV at the cell's own (published) SOC z. */
export function publishedOcv(cell: PublishedCell, z: number): number {
	return publishedCurve(cell)(z);
}
