/**
 * The scorecard exports from a fixed scorecard: the PDF read back by poppler (pdftotext, pdfinfo)
 * and the workbook by xlsx-populate say the same figures; a figure that cannot be computed (no
 * unit inspected) is an empty cell in the workbook and a dash in the PDF, never 0.
 * ppm = nonconforming / inspected × 10⁶ (definition): 3 of 520 → 5,769 ppm.
 */
import { describe, expect, it } from 'vitest';
import XlsxPopulate from 'xlsx-populate';
import { scorecardPdf } from '../../../src/lib/server/reports/scorecard-pdf';
import { scorecardXlsx } from '../../../src/lib/server/reports/scorecard-xlsx';
import { totalsOf, type Scorecard } from '../../../src/lib/server/services/scorecards';
import { pdfInfo, pdfText, writeTemp } from './poppler';

const totals = {
	...totalsOf([]),
	lotsReceived: 4,
	lotsDecided: 4,
	accepted: 3,
	held: 1,
	releasedAfterHold: 1,
	acceptanceRate: 0.75,
	unitsInspected: 520,
	nonconformingUnits: 3,
	ppm: (3 / 520) * 1e6
};
const card: Scorecard = {
	supplier: { id: 's1', name: 'Harrow Test Cells' },
	part: null,
	parts: [
		{ id: 'p1', partNumber: 'HT-18650-A', description: 'NMC 18650-size cell', severity: 'normal', totals },
		{ id: 'p2', partNumber: 'HT-26650-B', description: 'LFP 26650-size cell', severity: 'tightened', totals: totalsOf([]) }
	],
	totals,
	months: [
		{ period: '2031-03', received: 2, accepted: 2, held: 0, rejected: 0, ppm: 0 },
		{ period: '2031-04', received: 2, accepted: 1, held: 1, rejected: 0, ppm: (3 / 260) * 1e6 }
	],
	severity: null,
	period: {
		from: new Date('2031-01-01T00:00:00Z'),
		to: new Date('2031-05-01T00:00:00Z'),
		label: '2031-01-01 to 2031-04-30 (UTC, both days included)'
	}
};
const AT = new Date('2031-05-15T10:05:00Z');

describe('scorecard exports', () => {
	it('writes the PDF with scope, totals, months and parts', async () => {
		const file = writeTemp('scorecard.pdf', await scorecardPdf(card, AT));
		expect(pdfInfo(file).Title).toBe('Supplier scorecard — Harrow Test Cells');
		const text = pdfText(file);
		expect(text).toContain('2031-01-01 to 2031-04-30');
		expect(text).toContain('5,769 ppm');
		expect(text).toMatch(/^75\.0\s+%$/m);
		expect(text).toContain('HT-26650-B');
		expect(text).toContain('Tightened');
		expect(text).toContain('2031-04');
		expect(text).toContain('generated 2031-05-15 10:05 UTC');
	});

	it('writes the workbook with the same figures, leaving what cannot be computed empty', async () => {
		const book = await XlsxPopulate.fromDataAsync(await scorecardXlsx(card, AT));
		const rows = book.sheet('Summary')!.usedRange()!.value() as unknown[][];
		const figure = (label: string) => rows.find((r) => r[0] === label)?.[1];
		expect(figure('Nonconforming')).toBeCloseTo(5769.23, 2);
		expect(figure('Acceptance rate')).toBe(75);
		const parts = book.sheet('Parts')!.usedRange()!.value() as unknown[][];
		expect(parts[0]).toEqual([
			'part',
			'description',
			'lots received',
			'acceptance (%)',
			'held',
			'rejected',
			'nonconforming (ppm)',
			'severity now'
		]);
		expect(parts[2][0]).toBe('HT-26650-B');
		expect(parts[2][3]).toBeUndefined();
		expect(book.sheet('Months')!.usedRange()!.value()).toHaveLength(3);
	});
});
