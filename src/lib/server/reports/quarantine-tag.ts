import { PDFDocument } from 'pdf-lib';
import type { PDFPage } from 'pdf-lib';
import { drawPairs, labelWidthFor, type Pair } from './blocks';
import { embedFonts, type FontSet } from './fonts';
import { palette } from './palette';
import { drawQr } from './qr';
import { statusShape, triangle } from './shapes';
import { drawText, drawTextRight, fitText, wrapText } from './text';
import type { TagData } from './types';
import { LOT_STATUS } from '$lib/status';
import { quantity } from '$lib/format';

/** A6 landscape (148 × 105 mm, ISO 216) in points. */
export const A6_LANDSCAPE: [number, number] = [419.53, 297.64];
const EDGE = 18;
const BAND = 46;
const QR_SIDE = 104;

const TAG_TITLES = {
	on_hold: `QUARANTINE — ${LOT_STATUS.on_hold.word.toUpperCase()}`,
	rejected: `QUARANTINE — ${LOT_STATUS.rejected.word.toUpperCase()}`
} as const;

function tagCaution(tag: TagData): string {
	if (tag.safety) {
		return 'Deep-discharged lithium-ion units: do not charge. Keep them in the quarantine area, apart from combustible material, and handle them per the site procedure and local regulations.';
	}
	// A rejected lot is never released; only a lot on hold waits for quality's decision.
	const use =
		tag.status === 'rejected'
			? 'Rejected: do not use, ship or rework this lot. It stays here until it is returned or disposed of as recorded.'
			: 'Do not use, ship or rework this lot until quality releases it.';
	return `${use} Handle swollen or damaged units per the site procedure and local regulations.`;
}

/** A printable quarantine tag for the lot, with a QR code that opens its record. */
export async function renderQuarantineTag(tag: TagData): Promise<Uint8Array> {
	const doc = await PDFDocument.create();
	doc.setTitle(`${TAG_TITLES[tag.status]} — lot ${tag.lot_code}`);
	doc.setAuthor('Restvolt');
	doc.setSubject(`Quarantine tag for lot ${tag.lot_code} (PO ${tag.po_number})`);
	doc.setCreator('Restvolt');
	doc.setProducer('Restvolt');
	const fonts = await embedFonts(doc);
	const page = doc.addPage(A6_LANDSCAPE);
	drawBand(page, fonts, tag);
	drawDetails(page, fonts, tag);
	drawCode(page, fonts, tag);
	drawCaution(page, fonts, tag);
	return doc.save();
}

function drawBand(page: PDFPage, fonts: FontSet, tag: TagData): void {
	const [width, height] = A6_LANDSCAPE;
	const tone = tag.status === 'rejected' ? palette.reject : palette.hold;
	page.drawRectangle({ x: 0, y: height - BAND, width, height: BAND, color: tone });
	statusShape(page, LOT_STATUS[tag.status].shape, EDGE + 10, height - BAND / 2, 10, palette.white, tone);
	const title = fitText(fonts, TAG_TITLES[tag.status], 19, width - 2 * EDGE - 34);
	drawText(page, fonts, title, EDGE + 30, height - BAND / 2 - 7, { size: 19, color: palette.white, strong: true });
}

function drawDetails(page: PDFPage, fonts: FontSet, tag: TagData): void {
	const [width, height] = A6_LANDSCAPE;
	const columnWidth = width - 2 * EDGE - QR_SIDE - 14;
	let top = height - BAND - 12;
	drawText(page, fonts, 'LOT', EDGE, top - 8, { size: 7.5, color: palette.inkSoft });
	drawText(page, fonts, fitText(fonts, tag.lot_code, 20, columnWidth), EDGE, top - 28, { size: 20, color: palette.ink, strong: true });
	top -= 38;
	const pairs: Pair[] = [
		['PO number', tag.po_number],
		['Supplier', tag.supplier],
		['Part', `${tag.part_number} · ${tag.chemistry}`],
		['Quantity', quantity(tag.quantity)],
		['Tagged on', tag.date]
	];
	top -= drawPairs(page, fonts, pairs, EDGE, top, columnWidth);
	drawText(page, fonts, 'Reason', EDGE, top - 9, { size: 8, color: palette.inkSoft });
	const indent = labelWidthFor(columnWidth);
	const reason = firstLines(fonts, tag.reason, 9, columnWidth - indent, 4);
	reason.forEach((line, i) => drawText(page, fonts, line, EDGE + indent, top - 9 - i * 11, { size: 9, color: palette.ink }));
}

/** At most `count` wrapped lines; a cut reason ends with an ellipsis so the reader knows to look it up. */
function firstLines(fonts: FontSet, text: string, size: number, width: number, count: number): string[] {
	const lines = wrapText(fonts, text, size, width);
	if (lines.length <= count) return lines;
	const kept = lines.slice(0, count);
	kept[count - 1] = fitText(fonts, `${kept[count - 1]}…`, size, width);
	return kept;
}

function drawCode(page: PDFPage, fonts: FontSet, tag: TagData): void {
	const [width, height] = A6_LANDSCAPE;
	const x = width - EDGE - QR_SIDE;
	const y = height - BAND - 10 - QR_SIDE;
	drawQr(page, tag.url, x, y, QR_SIDE, palette.ink, palette.white);
	drawTextRight(page, fonts, 'scan for the lot record', width - EDGE - 6, y - 8, { size: 7, color: palette.inkSoft });
}

function drawCaution(page: PDFPage, fonts: FontSet, tag: TagData): void {
	const [width] = A6_LANDSCAPE;
	const lines = wrapText(fonts, tagCaution(tag), 8.5, width - 2 * EDGE - 36).slice(0, 4);
	const boxHeight = Math.max(34, lines.length * 10.5 + 16);
	page.drawRectangle({
		x: EDGE,
		y: EDGE,
		width: width - 2 * EDGE,
		height: boxHeight,
		color: palette.holdMist,
		borderColor: palette.hold,
		borderWidth: 0.8
	});
	triangle(page, EDGE + 14, EDGE + boxHeight - 16, 8, palette.hold);
	drawText(page, fonts, '!', EDGE + 12.6, EDGE + boxHeight - 20.5, { size: 9, color: palette.white, strong: true });
	lines.forEach((line, i) => drawText(page, fonts, line, EDGE + 30, EDGE + boxHeight - 14 - i * 10.5, { size: 8.5, color: palette.ink }));
	drawTextRight(page, fonts, 'Restvolt quarantine tag', width - EDGE, 7, { size: 6.5, color: palette.inkSoft });
}
