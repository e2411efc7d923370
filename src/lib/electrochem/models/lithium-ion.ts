// Lithium-ion chemistries, rechargeable, z = state of charge. Parameters are JSON data.
// Limits: charge limit 4.20 V (+50 mV tolerance), 2.5 V deep-discharge floor for the 4.2 V
// families, LFP 3.65/2.0 V, LTO 2.85/1.5 V: common practice.
import type { OcvModel } from '../types';
import { ANCHOR_NOTE, COMBINED_FORM_NOTE, ENTROPIC_NOTE } from './sources';

const LI_ION = {
	version: 'lib-1',
	form: 'combined',
	temperature_range_c: [10, 35],
	rechargeable: true,
	lithium_ion: true,
	soc_meaning: 'state_of_charge',
	// 30 SOC points: still tells "near empty" from "mid" from "near full", which is what the air-transport
	// limit (30 %) and the declared-SOC tolerance need; wider and a reading cannot place the cell (product rule).
	determinate_width: 0.3,
	source: `${COMBINED_FORM_NOTE} ${ANCHOR_NOTE} Voltage limits: common practice. ${ENTROPIC_NOTE}`
} as const;

function liIon(m: Omit<OcvModel, keyof typeof LI_ION>): OcvModel {
	return { ...LI_ION, ...m, temperature_range_c: [10, 35] };
}

export const LCO = liIon({
	chemistry: 'LCO',
	name: 'Lithium cobalt oxide / graphite',
	params: { k0: 3.3606591, k1: 0.03653721, k2: -0.65958155, k3: -0.23827262, k4: -0.062805848, epsilon: 0.03 },
	nominal_v: 3.7,
	ocv_empty_v: 3.0,
	ocv_full_v: 4.19,
	min_safe_v: 2.5,
	max_v: 4.25,
	sigma_model_v: 0.005,
	// 1σ spread of real cells' own SOC around this curve's reading, SOC fraction; derived from published cells
	// (calibration/; npx tsx scripts/derive-ocv-sigma.ts): replaces sigma_model_v
	sigma_model_soc_curve: [
		[0, 0.013],
		[0.1, 0.035],
		[0.2, 0.131],
		[0.3, 0.163],
		[0.4, 0.189],
		[0.5, 0.182],
		[0.6, 0.173],
		[0.7, 0.153],
		[0.8, 0.103],
		[0.9, 0.056],
		[1, 0.018]
	],
	entropic_mv_per_k: [
		[0, -0.2],
		[0.3, -0.1],
		[0.5, 0.05],
		[0.8, 0.1],
		[1, 0.05]
	],
	ocv_information: 'good'
});

export const NMC = liIon({
	chemistry: 'NMC',
	name: 'Lithium nickel manganese cobalt oxide / graphite',
	params: { k0: 3.0718864, k1: 0.032027256, k2: -0.86556798, k3: -0.27582175, k4: -0.083683425, epsilon: 0.03 },
	nominal_v: 3.65,
	ocv_empty_v: 3.0,
	ocv_full_v: 4.18,
	min_safe_v: 2.5,
	max_v: 4.25,
	sigma_model_v: 0.005,
	// 1σ spread of real cells' own SOC around this curve's reading, SOC fraction; derived from published cells
	// (calibration/; npx tsx scripts/derive-ocv-sigma.ts): replaces sigma_model_v
	sigma_model_soc_curve: [
		[0, 0.054],
		[0.1, 0.109],
		[0.2, 0.081],
		[0.3, 0.073],
		[0.4, 0.073],
		[0.5, 0.044],
		[0.6, 0.053],
		[0.7, 0.081],
		[0.8, 0.098],
		[0.9, 0.095],
		[1, 0.037]
	],
	entropic_mv_per_k: [
		[0, -0.4],
		[0.2, -0.2],
		[0.4, -0.1],
		[0.6, -0.05],
		[0.8, 0],
		[1, 0.05]
	],
	ocv_information: 'good'
});

