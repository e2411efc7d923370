import { PageSizes } from 'pdf-lib';
import type { PDFDocument, PDFPage } from 'pdf-lib';
import type { FontSet } from './fonts';
import { palette } from './palette';
import { drawText, drawTextRight, textWidth } from './text';

export const A4 = { width: PageSizes.A4[0], height: PageSizes.A4[1] };
export const MARGIN = 42;
export const CONTENT_WIDTH = A4.width - 2 * MARGIN;
const BAND_HEIGHT = 40;
const TOP = A4.height - BAND_HEIGHT - 22;
const BOTTOM = MARGIN + 18;

/** Writes downwards through the document, opening a new framed page when the next block does not fit. */
export class Cursor {
	page!: PDFPage;
	y = 0;

	constructor(
		readonly doc: PDFDocument,
		readonly fonts: FontSet,
		private readonly bandRightText: string
	) {
		this.newPage();
	}

	newPage(): void {
		this.page = this.doc.addPage(PageSizes.A4);
		drawBand(this.page, this.fonts, this.bandRightText);
		this.y = TOP;
	}

	/** Space left above the footer on the current page. */
	get room(): number {
		return this.y - BOTTOM;
	}

	ensure(height: number): void {
		if (height > this.room) this.newPage();
	}

	gap(points: number): void {
		this.y -= points;
	}
}

function drawBand(page: PDFPage, fonts: FontSet, rightText: string): void {
	const top = A4.height;
	page.drawRectangle({ x: 0, y: top - BAND_HEIGHT, width: A4.width, height: BAND_HEIGHT, color: palette.tealDeep });
	page.drawRectangle({ x: 0, y: top - BAND_HEIGHT - 3, width: A4.width, height: 3, color: palette.teal });
	drawMark(page, MARGIN, top - BAND_HEIGHT / 2);
	drawText(page, fonts, 'Restvolt', MARGIN + 20, top - 26, { size: 16, color: palette.white, strong: true });
	drawTextRight(page, fonts, rightText, A4.width - MARGIN, top - 25, { size: 10, color: palette.white });
}

/** The Restvolt mark: a cell outline with a level bar, drawn rather than imported. */
function drawMark(page: PDFPage, x: number, centreY: number): void {
	page.drawRectangle({ x, y: centreY - 8, width: 11, height: 16, borderColor: palette.white, borderWidth: 1.4 });
	page.drawRectangle({ x: x + 3, y: centreY + 8, width: 5, height: 2, color: palette.white });
	page.drawRectangle({ x: x + 2.5, y: centreY - 5.5, width: 6, height: 6, color: palette.white });
}

/** Footer on every page, written once the page count is known. */
export function drawFooters(doc: PDFDocument, fonts: FontSet, leftText: string): void {
	const pages = doc.getPages();
	const style = { size: 7.5, color: palette.inkSoft };
	pages.forEach((page, index) => {
		page.drawLine({
			start: { x: MARGIN, y: MARGIN + 8 },
			end: { x: A4.width - MARGIN, y: MARGIN + 8 },
			thickness: 0.5,
			color: palette.rule
		});
		drawText(page, fonts, leftText, MARGIN, MARGIN - 2, style);
		const label = `page ${index + 1} of ${pages.length}`;
		drawText(page, fonts, label, A4.width - MARGIN - textWidth(fonts, label, style.size), MARGIN - 2, style);
	});
}

/** A section title with a teal rule under it. */
export function sectionTitle(cursor: Cursor, title: string, minBody = 40): void {
	cursor.ensure(24 + minBody);
	const { page, fonts } = cursor;
	drawText(page, fonts, title, MARGIN, cursor.y - 11, { size: 11, color: palette.tealDeep, strong: true });
	page.drawLine({
		start: { x: MARGIN, y: cursor.y - 16 },
		end: { x: A4.width - MARGIN, y: cursor.y - 16 },
		thickness: 0.8,
		color: palette.teal
	});
	cursor.gap(24);
}
