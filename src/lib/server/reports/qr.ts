import QRCode from 'qrcode';
import type { PDFPage, RGB } from 'pdf-lib';

/** Quiet zone of four modules around the symbol (ISO/IEC 18004). */
export const QUIET_MODULES = 4;

/** Dark modules as row runs, row 0 at the top; merging runs keeps the page content small. */
export function qrRuns(text: string): { size: number; runs: Array<{ row: number; col: number; length: number }> } {
	const { modules } = QRCode.create(text, { errorCorrectionLevel: 'M' });
	const runs: Array<{ row: number; col: number; length: number }> = [];
	for (let row = 0; row < modules.size; row++) {
		let col = 0;
		while (col < modules.size) {
			if (!modules.get(row, col)) {
				col++;
				continue;
			}
			const start = col;
			while (col < modules.size && modules.get(row, col)) col++;
			runs.push({ row, col: start, length: col - start });
		}
	}
	return { size: modules.size, runs };
}

/** Draws the QR symbol as vector rectangles in a square of `side` points whose lower-left corner is (x, y). */
export function drawQr(page: PDFPage, text: string, x: number, y: number, side: number, color: RGB, paper: RGB): void {
	const { size, runs } = qrRuns(text);
	const module = side / (size + 2 * QUIET_MODULES);
	page.drawRectangle({ x, y, width: side, height: side, color: paper });
	const originX = x + QUIET_MODULES * module;
	const topY = y + side - QUIET_MODULES * module;
	for (const run of runs) {
		page.drawRectangle({
			x: originX + run.col * module,
			y: topY - (run.row + 1) * module,
			width: run.length * module,
			height: module,
			color
		});
	}
}
