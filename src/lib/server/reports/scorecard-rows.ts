/**
 * What a scorecard export contains, as plain rows shared by the XLSX and the PDF so the two say the
 * same thing: the totals (label, value as a number where it is one, and its unit), the months and
 * the parts.
 */
import { INSPECTION_SEVERITY, wordOf } from '$lib/status';
import { dateTime } from '$lib/format';
import type { Scorecard, ScorecardTotals } from '../services/scorecards';

export type Figure = readonly [label: string, value: number | string | null, unit: string];

/** Accepted, held and rejected on original inspection (the scope says so). Rates as percent (0–100) and nonconforming units per million inspected; null where nothing was decided. */
export function totalFigures(t: ScorecardTotals): Figure[] {
	return [
		['Lots received', t.lotsReceived, 'lots'],
		['Lots decided', t.lotsDecided, 'lots'],
		['Accepted', t.accepted, 'lots'],
		['Held', t.held, 'lots'],
		['Released after hold', t.releasedAfterHold, 'lots'],
		['Rejected', t.rejected, 'lots'],
		['Rejected in the end', t.finalRejected, 'lots'],
		['Acceptance rate', t.acceptanceRate === null ? null : t.acceptanceRate * 100, '%'],
		['Units inspected', t.unitsInspected, 'units'],
		['Nonconforming units', t.nonconformingUnits, 'units'],
		['Nonconforming', t.ppm, 'ppm']
	];
}

export function scopeLines(card: Scorecard, generatedAt: Date): Array<readonly [string, string]> {
	return [
		['Supplier', card.supplier.name],
		['Part', card.part ? card.part.partNumber : 'all parts'],
		['Period', card.period ? card.period.label : 'all time'],
		['Counted by', 'the day a lot was decided (else received, else registered), UTC'],
		['Dispositions', 'original inspection (ISO 2859-1:1999 counts original inspection)'],
		...(card.severity ? [['Sampling severity now', wordOf(INSPECTION_SEVERITY, card.severity)] as const] : []),
		['Generated', dateTime(generatedAt)]
	];
}

export const MONTH_HEADERS = ['month', 'lots received', 'accepted', 'held', 'rejected', 'nonconforming (ppm)'] as const;

export const monthRows = (card: Scorecard) =>
	card.months.map((m) => [m.period, m.received, m.accepted, m.held, m.rejected, m.ppm] as const);

export const PART_HEADERS = [
	'part',
	'description',
	'lots received',
	'acceptance (%)',
	'held',
	'rejected',
	'nonconforming (ppm)',
	'severity now'
] as const;

export const partRows = (card: Scorecard) =>
	card.parts.map(
		(p) =>
			[
				p.partNumber,
				p.description,
				p.totals.lotsReceived,
				p.totals.acceptanceRate === null ? null : p.totals.acceptanceRate * 100,
				p.totals.held,
				p.totals.rejected,
				p.totals.ppm,
				wordOf(INSPECTION_SEVERITY, p.severity)
			] as const
	);
