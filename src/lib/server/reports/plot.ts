import type { PDFPage } from 'pdf-lib';
import type { FontSet } from './fonts';
import { fixed, volts } from '$lib/format';
import { linearAxis, indexAxis, type Axis } from './plot-scale';
import { palette } from './palette';
import { cross, dot } from './shapes';
import { drawText, drawTextRight, textWidth } from './text';
import type { ReportData } from './types';

export interface PlotBox {
	x: number;
	y: number; // bottom of the whole figure, legend included
	width: number;
	height: number;
}

const LEFT_GUTTER = 40;
const BOTTOM_GUTTER = 40;
const LEGEND_HEIGHT = 14;
const TICK = { size: 7, color: palette.inkSoft };

/** Strip plot: each unit's cell OCV at 25 °C against its index, with the part window and the expected OCV. */
export function drawOcvPlot(page: PDFPage, fonts: FontSet, box: PlotBox, data: ReportData): void {
	const frame = {
		left: box.x + LEFT_GUTTER,
		right: box.x + box.width - 4,
		bottom: box.y + BOTTOM_GUTTER,
		top: box.y + box.height - 14
	};
	const { limits, units } = data;
	const guideValues = [limits.ocv_min_v, limits.ocv_max_v, limits.expected_ocv_v ?? Number.NaN];
	const yAxis = linearAxis([...units.map((u) => u.ocv_at_25c_v), ...guideValues], [frame.bottom, frame.top], 6);
	const xAxis = indexAxis(units.length, [frame.left, frame.right]);

	drawWindowBand(page, frame, yAxis, limits.ocv_min_v, limits.ocv_max_v);
	drawGrid(page, fonts, frame, xAxis, yAxis);
	drawGuides(page, fonts, frame, yAxis, data);
	if (units.length === 0) {
		drawText(page, fonts, 'No readings recorded yet', frame.left + 10, (frame.top + frame.bottom) / 2, { size: 9, color: palette.inkSoft });
	}
	units.forEach((unit, i) => {
		const x = xAxis.toPage(i + 1);
		const y = yAxis.toPage(unit.ocv_at_25c_v);
		if (unit.nonconforming) cross(page, x, y, 2.6, palette.reject, 1.1);
		else dot(page, x, y, 1.7, palette.teal);
	});
	page.drawRectangle({
		x: frame.left,
		y: frame.bottom,
		width: frame.right - frame.left,
		height: frame.top - frame.bottom,
		borderColor: palette.inkSoft,
		borderWidth: 0.6
	});
	drawAxisTitles(page, fonts, frame);
	drawLegend(page, fonts, box.x + LEFT_GUTTER, box.y + 2);
}

type Frame = { left: number; right: number; bottom: number; top: number };

function drawWindowBand(page: PDFPage, frame: Frame, yAxis: Axis, min: number, max: number): void {
	const low = Math.max(frame.bottom, yAxis.toPage(min));
	const high = Math.min(frame.top, yAxis.toPage(max));
	if (high > low)
		page.drawRectangle({ x: frame.left, y: low, width: frame.right - frame.left, height: high - low, color: palette.tealMist });
}

function drawGrid(page: PDFPage, fonts: FontSet, frame: Frame, xAxis: Axis, yAxis: Axis): void {
	for (const tick of yAxis.ticks) {
		const y = yAxis.toPage(tick);
		page.drawLine({ start: { x: frame.left, y }, end: { x: frame.right, y }, thickness: 0.3, color: palette.rule });
		page.drawLine({ start: { x: frame.left - 3, y }, end: { x: frame.left, y }, thickness: 0.6, color: palette.inkSoft });
		drawTextRight(page, fonts, fixed(tick, yAxis.decimals), frame.left - 5, y - 2.5, TICK);
	}
	for (const tick of xAxis.ticks) {
		const x = xAxis.toPage(tick);
		page.drawLine({ start: { x, y: frame.bottom - 3 }, end: { x, y: frame.bottom }, thickness: 0.6, color: palette.inkSoft });
		const label = String(tick);
		drawText(page, fonts, label, x - textWidth(fonts, label, TICK.size) / 2, frame.bottom - 12, TICK);
	}
}

