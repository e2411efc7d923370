import type { PDFPage } from 'pdf-lib';
import type { FontSet } from './fonts';
import { CONTENT_WIDTH, MARGIN, type Cursor } from './layout';
import { palette } from './palette';
import { drawText, wrapText, type TextStyle } from './text';

export type Pair = readonly [label: string, value: string];

const LINE = 12;
const LABEL_SIZE = 8;
const VALUE_SIZE = 9;

/** Where values start in a label/value column of this width. */
export function labelWidthFor(width: number): number {
	return Math.min(96, width * 0.4);
}

/** Label/value rows in one column; long values wrap. Returns the height used. */
export function drawPairs(page: PDFPage, fonts: FontSet, pairs: readonly Pair[], x: number, top: number, width: number): number {
	const labelWidth = labelWidthFor(width);
	let y = top;
	for (const [label, value] of pairs) {
		drawText(page, fonts, label, x, y - 9, { size: LABEL_SIZE, color: palette.inkSoft });
		const lines = wrapText(fonts, value, VALUE_SIZE, width - labelWidth - 4);
		lines.forEach((line, i) => drawText(page, fonts, line, x + labelWidth, y - 9 - i * 11, { size: VALUE_SIZE, color: palette.ink }));
		y -= Math.max(LINE, lines.length * 11 + 2);
	}
	return top - y;
}

function pairsHeight(fonts: FontSet, pairs: readonly Pair[], width: number): number {
	const labelWidth = labelWidthFor(width);
	return pairs.reduce((sum, [, value]) => {
		const lines = wrapText(fonts, value, VALUE_SIZE, width - labelWidth - 4).length;
		return sum + Math.max(LINE, lines * 11 + 2);
	}, 0);
}

/** Two label/value columns side by side, kept together on one page. */
export function pairColumns(cursor: Cursor, left: readonly Pair[], right: readonly Pair[]): void {
	const columnWidth = (CONTENT_WIDTH - 18) / 2;
	const height = Math.max(pairsHeight(cursor.fonts, left, columnWidth), pairsHeight(cursor.fonts, right, columnWidth));
	cursor.ensure(height);
	drawPairs(cursor.page, cursor.fonts, left, MARGIN, cursor.y, columnWidth);
	drawPairs(cursor.page, cursor.fonts, right, MARGIN + columnWidth + 18, cursor.y, columnWidth);
	cursor.gap(height + 8);
}

/** Wrapped text that may continue on the next page, line by line. */
export function paragraph(cursor: Cursor, text: string, style: TextStyle, indent = 0, lineHeight = style.size * 1.35): void {
	for (const line of wrapText(cursor.fonts, text, style.size, CONTENT_WIDTH - indent)) {
		cursor.ensure(lineHeight);
		drawText(cursor.page, cursor.fonts, line, MARGIN + indent, cursor.y - style.size, style);
		cursor.gap(lineHeight);
	}
}
