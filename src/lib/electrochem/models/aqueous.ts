// Aqueous rechargeable chemistries: NiMH, NiCd (Redlich–Kister form), lead-acid (through specific gravity).
import type { CombinedParams, OcvModel } from '../types';
import { ANCHOR_NOTE, COMBINED_FORM_NOTE, ENTROPIC_NOTE, RK_FORM_NOTE } from './sources';

/** Lead-acid rest voltage per cell ≈ electrolyte specific gravity + 0.84 V (common practice). */
export const LEAD_ACID_SG_OFFSET_V = 0.84;
export const LEAD_ACID_SG_EMPTY = 1.12;
export const LEAD_ACID_SG_FULL = 1.28;

export function leadAcidOcvFromSpecificGravity(sg: number): number {
	return sg + LEAD_ACID_SG_OFFSET_V;
}

/** Specific gravity is close to linear in state of charge, so OCV is linear: K0 and K2 only. */
function leadAcidParams(epsilon: number): CombinedParams {
	const empty = leadAcidOcvFromSpecificGravity(LEAD_ACID_SG_EMPTY);
	const full = leadAcidOcvFromSpecificGravity(LEAD_ACID_SG_FULL);
	const k2 = -(full - empty) / (1 - 2 * epsilon);
	return { k0: empty + k2 * epsilon, k1: 0, k2, k3: 0, k4: 0, epsilon };
}

const AQUEOUS = {
	version: 'lib-1',
	rechargeable: true,
	lithium_ion: false,
	soc_meaning: 'state_of_charge'
} as const;

export const NIMH: OcvModel = {
	...AQUEOUS,
	chemistry: 'NIMH',
	name: 'Nickel–metal hydride',
	form: 'redlich_kister',
	params: { e0_v: 1.3089068, a_j_per_mol: [-1613.829, -49.182007, -1662.6192, -938.39935], epsilon: 0.01 },
	nominal_v: 1.2,
	ocv_empty_v: 1.15,
	ocv_full_v: 1.45,
	// A rest voltage: a cell discharged to the usual 1.0 V end under load recovers to about 1.1–1.2 V at rest,
	// so resting below 1.10 V it was driven past that end (from memory; common practice).
	min_safe_v: 1.1,
	max_v: 1.5,
	// strong hysteresis and slow relaxation of the nickel electrode
	sigma_model_v: 0.015,
	temperature_range_c: [10, 35],
	entropic_mv_per_k: [
		[0, -0.5],
		[1, -0.4]
	],
	source: `${RK_FORM_NOTE} ${ANCHOR_NOTE} Nominal 1.2 V and limits: common practice. ${ENTROPIC_NOTE}`,
	ocv_information: 'poor'
};

export const NICD: OcvModel = {
	...AQUEOUS,
	chemistry: 'NICD',
	name: 'Nickel–cadmium',
	form: 'redlich_kister',
	params: { e0_v: 1.287982, a_j_per_mol: [-880.84883, 66.840851, -1936.3171, -1764.1502], epsilon: 0.02 },
	nominal_v: 1.2,
	ocv_empty_v: 1.15,
	ocv_full_v: 1.4,
	// A rest voltage: a cell discharged to the usual 1.0 V end under load recovers to about 1.1–1.2 V at rest,
	// so resting below 1.10 V it was driven past that end (from memory; common practice).
	min_safe_v: 1.1,
	max_v: 1.45,
	sigma_model_v: 0.015,
	temperature_range_c: [10, 35],
	entropic_mv_per_k: [
		[0, -0.5],
		[1, -0.5]
	],
	source: `${RK_FORM_NOTE} ${ANCHOR_NOTE} Nominal 1.2 V and limits: common practice. ${ENTROPIC_NOTE}`,
	ocv_information: 'poor'
};

export const PBACID: OcvModel = {
	...AQUEOUS,
	chemistry: 'PBACID',
	name: 'Lead–acid (per cell; 6 cells in a 12 V block)',
	form: 'combined',
	params: { ...leadAcidParams(0.01) },
	nominal_v: 2.0,
	ocv_empty_v: leadAcidOcvFromSpecificGravity(LEAD_ACID_SG_EMPTY),
	ocv_full_v: leadAcidOcvFromSpecificGravity(LEAD_ACID_SG_FULL),
	// A REST voltage: 1.95 V per cell (11.7 V for a 12 V block) is the open-circuit voltage at specific gravity
	// ≈ 1.11, below a fully discharged cell (SG ≈ 1.12, OCV ≈ SG + 0.84 V). The 1.75 V/cell often quoted is the
	// end-of-discharge voltage under load, not a rest value. Source: Linden's Handbook of Batteries, lead-acid
	// chapter (OCV–specific-gravity relation and discharged SG), from memory; the threshold itself is common practice.
	min_safe_v: 1.95,
	// surface charge right after charging can sit above the rested value
	max_v: 2.2,
	sigma_model_v: 0.01,
	temperature_range_c: [0, 40],
	entropic_mv_per_k: [
		[0, -0.1],
		[1, 0.2]
	],
	source:
		`${COMBINED_FORM_NOTE} Linear special case from OCV per cell ≈ SG + 0.84 V, SG ${LEAD_ACID_SG_EMPTY} empty to ${LEAD_ACID_SG_FULL} full ` +
		`(common practice). Limits: common practice. ${ENTROPIC_NOTE}`,
	ocv_information: 'good'
};
