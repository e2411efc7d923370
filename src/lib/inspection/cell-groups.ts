// Cell-group voltages of a pack: the weakest cell group counts, not the average.
//
// A pack of N cells in series (each "group" is one cell or several cells in parallel, which share one
// voltage) reads N times the average cell voltage on a meter. One dead group can hide in that total:
// in a 10-group pack at 3.30 V per group, one group at 1.80 V lowers the average only to 3.15 V.
// The groups are judged against the same rest-voltage limits the chemistry model uses for the average
// (its min_safe_v and max_v), and their spread (max − min) against the part's imbalance limit.

/** Highest plausible rest voltage of one cell group, V: above every chemistry's charge limit (≈ 4.4 V). */
export const MAX_GROUP_V = 6;
/**
 * How far the sum of the groups may differ from the pack OCV before the pair is refused as a typo or a
 * mixed-up unit: 5 % (common practice for a BMS read against a bench meter; the BMS's own accuracy is a
 * few mV per group).
 */
export const GROUP_SUM_TOLERANCE = 0.05;

export interface CellGroupLimits {
	/** Rest voltage below which a cell counts as deep-discharged (the chemistry model's min_safe_v), V. */
	min_safe_v: number;
	/** Highest safe rest voltage (the chemistry model's max_v), V. */
	max_v: number;
	/** The part's limit on max − min of the groups, mV. */
	imbalance_limit_mv: number;
}

export interface CellGroupCheck {
	count: number;
	min_v: number;
	max_v: number;
	/** max − min of the groups, mV. */
	imbalance_mv: number;
	/** 1-based number of the lowest group. */
	weakest_group: number;
	/** 1-based numbers of the groups below min_safe_v. */
	deep_discharge_groups: number[];
	/** 1-based numbers of the groups above max_v. */
	over_voltage_groups: number[];
	imbalance_over_limit: boolean;
}

/** The groups judged against the limits. Expects a non-empty list of finite voltages. */
export function checkCellGroups(voltages: readonly number[], limits: CellGroupLimits): CellGroupCheck {
	let weakest = 0;
	let strongest = 0;
	voltages.forEach((v, i) => {
		if (v < voltages[weakest]) weakest = i;
		if (v > voltages[strongest]) strongest = i;
	});
	const numbersWhere = (test: (v: number) => boolean) => voltages.flatMap((v, i) => (test(v) ? [i + 1] : []));
	const imbalanceMv = (voltages[strongest] - voltages[weakest]) * 1000;
	return {
		count: voltages.length,
		min_v: voltages[weakest],
		max_v: voltages[strongest],
		imbalance_mv: imbalanceMv,
		weakest_group: weakest + 1,
		deep_discharge_groups: numbersWhere((v) => v < limits.min_safe_v),
		over_voltage_groups: numbersWhere((v) => v > limits.max_v),
		imbalance_over_limit: imbalanceMv > limits.imbalance_limit_mv
	};
}

/**
 * Why a list of group voltages cannot be stored with a reading of a pack, in plain words (empty when
 * it can): the count must equal the part's cells in series, each value must be a plausible rest
 * voltage, and their sum must agree with the pack's OCV.
 */
export function cellGroupProblems(voltages: readonly number[], pack: { cells_in_series: number; ocv_v: number }): string[] {
	if (pack.cells_in_series < 2) return ['this part is a single cell in series; cell-group voltages apply to packs only'];
	if (voltages.length !== pack.cells_in_series)
		return [`expected ${pack.cells_in_series} group voltages (the part's cells in series), got ${voltages.length}`];
	const bad = voltages.flatMap((v, i) => (Number.isFinite(v) && v >= 0 && v <= MAX_GROUP_V ? [] : [i + 1]));
	if (bad.length > 0) return [`group(s) ${bad.join(', ')} must be a voltage from 0 to ${MAX_GROUP_V} V`];
	const sum = voltages.reduce((a, v) => a + v, 0);
	if (Math.abs(sum - pack.ocv_v) > GROUP_SUM_TOLERANCE * pack.ocv_v)
		return [
			`the groups add up to ${sum.toFixed(3)} V but the pack reads ${pack.ocv_v.toFixed(3)} V (more than ${GROUP_SUM_TOLERANCE * 100} % apart); check the values and their unit`
		];
	return [];
}
