// Lot disposition: count nonconforming units against the active plan and collect reasons.
// Precedence: reject beats pending beats hold beats accept. Deterministic: same input, same output.
import { lotStatistics, robustCentre, robustOutliers, selfDischargeOfParsed, spreadCheck, median, type LotStatistics } from './statistics';
import { variablesCheck, type VariablesCheck } from './variables';
import { dgFindings, dgSummary, findDgRule, type DgFamily, type DgShipment, type DgSummary, type Packing } from './dangerous-goods';
import { outlierCondemned, outlierMessage, type OutlierContext } from './outliers';
import { checkCellGroups, type CellGroupCheck } from './cell-groups';
import type { SamplingPlan, Severity, UnitResult } from './types';

export type Transport = 'air' | 'sea' | 'road' | 'rail';
export type LotDocument = 'coc' | 'un38_3_summary' | 'sds' | 'other';

export interface PartLimits {
	/** Per-cell OCV window of the part (overrides the chemistry's own window), volts at 25 °C. */
	ocv_min_v: number;
	ocv_max_v: number;
	residual_tolerance_v: number;
	spread_limit_mv: number;
	outlier_k: number;
	self_discharge_limit_mv_per_day: number;
	/** SOC fraction, e.g. 0.1 for ±10 points. */
	declared_soc_tolerance: number;
	/** Largest max − min of a pack's cell-group voltages, mV; omitted: imbalance is not judged. */
	imbalance_limit_mv?: number;
}

export interface LotInfo {
	quantity: number;
	declared_soc: number | null;
	transport: Transport;
	lithium_ion: boolean;
	documents: LotDocument[];
	/** The part's required documents; when absent: CoC, plus the UN 38.3 summary for lithium and sodium-ion. */
	required_documents?: LotDocument[];
	/** How the cells travel (default alone), the lot's UN number, the chemistry's DG family (default from lithium_ion). */
	packing?: Packing;
	un_number?: string | null;
	dg_family?: DgFamily | null;
	/** One cell or battery of the part: nominal voltage × capacity, Wh. */
	energy_wh?: number | null;
	/** The day whose DG rules apply (ISO date); absent: the latest. */
	dg_date?: string;
}

export interface UnitInput {
	serial: string;
	result: UnitResult;
	self_discharge_mv_per_day?: number | null;
	/** A pack's cell-group voltages (one per cell in series), V; null when not recorded. */
	cell_group_voltages?: number[] | null;
}

export interface DispositionInput {
	lot: LotInfo;
	plan: SamplingPlan;
	severity: Severity;
	limits: PartLimits;
	units: UnitInput[];
	/** AQL for the advisory variables check; omit to skip it. */
	aql?: number | null;
	/** Smallest OCV spread trusted by the outlier rule (meter resolution), volts. Default 0.0005. */
	ocv_resolution_v?: number;
	/** Cells in series of the part (1 for a cell); packs without group voltages get a note. */
	cells_in_series?: number;
	/** The chemistry model's rest-voltage limits per cell, used for cell groups. */
	cell_limits?: { min_safe_v: number; max_v: number };
}

export type ReasonCode =
	| 'deep_discharge'
	| 'over_voltage'
	| 'imbalance_over_limit'
	| 'cell_groups_not_recorded'
	| 'nonconforming_over_limit'
	| 'sample_incomplete'
	| 'dg_soc_over_limit'
	| 'dg_soc_unverified'
	| 'dg_note'
	| 'declared_soc_mismatch'
	| 'soc_indeterminate'
	| 'spread_over_limit'
	| 'documents_missing'
	| 'temperature_out_of_range'
	| 'outliers_present'
	| 'self_discharge_over_limit'
	| 'outside_part_window'
	| 'residual_over_tolerance'
	| 'normality_warning';

export interface Reason {
	code: ReasonCode;
	severity: 'reject' | 'hold' | 'info';
	message: string;
	units?: string[];
}

export type UnitFlag =
	| UnitResult['flags'][number]
	| 'outlier'
	| 'residual_over_tolerance'
	| 'self_discharge_over_limit'
	| 'outside_part_window'
	| 'imbalance_over_limit';

