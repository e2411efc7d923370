/** A supplier's scorecard as an A4 PDF: scope, totals, months and parts, in the report's own frame. */
import { PDFDocument } from 'pdf-lib';
import { count, dateTime, fixed, MISSING, ppm, quantity } from '$lib/format';
import type { Scorecard } from '../services/scorecards';
import { pairColumns, type Pair } from './blocks';
import { embedFonts } from './fonts';
import { Cursor, drawFooters, sectionTitle } from './layout';
import { drawTable, type Column } from './table';
import { MONTH_HEADERS, PART_HEADERS, monthRows, partRows, scopeLines, totalFigures, type Figure } from './scorecard-rows';

const text = (value: string | number | null, unit = ''): string => {
	if (value === null) return MISSING;
	if (typeof value === 'string') return value;
	if (unit === '%') return `${fixed(value, 1)}\u00a0%`;
	if (unit === 'ppm') return ppm(value);
	return count(value);
};

const NOUNS: Record<string, string> = { lots: 'lot', units: 'unit' };

const figurePair = ([label, value, unit]: Figure): Pair => [
	label,
	NOUNS[unit] && typeof value === 'number' ? quantity(value, NOUNS[unit]) : text(value, unit)
];

/** Text columns (the first `textColumns`) align left, figures right. */
function columnsOf<Row extends readonly (string | number | null)[]>(
	headers: readonly string[],
	weights: number[],
	units: string[],
	textColumns: number
): Column<Row>[] {
	return headers.map((title, i) => ({
		title,
		weight: weights[i],
		align: i < textColumns ? 'left' : 'right',
		cell: (row: Row) => text(row[i], units[i])
	}));
}

export async function scorecardPdf(card: Scorecard, generatedAt: Date): Promise<Uint8Array> {
	const doc = await PDFDocument.create();
	const scope = card.part ? `${card.supplier.name} · ${card.part.partNumber}` : card.supplier.name;
	doc.setTitle(`Supplier scorecard — ${scope}`);
	doc.setCreator('Restvolt');
	const fonts = await embedFonts(doc);
	const cursor = new Cursor(doc, fonts, `Supplier scorecard · ${scope}`);

	sectionTitle(cursor, 'Scope');
	const lines = scopeLines(card, generatedAt);
	pairColumns(cursor, lines.slice(0, Math.ceil(lines.length / 2)), lines.slice(Math.ceil(lines.length / 2)));

	sectionTitle(cursor, 'Totals');
	const figures = totalFigures(card.totals).map(figurePair);
	pairColumns(cursor, figures.slice(0, 6), figures.slice(6));

	sectionTitle(cursor, `Months (${card.months.length})`, 60);
	drawTable(cursor, columnsOf(MONTH_HEADERS, [1, 1, 1, 1, 1, 1.4], ['', '', '', '', '', 'ppm'], 1), monthRows(card), {
		continuedTitle: 'Months (continued)'
	});
	sectionTitle(cursor, `Parts (${card.parts.length})`, 60);
	drawTable(
		cursor,
		columnsOf(PART_HEADERS, [1.2, 1.7, 1, 1.2, 0.6, 0.7, 1.6, 1.1], ['', '', '', '%', '', '', 'ppm', ''], 2),
		partRows(card),
		{
			continuedTitle: 'Parts (continued)'
		}
	);

	drawFooters(doc, fonts, `Restvolt · scorecard · ${scope} · generated ${dateTime(generatedAt)}`);
	return doc.save();
}