export const NCA = liIon({
	chemistry: 'NCA',
	name: 'Lithium nickel cobalt aluminium oxide / graphite',
	params: { k0: 2.4080824, k1: 0.15273315, k2: -1.6219837, k3: -0.93410302, k4: -0.14557867, epsilon: 0.08 },
	nominal_v: 3.6,
	ocv_empty_v: 3.0,
	ocv_full_v: 4.18,
	min_safe_v: 2.5,
	max_v: 4.25,
	sigma_model_v: 0.005,
	// 1σ spread of real cells' own SOC around this curve's reading, SOC fraction; derived from published cells
	// (calibration/; npx tsx scripts/derive-ocv-sigma.ts): replaces sigma_model_v
	sigma_model_soc_curve: [
		[0, 0.039],
		[0.1, 0.12],
		[0.2, 0.102],
		[0.3, 0.076],
		[0.4, 0.106],
		[0.5, 0.154],
		[0.6, 0.194],
		[0.7, 0.194],
		[0.8, 0.134],
		[0.9, 0.087],
		[1, 0.029]
	],
	entropic_mv_per_k: [
		[0, -0.3],
		[0.3, -0.15],
		[0.6, -0.05],
		[1, 0]
	],
	ocv_information: 'good'
});

export const LMO = liIon({
	chemistry: 'LMO',
	name: 'Lithium manganese oxide spinel / graphite',
	params: { k0: 3.5231771, k1: 0.03764689, k2: -0.57637975, k3: -0.20338483, k4: -0.04007413, epsilon: 0.03 },
	nominal_v: 3.7,
	ocv_empty_v: 3.0,
	ocv_full_v: 4.19,
	min_safe_v: 2.5,
	max_v: 4.25,
	sigma_model_v: 0.006,
	entropic_mv_per_k: [
		[0, -0.3],
		[0.5, -0.1],
		[1, 0]
	],
	ocv_information: 'good'
});

export const LFP = liIon({
	chemistry: 'LFP',
	name: 'Lithium iron phosphate / graphite',
	// flat two-phase plateau: ε is small so the steep ends fit without bending the plateau
	params: { k0: 3.4745839, k1: 0.00010018635, k2: 0.28042913, k3: 0.10184297, k4: -0.053396329, epsilon: 0.0005 },
	nominal_v: 3.2,
	ocv_empty_v: 2.5,
	ocv_full_v: 3.6,
	min_safe_v: 2.0,
	max_v: 3.65,
	// hysteresis between charge and discharge branches is tens of mV on the plateau
	sigma_model_v: 0.012,
	// charge branch = curve + h, discharge branch = curve − h: a gap of about 20–30 mV on the two-phase
	// plateau, less at the ends (e.g. Dreyer et al., Nature Materials 9 (2010) 448; from memory)
	hysteresis_half_v: [
		[0, 0.005],
		[0.2, 0.012],
		[0.5, 0.015],
		[0.9, 0.012],
		[1, 0.005]
	],
	// the flat two-phase region of the published LFP cell (Prada 2013, calibration/): about 20–90 % SOC
	plateau: [0.2, 0.9],
	// 1σ spread of real cells' own SOC around this curve's reading, SOC fraction; derived from published cells
	// (calibration/; npx tsx scripts/derive-ocv-sigma.ts): replaces sigma_model_v
	sigma_model_soc_curve: [
		[0, 0.078],
		[0.1, 0.18],
		[0.2, 0.279],
		[0.3, 0.32],
		[0.4, 0.261],
		[0.5, 0.229],
		[0.6, 0.152],
		[0.7, 0.07],
		[0.8, 0.07],
		[0.9, 0.076],
		[1, 0.013]
	],
	entropic_mv_per_k: [
		[0, -0.1],
		[0.2, -0.05],
		[0.5, -0.03],
		[0.8, -0.05],
		[1, -0.1]
	],
	ocv_information: 'poor'
});

export const LTO = liIon({
	chemistry: 'LTO',
	name: 'Lithium titanate anode / layered oxide cathode',
	params: { k0: 2.3742823, k1: 0.009231458, k2: 0.15305786, k3: 0.075925906, k4: -0.13860112, epsilon: 0.03 },
	nominal_v: 2.3,
	ocv_empty_v: 1.8,
	ocv_full_v: 2.7,
	min_safe_v: 1.5,
	max_v: 2.85,
	sigma_model_v: 0.008,
	entropic_mv_per_k: [
		[0, -0.1],
		[1, -0.05]
	],
	ocv_information: 'good'
});
