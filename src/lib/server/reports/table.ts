import type { PDFPage } from 'pdf-lib';
import { MARGIN, CONTENT_WIDTH, type Cursor } from './layout';
import { palette } from './palette';
import { drawText, fitText, textWidth } from './text';

export interface Column<Row> {
	title: string;
	/** Share of the content width. */
	weight: number;
	align: 'left' | 'right';
	cell(row: Row, index: number): string;
}

export interface TableOptions<Row> {
	/** Decorates a row (tint, marker) before its text is drawn. */
	decorate?(page: PDFPage, row: Row, box: { x: number; y: number; width: number; height: number }): void;
	continuedTitle: string;
}

const ROW = 12;
const HEADER = 16;
const SIZE = 7.5;
const PAD = 4;

/** Draws rows down the pages, repeating the header wherever the table continues. */
export function drawTable<Row>(cursor: Cursor, columns: Column<Row>[], rows: Row[], options: TableOptions<Row>): void {
	const widths = columnWidths(columns);
	cursor.ensure(HEADER + ROW * 3);
	drawHeader(cursor, columns, widths);
	rows.forEach((row, index) => {
		if (cursor.room < ROW) {
			cursor.newPage();
			drawText(cursor.page, cursor.fonts, options.continuedTitle, MARGIN, cursor.y - 10, { size: 9, color: palette.inkSoft });
			cursor.gap(16);
			drawHeader(cursor, columns, widths);
		}
		const box = { x: MARGIN, y: cursor.y - ROW, width: CONTENT_WIDTH, height: ROW };
		if (index % 2 === 1) cursor.page.drawRectangle({ ...box, color: palette.tealMist, opacity: 0.55 });
		options.decorate?.(cursor.page, row, box);
		drawCells(cursor, columns, widths, (column) => column.cell(row, index), palette.ink);
		cursor.gap(ROW);
	});
	cursor.page.drawLine({
		start: { x: MARGIN, y: cursor.y },
		end: { x: MARGIN + CONTENT_WIDTH, y: cursor.y },
		thickness: 0.6,
		color: palette.teal
	});
	cursor.gap(10);
}

function columnWidths<Row>(columns: Column<Row>[]): number[] {
	const total = columns.reduce((sum, c) => sum + c.weight, 0);
	return columns.map((c) => (c.weight / total) * CONTENT_WIDTH);
}

function drawHeader<Row>(cursor: Cursor, columns: Column<Row>[], widths: number[]): void {
	cursor.page.drawRectangle({ x: MARGIN, y: cursor.y - HEADER, width: CONTENT_WIDTH, height: HEADER, color: palette.tealDeep });
	const saved = cursor.y;
	cursor.y -= (HEADER - ROW) / 2;
	drawCells(cursor, columns, widths, (column) => column.title, palette.white);
	cursor.y = saved - HEADER;
}

function drawCells<Row>(
	cursor: Cursor,
	columns: Column<Row>[],
	widths: number[],
	text: (c: Column<Row>) => string,
	color: typeof palette.ink
): void {
	let x = MARGIN;
	columns.forEach((column, i) => {
		const inner = widths[i] - 2 * PAD;
		const value = fitText(cursor.fonts, text(column), SIZE, inner);
		const left = column.align === 'right' ? x + widths[i] - PAD - textWidth(cursor.fonts, value, SIZE) : x + PAD;
		drawText(cursor.page, cursor.fonts, value, left, cursor.y - ROW + 3.5, { size: SIZE, color });
		x += widths[i];
	});
}
