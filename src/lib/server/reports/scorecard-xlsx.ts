/** A supplier's scorecard as an XLSX workbook: Summary (scope and totals), Months, Parts. */
import XlsxPopulate from 'xlsx-populate';
import type { Sheet } from 'xlsx-populate';
import type { Scorecard } from '../services/scorecards';
import { xlsxColour } from './palette';
import { MONTH_HEADERS, PART_HEADERS, monthRows, partRows, scopeLines, totalFigures } from './scorecard-rows';

type Cell = string | number | null;

const HEADER_STYLE = { bold: true, fontColor: 'ffffff', fill: xlsxColour('volt-700') };

function writeRows(sheet: Sheet, headers: readonly string[], rows: ReadonlyArray<readonly Cell[]>, widths: number[]): void {
	headers.forEach((title, c) =>
		sheet
			.cell(1, c + 1)
			.value(title)
			.style(HEADER_STYLE)
	);
	rows.forEach((row, r) => row.forEach((value, c) => value !== null && sheet.cell(r + 2, c + 1).value(value)));
	widths.forEach((w, c) => sheet.column(c + 1).width(w));
	sheet.freezePanes(0, 1);
}

export async function scorecardXlsx(card: Scorecard, generatedAt: Date): Promise<Buffer> {
	const workbook = await XlsxPopulate.fromBlankAsync();
	const summary = workbook.sheet(0)!.name('Summary');
	const scope = scopeLines(card, generatedAt);
	scope.forEach(([label, value], r) => {
		summary
			.cell(r + 1, 1)
			.value(label)
			.style({ bold: true });
		summary.cell(r + 1, 2).value(value);
	});
	const first = scope.length + 2;
	['figure', 'value', 'unit'].forEach((title, c) =>
		summary
			.cell(first, c + 1)
			.value(title)
			.style(HEADER_STYLE)
	);
	totalFigures(card.totals).forEach(([label, value, unit], r) => {
		summary.cell(first + 1 + r, 1).value(label);
		// An empty cell where there is no figure (no lot decided), never 0.
		if (value !== null) summary.cell(first + 1 + r, 2).value(value);
		summary.cell(first + 1 + r, 3).value(unit);
	});
	[34, 60, 10].forEach((w, c) => summary.column(c + 1).width(w));
	writeRows(workbook.addSheet('Months'), MONTH_HEADERS, monthRows(card), [10, 14, 10, 10, 10, 20]);
	writeRows(workbook.addSheet('Parts'), PART_HEADERS, partRows(card), [18, 40, 14, 14, 8, 10, 20, 16]);
	return workbook.outputAsync();
}
