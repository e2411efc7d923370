import { PDFDocument } from 'pdf-lib';
import { drawCautions } from './cautions';
import { drawDisposition } from './disposition';
import { embedFonts } from './fonts';
import { dateTime } from '$lib/format';
import { CONTENT_WIDTH, Cursor, MARGIN, drawFooters, sectionTitle } from './layout';
import { palette } from './palette';
import { drawOcvPlot } from './plot';
import { drawReadingsTable } from './readings-table';
import { drawSignature } from './signature';
import { drawLotSection, drawModelSection, drawPlanSection, drawStatsSection } from './sections';
import { drawText, fitText } from './text';
import type { ReportData } from './types';

/** The plot shrinks to use what is left of a page rather than leave a blank half page. */
const PLOT_HEIGHT = { min: 160, max: 220 };

/** Builds the lot's inspection report as an A4 PDF with the shipped Roboto Flex embedded. */
export async function renderInspectionReport(data: ReportData): Promise<Uint8Array> {
	const doc = await PDFDocument.create();
	setMetadata(doc, data);
	const fonts = await embedFonts(doc);
	const cursor = new Cursor(doc, fonts, `Incoming inspection report · lot ${data.lot.lot_code}`);

	drawTitle(cursor, data);
	drawDisposition(cursor, data);
	drawSignature(cursor, data);
	drawLotSection(cursor, data);
	drawPlanSection(cursor, data);
	drawStatsSection(cursor, data);
	drawPlotSection(cursor, data);
	sectionTitle(cursor, `Readings (${data.units.length} units)`, 60);
	drawReadingsTable(cursor, data.units);
	drawModelSection(cursor, data);
	drawCautions(cursor, data);

	drawFooters(doc, fonts, `Restvolt · lot ${data.lot.lot_code} · PO ${data.lot.po_number} · generated ${dateTime(data.generated_at)}`);
	return doc.save();
}

function setMetadata(doc: PDFDocument, data: ReportData): void {
	doc.setTitle(`Restvolt inspection report — lot ${data.lot.lot_code}`);
	doc.setAuthor('Restvolt');
	doc.setSubject(`Incoming inspection of lot ${data.lot.lot_code} (PO ${data.lot.po_number}) from ${data.supplier.name}`);
	doc.setKeywords(['Restvolt', 'incoming inspection', data.lot.lot_code, data.part.part_number]);
	doc.setCreator('Restvolt');
	doc.setProducer('Restvolt');
	doc.setLanguage('en');
	const generated = new Date(data.generated_at);
	if (!Number.isNaN(generated.getTime())) {
		doc.setCreationDate(generated);
		doc.setModificationDate(generated);
	}
}

function drawTitle(cursor: Cursor, data: ReportData): void {
	const { page, fonts } = cursor;
	drawText(page, fonts, fitText(fonts, `Lot ${data.lot.lot_code}`, 20, CONTENT_WIDTH), MARGIN, cursor.y - 18, {
		size: 20,
		color: palette.ink,
		strong: true
	});
	const subtitle = `${data.supplier.name} · ${data.part.part_number} · PO ${data.lot.po_number} · prepared for ${data.company.name}`;
	drawText(page, fonts, fitText(fonts, subtitle, 9, CONTENT_WIDTH), MARGIN, cursor.y - 33, { size: 9, color: palette.inkSoft });
	cursor.gap(46);
}

function drawPlotSection(cursor: Cursor, data: ReportData): void {
	sectionTitle(cursor, 'Cell OCV against the part window', PLOT_HEIGHT.min);
	const height = Math.min(PLOT_HEIGHT.max, cursor.room - 4);
	drawOcvPlot(cursor.page, cursor.fonts, { x: MARGIN, y: cursor.y - height, width: CONTENT_WIDTH, height }, data);
	cursor.gap(height + 10);
}