export interface UnitDisposition extends UnitResult {
	serial: string;
	self_discharge_mv_per_day: number | null;
	nonconforming: boolean;
	unit_flags: UnitFlag[];
	/** The pack's cell groups judged (weakest, strongest, imbalance); null when none were recorded. */
	cell_groups: CellGroupCheck | null;
}

export interface Disposition {
	status: 'pending' | 'accept' | 'hold' | 'reject';
	safety: boolean;
	reasons: Reason[];
	nonconforming: number;
	nonconforming_serials: string[];
	stats: LotStatistics;
	variables: VariablesCheck;
	units: UnitDisposition[];
	/** The dangerous-goods rule applied (e.g. "IATA DGR 67th ed. PI 966") and the lot's packing. */
	dg: DgSummary;
}

/** Air transport limit for lithium-ion cells/batteries shipped alone: 30 % SOC. */
export const AIR_SOC_LIMIT = 0.3;
const NC_FLAGS: ReadonlySet<UnitFlag> = new Set<UnitFlag>([
	'deep_discharge',
	'over_voltage',
	'imbalance_over_limit',
	'outside_part_window',
	'residual_over_tolerance',
	'self_discharge_over_limit'
]);

/** Unit-level findings that count as nonconforming and are also listed as information. */
const INFO_REASONS: ReadonlyArray<{ code: ReasonCode; flag: UnitFlag; message: string }> = [
	{
		code: 'imbalance_over_limit',
		flag: 'imbalance_over_limit',
		message: "Cell-group voltages differ (max − min) by more than the part's imbalance limit; counted as nonconforming."
	},
	{
		code: 'self_discharge_over_limit',
		flag: 'self_discharge_over_limit',
		message: 'Voltage drop per day above the part limit; counted as nonconforming.'
	},
	{ code: 'outside_part_window', flag: 'outside_part_window', message: "OCV outside the part's window; counted as nonconforming." },
	{
		code: 'residual_over_tolerance',
		flag: 'residual_over_tolerance',
		message: 'OCV differs from the value expected at the declared SOC by more than the tolerance; counted as nonconforming.'
	}
];

function unitFlags(u: UnitInput, limits: PartLimits, isOutlier: boolean, groups: CellGroupCheck | null): UnitFlag[] {
	// Part limits replace the chemistry window, so the chemistry's below/above flags are not carried.
	const flags: UnitFlag[] = u.result.flags.filter((f) => f !== 'below_window' && f !== 'above_window');
	// The weakest (or strongest) group counts: the average cell voltage can hide it.
	if (groups?.deep_discharge_groups.length && !flags.includes('deep_discharge')) flags.push('deep_discharge');
	if (groups?.over_voltage_groups.length && !flags.includes('over_voltage')) flags.push('over_voltage');
	if (groups?.imbalance_over_limit) flags.push('imbalance_over_limit');
	const v = u.result.ocv_at_25c_v;
	if (v < limits.ocv_min_v || v > limits.ocv_max_v) flags.push('outside_part_window');
	const r = u.result.residual_v;
	if (r !== null && Math.abs(r) > limits.residual_tolerance_v) flags.push('residual_over_tolerance');
	if (isOutlier) flags.push('outlier');
	const sd = u.self_discharge_mv_per_day ?? null;
	if (sd !== null && sd > limits.self_discharge_limit_mv_per_day) flags.push('self_discharge_over_limit');
	return flags;
}

function serialsWith(units: readonly UnitDisposition[], flag: UnitFlag): string[] {
	return units.filter((u) => u.unit_flags.includes(flag)).map((u) => u.serial);
}

function pct(x: number): string {
	return `${Math.round(x * 100)} %`;
}

const DOCUMENT_NAMES: Partial<Record<LotDocument, string>> = {
	coc: 'certificate of conformity',
	un38_3_summary: 'UN 38.3 test summary',
	sds: 'safety data sheet'
};

function documentReasons(lot: LotInfo): Reason[] {
	const needed: LotDocument[] = lot.required_documents ?? (dgFamily(lot) ? ['coc', 'un38_3_summary'] : ['coc']);
	const missing = needed.filter((d) => !lot.documents.includes(d));
	if (missing.length === 0) return [];
	const names = missing.map((d) => DOCUMENT_NAMES[d] ?? d);
	return [{ code: 'documents_missing', severity: 'hold', message: `Missing: ${names.join(', ')}.` }];
}

