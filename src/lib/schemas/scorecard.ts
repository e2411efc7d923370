/**
 * The scorecard's period and its comparison, as the page's address, the API and the exports read
 * them. A period counts a lot by the day it was decided (else received, else registered), in UTC.
 */
import { z } from 'zod';
import { CHEMISTRY_CODES } from '$lib/electrochem';
import { text } from './fields';

export const PERIOD_CHOICES = ['all', '90d', '12m', 'custom'] as const;
export type PeriodChoice = (typeof PERIOD_CHOICES)[number];

export const PERIOD_WORDS: Record<PeriodChoice, string> = {
	all: 'All time',
	'90d': 'Last 90 days',
	'12m': 'Last 12 months',
	custom: 'From – to'
};

const day = text()
	.regex(/^\d{4}-\d{2}-\d{2}$/, 'Write the date as YYYY-MM-DD')
	// A real calendar day: 2031-02-30 would otherwise roll over to 2 March.
	.refine((v) => {
		const t = Date.parse(`${v}T00:00:00Z`);
		return !Number.isNaN(t) && new Date(t).toISOString().slice(0, 10) === v;
	}, 'This date does not exist');

/** The period's fields, for the page's address and for API queries that add their own. */
export const periodFields = {
	period: z.enum(PERIOD_CHOICES, { error: 'Choose all, 90d, 12m or custom' }).default('all'),
	from: day.optional(),
	to: day.optional()
};

/** A custom period needs both days, the last not before the first. */
export function checkPeriod(q: { period: PeriodChoice; from?: string; to?: string }, ctx: z.RefinementCtx): void {
	if (q.period !== 'custom') return;
	if (!q.from) ctx.addIssue({ code: 'custom', path: ['from'], message: 'A custom period needs its first day (from)' });
	if (!q.to) ctx.addIssue({ code: 'custom', path: ['to'], message: 'A custom period needs its last day (to)' });
	if (q.from && q.to && q.from > q.to) ctx.addIssue({ code: 'custom', path: ['to'], message: 'The last day comes before the first day' });
}

export const periodQuery = z.object(periodFields).superRefine(checkPeriod);

/** GET /api/v1/suppliers/{id}/scorecard (and .xlsx, .pdf): one part (optional) over a period. */
export const scorecardQuery = z
	.object({ part_id: z.uuid({ error: 'part_id must be a part id' }).optional(), ...periodFields })
	.superRefine(checkPeriod);

export type PeriodQuery = z.infer<typeof periodQuery>;

/** A half-open range of instants: from ≤ t < to. */
export interface Period {
	from: Date;
	to: Date;
	label: string;
}

const DAY_MS = 86_400_000;
const isoDay = (d: Date) => d.toISOString().slice(0, 10);

/**
 * The instants a choice covers, `now` included: "last 90 days" is the 90 calendar days (UTC) ending
 * today; "last 12 months" starts on the same day twelve months back; a custom period includes both
 * of its days. Null for all time.
 */
export function periodOf(q: PeriodQuery, now: Date): Period | null {
	const tomorrow = new Date(Date.parse(`${isoDay(now)}T00:00:00Z`) + DAY_MS);
	if (q.period === '90d') return labelled(new Date(tomorrow.getTime() - 90 * DAY_MS), tomorrow);
	if (q.period === '12m') {
		const from = new Date(tomorrow);
		from.setUTCFullYear(from.getUTCFullYear() - 1);
		return labelled(from, tomorrow);
	}
	if (q.period === 'custom' && q.from && q.to)
		return labelled(new Date(`${q.from}T00:00:00Z`), new Date(Date.parse(`${q.to}T00:00:00Z`) + DAY_MS));
	return null;
}

function labelled(from: Date, to: Date): Period {
	return { from, to, label: `${isoDay(from)} to ${isoDay(new Date(to.getTime() - DAY_MS))} (UTC, both days included)` };
}

/** The comparison: suppliers side by side for one part number or one chemistry. */
export const comparisonQuery = z.object({
	chemistry: z.enum(CHEMISTRY_CODES as [string, ...string[]], { error: 'Choose a known chemistry' }).optional(),
	part_number: text().trim().min(1).max(60, 'At most 60 characters').optional()
});
