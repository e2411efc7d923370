// Shared types of the electrochemistry core.

export type ChemistryCode =
	'LCO' | 'NMC' | 'NCA' | 'LMO' | 'LFP' | 'LTO' | 'SIB' | 'NIMH' | 'NICD' | 'PBACID' | 'ALKALINE' | 'LIMNO2' | 'LISOCL2';

export const CHEMISTRY_CODES: readonly ChemistryCode[] = Object.freeze([
	'LCO',
	'NMC',
	'NCA',
	'LMO',
	'LFP',
	'LTO',
	'SIB',
	'NIMH',
	'NICD',
	'PBACID',
	'ALKALINE',
	'LIMNO2',
	'LISOCL2'
] as const);

export type OcvForm = 'combined' | 'redlich_kister' | 'tabulated';
export type OcvInformation = 'good' | 'poor' | 'none';

/** Plett's combined model: K0 − K1/s − K2·s + K3·ln s + K4·ln(1−s), s = ε + (1−2ε)·z. */
export interface CombinedParams {
	k0: number;
	k1: number;
	k2: number;
	k3: number;
	k4: number;
	epsilon: number;
}

/**
 * Redlich–Kister form for an intercalation-type electrode with site fraction x = 1 − s:
 * E = E0 + (RT/F)·ln((1−x)/x) + (1/F)·Σ A_k·[(2x−1)^(k+1) − 2kx(1−x)(2x−1)^(k−1)], RT/F at 25 °C.
 */
export interface RedlichKisterParams {
	e0_v: number;
	a_j_per_mol: number[];
	epsilon: number;
}

export interface FitMetadata {
	temperature_c: number;
	point_count: number;
	rmse_v: number;
	max_error_v: number;
	/** The combined form's ε; absent on tabulated fits. */
	epsilon?: number;
	/** Leave-one-out cross-validated RMS error over the interior points, V (fits since the tabulated form). */
	cv_rmse_v?: number;
	/** SOC range the points cover; outside it the curve is extrapolated. */
	soc_range?: [number, number];
	/** True when non-increasing points were pooled (isotonic regression) at the caller's request. */
	smoothed?: boolean;
}

export interface OcvModel {
	chemistry: ChemistryCode;
	name: string;
	version: string;
	form: OcvForm;
	/** Form-specific, JSON: CombinedParams, RedlichKisterParams or TabulatedParams. */
	params: Record<string, unknown>;
	nominal_v: number;
	/** Model OCV at z = 0 and z = 1, 25 °C, per cell. */
	ocv_empty_v: number;
	ocv_full_v: number;
	/** Resting voltage below which the cell counts as deep-discharged. */
	min_safe_v: number;
	max_v: number;
	/** Hysteresis/relaxation/cell-to-cell spread the model cannot see, 1σ, V per cell. */
	sigma_model_v: number;
	/**
	 * The spread of real cells' own SOC around the z this curve reads from the same OCV, 1σ, SOC
	 * fraction, piecewise linear over the curve's z; when present it replaces sigma_model_v. Derived
	 * from published cells (src/lib/electrochem/calibration).
	 */
	sigma_model_soc_curve?: Array<[soc: number, sigma_soc: number]>;
	/** A reading is determinate only when its 95 % interval is narrower than this (SOC fraction). */
	determinate_width?: number;
	/**
	 * Half the gap between the charge and the discharge branch, V per cell, piecewise linear over z:
	 * charge branch = curve + h(z), discharge branch = curve − h(z). Absent: no hysteresis.
	 */
	hysteresis_half_v?: Array<[soc: number, v: number]>;
	/** The flat two-phase region, [from, to] in z: a reading there is indeterminate whatever its offset. */
	plateau?: [from: number, to: number];
	temperature_range_c: [number, number];
	rechargeable: boolean;
	lithium_ion: boolean;
	/** Primary cells: z is the fraction of capacity remaining. */
	soc_meaning: 'state_of_charge' | 'capacity_remaining';
	/** dU/dT over z, piecewise linear, mV/K. */
	entropic_mv_per_k: Array<[soc: number, mv_per_k: number]>;
	source: string;
	/** How much an OCV reading can say about z (extra, optional). */
	ocv_information?: OcvInformation;
	/** Present on models produced by fitCombinedModel. */
	fit?: FitMetadata;
}

export type FlagCode =
	'deep_discharge' | 'over_voltage' | 'soc_indeterminate' | 'temperature_out_of_range' | 'below_window' | 'above_window';

export interface ReadingInput {
	ocv_v: number;
	temperature_c: number;
}

export interface EvaluateOptions {
	cells_in_series?: number;
	declared_soc?: number | null;
	/** 1σ standard uncertainty of the meter on the pack voltage, V. */
	meter_accuracy_v?: number;
	indeterminate_width?: number;
	/** 1σ uncertainty of the cell temperature, K (a surface probe: ±2 K). */
	temperature_uncertainty_k?: number;
	/** How the cell was last moved: picks the hysteresis branch; unknown covers both. */
	last_direction?: LastDirection;
}

export type LastDirection = 'after_charge' | 'after_discharge' | 'unknown';

/** What an interval is made of, 1σ in V per cell, and which part limits it. */
export interface UncertaintyBudget {
	meter_v: number;
	model_v: number;
	temperature_v: number;
	/** Half the branch gap when the branch is unknown, else 0. */
	hysteresis_v: number;
	limited_by: 'model' | 'meter' | 'temperature' | 'plateau';
}

export interface UnitResult {
	soc: number;
	soc_sigma: number;
	soc_low: number;
	soc_high: number;
	determinate: boolean;
	ocv_cell_v: number;
	ocv_at_25c_v: number;
	expected_ocv_v: number | null;
	residual_v: number | null;
	flags: FlagCode[];
	/** Always set by evaluateReading; optional because evaluations stored before it have none. */
	uncertainty?: UncertaintyBudget;
}

/** What evaluateReading returns: a UnitResult whose budget is always there. */
export type EvaluatedUnit = UnitResult & { uncertainty: UncertaintyBudget };

export interface InversionResult {
	soc: number;
	soc_sigma: number;
	soc_low: number;
	soc_high: number;
	clamped: 'low' | 'high' | null;
}