function dgFamily(lot: LotInfo): DgFamily | null {
	return lot.dg_family !== undefined ? lot.dg_family : lot.lithium_ion ? 'lithium_ion' : null;
}

function dgShipment(lot: LotInfo): DgShipment {
	return {
		transport: lot.transport,
		un_number: lot.un_number ?? null,
		packing: lot.packing ?? 'alone',
		family: dgFamily(lot),
		energy_wh: lot.energy_wh ?? null,
		on: lot.dg_date
	};
}

/** Robust outliers: counted only when the part's own limits condemn them too (see outliers.ts). */
function outlierReason(units: readonly UnitDisposition[], ctx: OutlierContext): Reason | null {
	const flagged = units.filter((u) => u.unit_flags.includes('outlier'));
	if (flagged.length === 0) return null;
	const counted = flagged.filter((u) => outlierCondemned(u, ctx));
	return {
		code: 'outliers_present',
		severity: 'info',
		message: outlierMessage(flagged.length, counted.length, units.length),
		units: flagged.map((u) => u.serial)
	};
}

function outlierContext(n: number, lot: LotInfo, limits: PartLimits, medianV: number): OutlierContext {
	return {
		sample_size: n,
		median_v: medianV,
		spread_limit_mv: limits.spread_limit_mv,
		declared_soc: lot.declared_soc,
		declared_soc_tolerance: limits.declared_soc_tolerance
	};
}

/** SOC rules (air DG limit, declared SOC) and the hold when they needed a SOC they could not get. */
function socReasons(lot: LotInfo, limits: PartLimits, units: readonly UnitDisposition[]): Reason[] {
	const reasons: Reason[] = [];
	const determinate = units.filter((u) => u.determinate);
	const mostlyIndeterminate = units.length > 0 && determinate.length * 2 < units.length;
	const needsSoc: string[] = [];

	reasons.push(...dgFindings(findDgRule(dgShipment(lot)), dgShipment(lot), lot.declared_soc, units));

	if (lot.declared_soc !== null) {
		if (mostlyIndeterminate || determinate.length === 0) needsSoc.push('declared-SOC check');
		else {
			const declared = lot.declared_soc;
			const tol = limits.declared_soc_tolerance;
			const lo = median(determinate.map((u) => u.soc_low));
			const hi = median(determinate.map((u) => u.soc_high));
			const mid = median(determinate.map((u) => u.soc));
			const excludes = lo > declared + tol || hi < declared - tol;
			if (excludes && Math.abs(mid - declared) > tol) {
				const off = determinate.filter((u) => u.soc_low > declared + tol || u.soc_high < declared - tol).map((u) => u.serial);
				reasons.push({
					code: 'declared_soc_mismatch',
					severity: 'hold',
					message: `Median estimated SOC ${pct(mid)} (interval ${pct(lo)}–${pct(hi)}) differs from the declared ${pct(declared)} by more than ±${pct(tol)}.`,
					units: off
				});
			}
		}
	}

	if (needsSoc.length > 0) {
		reasons.push({
			code: 'soc_indeterminate',
			severity: 'hold',
			message:
				`The reading cannot place the SOC closely enough for ${units.length - determinate.length} of ${units.length} unit(s) ` +
				`(the 95 % interval is wider than the model allows: a flat stretch of the curve, a generic curve or an unknown charge/discharge branch), ` +
				`so the ${needsSoc.join(' and ')} was not made. A part model fitted to the supplier's curve, or another method such as a capacity check, can confirm it.`,
			units: units.filter((u) => !u.determinate).map((u) => u.serial)
		});
	}
	return reasons;
}

/** The unit's cell groups judged, when recorded for every cell in series and the model's limits are known. */
function cellGroupsOf(u: UnitInput, input: DispositionInput): CellGroupCheck | null {
	const voltages = u.cell_group_voltages;
	const limits = input.cell_limits;
	// Groups stored before the part's series count was changed no longer describe its cells: not used.
	if (!voltages || !limits || voltages.length < 2 || voltages.length !== (input.cells_in_series ?? 1)) return null;
	return checkCellGroups(voltages, { ...limits, imbalance_limit_mv: input.limits.imbalance_limit_mv ?? Infinity });
}

