// What a grid row shows for its unit: the flags of the lot's disposition (the server's evaluation
// once the row is saved; before that, the same cores run in the browser: live-evaluation.ts).
import { formatSocInterval, percent, signedMillivolts, volts } from '$lib/format';
import type { PartLimits, UnitDisposition, UnitFlag } from '$lib/inspection';
import { socStanding } from '$lib/inspection/dangerous-goods';
import { VERDICT, type Look } from '$lib/status';

export interface BenchContext {
	cellsInSeries: number;
	limits: PartLimits;
	/** SOC limit for an air-shipped lithium-ion lot (the server's air rule), else null. */
	airSocLimit?: number | null;
}

/** A finding on one reading: a stable code (for tests and styling hooks) and its look. */
export interface Finding extends Look {
	code: string;
}

export interface RowFeedback {
	socText: string;
	expectedText: string;
	residualText: string;
	/** Findings as words, each with a shape and tone (never colour alone). */
	findings: Finding[];
	deepDischarge: boolean;
	indeterminate: boolean;
}

/** A row's unit in the lot's disposition and where that came from (the server's evaluation, or the browser's). */
export type RowUnit = { unit: UnitDisposition; source: 'server' | 'live' } | null;

const refused = (code: string, word: string): Finding => ({ code, word, shape: 'cross', tone: 'reject' });
const attention = (code: string, word: string): Finding => ({ code, word, shape: 'alert', tone: 'hold' });

/** Every unit flag of the inspection core as a finding; the chemistry's own window flags are not carried (the part's window is). */
const FLAG_FINDINGS: Partial<Record<UnitFlag, Finding>> = {
	deep_discharge: refused('deep_discharge', 'deep discharge'),
	over_voltage: refused('over_voltage', 'over voltage'),
	outside_part_window: attention('outside_window', 'outside window'),
	residual_over_tolerance: attention('far_from_declared_soc', 'far from declared SOC'),
	outlier: attention('outlier', 'outlier'),
	self_discharge_over_limit: attention('self_discharge_over_limit', 'self-discharge over limit'),
	imbalance_over_limit: attention('imbalance_over_limit', 'cell groups imbalanced'),
	soc_indeterminate: { ...VERDICT.indeterminate, code: 'soc_indeterminate', word: 'SOC indeterminate' },
	temperature_out_of_range: attention('temperature_out_of_range', 'temp. out of range')
};

/** Plausible pack/cell voltage range shown beside the OCV field: the part window × cells in series. */
export function plausibleRange(ctx: BenchContext): [number, number] {
	return [ctx.limits.ocv_min_v * ctx.cellsInSeries, ctx.limits.ocv_max_v * ctx.cellsInSeries];
}

/** Findings from a unit's flags as the inspection core gives them (nonconforming first), plus the air check. */
function findingsOf(ctx: BenchContext, unit: UnitDisposition): Finding[] {
	const findings: Finding[] = unit.nonconforming ? [refused('nonconforming', 'nonconforming')] : [];
	for (const flag of unit.unit_flags) if (FLAG_FINDINGS[flag]) findings.push(FLAG_FINDINGS[flag]);
	// Same test as the server's air rule (socStanding in the inspection core).
	const air = ctx.airSocLimit == null ? 'within' : socStanding(unit, ctx.airSocLimit);
	if (air === 'over') findings.push(attention('above_air_limit', `above ${percent(ctx.airSocLimit!)} air limit`));
	if (air === 'unverified') findings.push(attention('air_limit_unverified', `≤ ${percent(ctx.airSocLimit!)} not shown`));
	if (findings.length === 0) findings.push({ ...VERDICT.accept, code: 'in_window', word: 'in window' });
	return findings;
}

/** What a grid row shows for a unit of the lot's disposition (the server's, or the same core run in the browser). */
export function unitFeedback(ctx: BenchContext, unit: UnitDisposition): RowFeedback {
	const flags: readonly string[] = unit.flags;
	return {
		socText: flags.includes('below_window') ? 'below range' : flags.includes('above_window') ? 'above range' : formatSocInterval(unit),
		expectedText: unit.expected_ocv_v === null ? '—' : volts(unit.expected_ocv_v * ctx.cellsInSeries, ctx.cellsInSeries > 1 ? 2 : 3),
		residualText: signedMillivolts(unit.residual_v),
		findings: findingsOf(ctx, unit),
		deepDischarge: unit.unit_flags.includes('deep_discharge'),
		indeterminate: !unit.determinate
	};
}