function drawGuides(page: PDFPage, fonts: FontSet, frame: Frame, yAxis: Axis, data: ReportData): void {
	const { ocv_min_v, ocv_max_v, expected_ocv_v } = data.limits;
	// max label above its line and min label below, so a narrow window keeps both readable
	const window: Array<[string, number, 'above' | 'below']> = [
		[`window max ${volts(ocv_max_v)}`, ocv_max_v, 'above'],
		[`window min ${volts(ocv_min_v)}`, ocv_min_v, 'below']
	];
	for (const [label, value, side] of window) {
		const y = yAxis.toPage(value);
		page.drawLine({ start: { x: frame.left, y }, end: { x: frame.right, y }, thickness: 0.9, color: palette.teal, dashArray: [4, 3] });
		const below = side === 'below' && y - 9 > frame.bottom;
		guideLabel(page, fonts, label, frame.left + 4, below ? y - 8 : y + 2.5);
	}
	if (expected_ocv_v !== null && Number.isFinite(expected_ocv_v)) {
		const y = yAxis.toPage(expected_ocv_v);
		page.drawLine({ start: { x: frame.left, y }, end: { x: frame.right, y }, thickness: 1, color: palette.tealDeep });
		const label = `expected ${volts(expected_ocv_v)}`;
		guideLabel(page, fonts, label, frame.right - 4 - textWidth(fonts, label, LABEL.size), y + 2.5);
	}
}

const LABEL = { size: 7, color: palette.tealDeep };

/** Guide labels sit on a paper patch so crossing lines and dots never run through the letters. */
function guideLabel(page: PDFPage, fonts: FontSet, text: string, x: number, baseline: number): void {
	const width = textWidth(fonts, text, LABEL.size);
	page.drawRectangle({ x: x - 1.5, y: baseline - 2, width: width + 3, height: LABEL.size + 2, color: palette.white, opacity: 0.9 });
	drawText(page, fonts, text, x, baseline, LABEL);
}

function drawAxisTitles(page: PDFPage, fonts: FontSet, frame: Frame): void {
	const style = { size: 8, color: palette.ink };
	const xTitle = 'unit index (order measured)';
	drawText(page, fonts, xTitle, (frame.left + frame.right) / 2 - textWidth(fonts, xTitle, 8) / 2, frame.bottom - 24, style);
	drawText(page, fonts, 'cell OCV at 25 °C (V)', frame.left - LEFT_GUTTER + 4, frame.top + 5, style);
}

function drawLegend(page: PDFPage, fonts: FontSet, x: number, y: number): void {
	const style = { size: 7.5, color: palette.ink };
	const mid = y + LEGEND_HEIGHT / 2 - 2;
	let cursor = x;
	dot(page, cursor + 3, mid + 2.5, 1.9, palette.teal);
	cursor += 9 + drawText(page, fonts, 'conforming unit', cursor + 9, mid, style) + 16;
	cross(page, cursor + 3, mid + 2.5, 2.6, palette.reject, 1.1);
	cursor += 9 + drawText(page, fonts, 'nonconforming unit', cursor + 9, mid, style) + 16;
	page.drawLine({
		start: { x: cursor, y: mid + 2.5 },
		end: { x: cursor + 16, y: mid + 2.5 },
		thickness: 0.9,
		color: palette.teal,
		dashArray: [4, 3]
	});
	cursor += 20 + drawText(page, fonts, 'part window', cursor + 20, mid, style) + 16;
	page.drawLine({ start: { x: cursor, y: mid + 2.5 }, end: { x: cursor + 16, y: mid + 2.5 }, thickness: 1, color: palette.tealDeep });
	drawText(page, fonts, 'expected OCV at declared SOC', cursor + 20, mid, style);
}