/** " (… group 4 at 1.812 V …)" for the units whose deep discharge only a cell group shows. */
function weakGroupsText(units: readonly UnitDisposition[]): string {
	const shown = units.flatMap((u) =>
		u.cell_groups?.deep_discharge_groups.length
			? [`${u.serial} group ${u.cell_groups.weakest_group} at ${u.cell_groups.min_v.toFixed(3)} V`]
			: []
	);
	return shown.length > 0 ? ` (weakest cell group: ${shown.join('; ')})` : '';
}

/** Over-voltage (average or a group) holds the lot; a pack read without its groups gets a plain note. */
function cellGroupReasons(units: readonly UnitDisposition[], input: DispositionInput): Reason[] {
	const reasons: Reason[] = [];
	const over = serialsWith(units, 'over_voltage');
	if (over.length > 0)
		reasons.push({
			code: 'over_voltage',
			severity: 'hold',
			message: `${over.length} unit(s) rest above the chemistry's highest safe voltage (overcharged); counted as nonconforming. Keep them apart from heat and other cells and handle per the site's procedure.`,
			units: over
		});
	const series = input.cells_in_series ?? 1;
	const unseen = units.filter((u) => u.cell_groups === null).map((u) => u.serial);
	if (series > 1 && unseen.length > 0)
		reasons.push({
			code: 'cell_groups_not_recorded',
			severity: 'info',
			message: `${unseen.length} pack(s) judged on the average cell voltage (pack voltage ÷ ${series}): one dead cell group can hide in the total. Record the cell-group voltages (e.g. the BMS readout) to see the weakest group.`,
			units: unseen
		});
	return reasons;
}

function statusOf(reasons: readonly Reason[], incomplete: boolean): Disposition['status'] {
	if (reasons.some((r) => r.severity === 'reject')) return 'reject';
	if (incomplete) return 'pending';
	if (reasons.some((r) => r.severity === 'hold')) return 'hold';
	return 'accept';
}

export function decideLot(input: DispositionInput): Disposition {
	const { lot, plan, limits } = input;
	const ocv = input.units.map((u) => u.result.ocv_at_25c_v);
	// One median/MAD for both the outlier rule and the statistics block (each would otherwise sort twice).
	const centre = ocv.length > 0 ? robustCentre(ocv) : undefined;
	const outlierIdx = new Set(robustOutliers(ocv, limits.outlier_k, input.ocv_resolution_v ?? 0.0005, centre));
	const outliers = outlierContext(ocv.length, lot, limits, centre?.median ?? 0);
	const units: UnitDisposition[] = input.units.map((u, i) => {
		const groups = cellGroupsOf(u, input);
		const flags = unitFlags(u, limits, outlierIdx.has(i), groups);
		return {
			serial: u.serial,
			...u.result,
			self_discharge_mv_per_day: u.self_discharge_mv_per_day ?? null,
			nonconforming: flags.some((f) => NC_FLAGS.has(f)) || (flags.includes('outlier') && outlierCondemned(u.result, outliers)),
			unit_flags: flags,
			cell_groups: groups
		};
	});
	const ncSerials = units.filter((u) => u.nonconforming).map((u) => u.serial);
	const reasons: Reason[] = [];

	const deep = serialsWith(units, 'deep_discharge');
	if (deep.length > 0) {
		reasons.push({
			code: 'deep_discharge',
			severity: 'reject',
			message: `${deep.length} unit(s) rest below the safe minimum voltage${weakGroupsText(units)}. Quarantine them and do not recharge; handle per the site's procedure for damaged cells.`,
			units: deep
		});
	}
	reasons.push(...cellGroupReasons(units, input));
	if (ncSerials.length >= plan.reject) {
		reasons.push({
			code: 'nonconforming_over_limit',
			severity: 'reject',
			message: `${ncSerials.length} nonconforming unit(s) reach the rejection number Re ${plan.reject} (Ac ${plan.accept}, n ${plan.sample_size}).`,
			units: ncSerials
		});
	}
	const incomplete = units.length < plan.sample_size;
	if (incomplete) {
		// A rejection found part-way (ISO 2859-1 lets the rejection number end the sample early) already
		// decides the lot; saying "no disposition yet" beside it would contradict the verdict.
		const decided = reasons.some((r) => r.severity === 'reject');
		reasons.push({
			code: 'sample_incomplete',
			severity: 'info',
			message: decided
				? `${units.length} of ${plan.sample_size} sample units measured; the rejection above already decides the lot, so the rest need not be measured.`
				: `${units.length} of ${plan.sample_size} sample units measured; no disposition until the sample is complete.`
		});
	}

	reasons.push(...socReasons(lot, limits, units));

	const spread = spreadCheck(ocv, limits.spread_limit_mv);
	if (spread?.over) {
		reasons.push({
			code: 'spread_over_limit',
			severity: 'hold',
			message: `OCV spread ${spread.spread_mv.toFixed(1)} mV exceeds the part limit of ${limits.spread_limit_mv} mV.`
		});
	}
	reasons.push(...documentReasons(lot));
	const hot = serialsWith(units, 'temperature_out_of_range');
	if (hot.length > 0) {
		reasons.push({
			code: 'temperature_out_of_range',
			severity: 'hold',
			message: `${hot.length} reading(s) taken outside the model's temperature range; re-measure after the cells settle.`,
			units: hot
		});
	}
	const outlier = outlierReason(units, outliers);
	if (outlier) reasons.push(outlier);
	for (const { code, flag, message } of INFO_REASONS) {
		const serials = serialsWith(units, flag);
		if (serials.length > 0) reasons.push({ code, severity: 'info', message, units: serials });
	}

	const variables = variablesCheck(ocv, limits.ocv_min_v, limits.ocv_max_v, input.aql ?? null);
	if (variables.normality_warning) {
		reasons.push({
			code: 'normality_warning',
			severity: 'info',
			message: 'OCV values do not look like one normal population (possibly a mixed lot); the variables check is unreliable.'
		});
	}

	return {
		status: statusOf(reasons, incomplete),
		safety: deep.length > 0,
		reasons,
		nonconforming: ncSerials.length,
		nonconforming_serials: ncSerials,
		stats: lotStatistics(ocv, centre),
		variables,
		units,
		dg: dgSummary(findDgRule(dgShipment(lot)), dgShipment(lot))
	};
}

