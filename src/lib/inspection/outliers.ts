// When a robust outlier counts against the lot. The outlier rule compares a unit with its lot, not
// with the part: it may never be stricter than the part's own limits. So an outlier is nonconforming
// only in a sample large enough for the median and MAD to mean something (n ≥ 8) and only when the
// unit is also outside what the part allows: farther from the lot median than the part's spread
// limit, or an SOC interval that excludes the declared SOC ± the part's tolerance.
// Otherwise it is advice to look at the unit. (n ≥ 8: common practice for median/MAD screening;
// below it one or two odd units move the median and MAD too much.)

export const OUTLIER_MIN_SAMPLE = 8;

export interface OutlierContext {
	sample_size: number;
	median_v: number;
	spread_limit_mv: number;
	declared_soc: number | null;
	declared_soc_tolerance: number;
}

export interface OutlierUnit {
	ocv_at_25c_v: number;
	soc_low: number;
	soc_high: number;
}

function outsideDeclaredSoc(u: OutlierUnit, ctx: OutlierContext): boolean {
	if (ctx.declared_soc === null) return false;
	const tol = ctx.declared_soc_tolerance;
	return u.soc_low > ctx.declared_soc + tol || u.soc_high < ctx.declared_soc - tol;
}

/** True when a unit the outlier rule flagged also breaks the part's limits in a sample large enough to judge. */
export function outlierCondemned(u: OutlierUnit, ctx: OutlierContext): boolean {
	if (ctx.sample_size < OUTLIER_MIN_SAMPLE) return false;
	const offMv = Math.abs(u.ocv_at_25c_v - ctx.median_v) * 1000;
	return offMv > ctx.spread_limit_mv || outsideDeclaredSoc(u, ctx);
}

/** The outlier note: how many are counted and why the others are only advice. */
export function outlierMessage(flagged: number, counted: number, sampleSize: number): string {
	if (sampleSize < OUTLIER_MIN_SAMPLE) {
		return `OCV far from the lot median (robust outlier rule). Noted only: with ${sampleSize} units (fewer than ${OUTLIER_MIN_SAMPLE}) the rule cannot condemn a unit.`;
	}
	if (counted === 0) {
		return "OCV far from the lot median (robust outlier rule). Advisory: every flagged unit is within the part's spread limit and SOC tolerance, so none counts as nonconforming.";
	}
	const advisory = flagged - counted;
	return (
		`OCV far from the lot median (robust outlier rule). ${counted} unit(s) also outside the part's spread limit or SOC tolerance count as nonconforming` +
		(advisory > 0 ? `; ${advisory} within the part's limits are advisory.` : '.')
	);
}
