// Primary (non-rechargeable) cells: z is the fraction of capacity remaining.
import type { OcvModel } from '../types';
import { ANCHOR_NOTE, COMBINED_FORM_NOTE, ENTROPIC_ASSUMED_ZERO } from './sources';

const PRIMARY = {
	version: 'lib-1',
	form: 'combined',
	rechargeable: false,
	lithium_ion: false,
	soc_meaning: 'capacity_remaining',
	temperature_range_c: [10, 35],
	entropic_mv_per_k: [
		[0, 0],
		[1, 0]
	],
	source: `${COMBINED_FORM_NOTE} ${ANCHOR_NOTE} Limits: common practice. ${ENTROPIC_ASSUMED_ZERO}`
} as const;

function primary(m: Omit<OcvModel, keyof typeof PRIMARY>): OcvModel {
	return {
		...PRIMARY,
		...m,
		temperature_range_c: [10, 35],
		entropic_mv_per_k: [
			[0, 0],
			[1, 0]
		]
	};
}

export const ALKALINE = primary({
	chemistry: 'ALKALINE',
	name: 'Alkaline zinc–manganese dioxide',
	params: { k0: 1.2999828, k1: 0.0022974614, k2: -0.26680451, k3: 0.07286265, k4: -0.017594252, epsilon: 0.05 },
	nominal_v: 1.5,
	ocv_empty_v: 1.05,
	ocv_full_v: 1.6,
	// Rest voltage: an alkaline cell resting below 1.0 V is exhausted (0.8 V is the end voltage under load); from memory, common practice.
	min_safe_v: 1.0,
	max_v: 1.65,
	sigma_model_v: 0.02,
	ocv_information: 'good'
});

export const LIMNO2 = primary({
	chemistry: 'LIMNO2',
	name: 'Lithium–manganese dioxide (coin cell)',
	params: { k0: 3.1125671, k1: 0.0062501064, k2: 0.14368063, k3: 0.029325751, k4: -0.095300333, epsilon: 0.03 },
	nominal_v: 3.0,
	ocv_empty_v: 2.8,
	ocv_full_v: 3.3,
	// Rest voltage: a Li–MnO2 cell resting below 2.5 V is exhausted (2.0 V is the end voltage under load); from memory, common practice.
	min_safe_v: 2.5,
	max_v: 3.4,
	sigma_model_v: 0.015,
	ocv_information: 'poor'
});

export const LISOCL2 = primary({
	chemistry: 'LISOCL2',
	name: 'Lithium–thionyl chloride',
	// the OCV stays within a few tens of mV for most of the life: a reading says little about capacity
	params: { k0: 3.6757769, k1: 0.0025286954, k2: 0.01566624, k3: 0.0082211042, k4: -0.0040685131, epsilon: 0.05 },
	nominal_v: 3.6,
	ocv_empty_v: 3.6,
	ocv_full_v: 3.67,
	// Rest voltage: a Li–SOCl2 cell resting below 3.3 V is at end of life (its OCV stays near 3.65 V until then); from memory, common practice.
	min_safe_v: 3.3,
	max_v: 3.7,
	sigma_model_v: 0.015,
	ocv_information: 'none'
});