/** One reading of one unit, as produced by electrochem for that reading. */
export interface TimedUnitReading {
	serial: string;
	measured_at: string;
	result: UnitResult;
	cell_group_voltages?: number[] | null;
}

export interface EvaluateLotInput extends Omit<DispositionInput, 'units'> {
	readings: TimedUnitReading[];
}

/**
 * Server entry point: readings of all units (any order). The latest reading per serial is the unit's
 * result; its earliest and latest readings ≥ 24 h apart give the self-discharge. Units keep the order
 * in which their serial first appears.
 */
export function evaluateLot(input: EvaluateLotInput): Disposition {
	const bySerial = new Map<string, TimedUnitReading[]>();
	for (const r of input.readings) {
		const list = bySerial.get(r.serial);
		if (list) list.push(r);
		else bySerial.set(r.serial, [r]);
	}
	const units: UnitInput[] = [];
	for (const [serial, list] of bySerial) units.push(unitOf(serial, list));
	const { readings: _readings, ...rest } = input;
	return decideLot({ ...rest, units });
}

/** A unit read once needs no dates (no self-discharge pair); otherwise each timestamp is parsed once. */
function unitOf(serial: string, list: readonly TimedUnitReading[]): UnitInput {
	if (list.length === 1)
		return { serial, result: list[0].result, self_discharge_mv_per_day: null, cell_group_voltages: list[0].cell_group_voltages ?? null };
	const times = list.map((r) => Date.parse(r.measured_at));
	let latest = 0;
	for (let i = 1; i < list.length; i++) if (times[i] > times[latest]) latest = i;
	const sd = selfDischargeOfParsed(
		times,
		list.map((r) => r.result.ocv_at_25c_v)
	);
	return { serial, result: list[latest].result, self_discharge_mv_per_day: sd, cell_group_voltages: latestGroups(list, times) };
}

/** The groups of the unit's latest reading that has them: a later pack-only reading (a second OCV) does not erase them. */
function latestGroups(list: readonly TimedUnitReading[], times: readonly number[]): number[] | null {
	let found = -1;
	list.forEach((r, i) => {
		if (r.cell_group_voltages && (found < 0 || times[i] > times[found])) found = i;
	});
	return found < 0 ? null : (list[found].cell_group_voltages ?? null);
}
