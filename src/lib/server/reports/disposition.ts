import { MARGIN, CONTENT_WIDTH, type Cursor } from './layout';
import { palette } from './palette';
import { statusShape } from './shapes';
import { drawText, textWidth, wrapText } from './text';
import { REASON_SEVERITY, VERDICT } from '$lib/status';
import type { ReportData, ReportReason } from './types';

const TONE = {
	accept: { ink: palette.accept, mist: palette.tealMist },
	hold: { ink: palette.hold, mist: palette.holdMist },
	reject: { ink: palette.reject, mist: palette.rejectMist },
	pending: { ink: palette.pending, mist: palette.tealMist }
} as const;

/** What a status word means for the person holding the lot. */
const STATUS_HINTS = {
	accept: 'Lot released to stock.',
	hold: 'Lot held for review by quality; keep it apart from released stock.',
	reject: 'Lot rejected; keep it in quarantine until it is returned or disposed of.',
	pending: 'Inspection not finished; no disposition yet.'
} as const;

/** The disposition in large words with its shape, then the reasons, each labelled by severity. */
export function drawDisposition(cursor: Cursor, data: ReportData): void {
	const { status, safety, reasons, nonconforming } = data.disposition;
	const tone = TONE[status];
	const height = 62;
	cursor.ensure(height + 20);
	const { page, fonts } = cursor;
	const top = cursor.y;
	page.drawRectangle({ x: MARGIN, y: top - height, width: CONTENT_WIDTH, height, color: tone.mist });
	page.drawRectangle({ x: MARGIN, y: top - height, width: 5, height, color: tone.ink });
	statusShape(page, VERDICT[status].shape, MARGIN + 28, top - 28, 11, tone.ink, tone.mist);
	drawText(page, fonts, 'DISPOSITION', MARGIN + 50, top - 14, { size: 7.5, color: palette.inkSoft });
	const word = VERDICT[status].word.toUpperCase();
	const wordWidth = drawText(page, fonts, word, MARGIN + 50, top - 42, { size: 28, color: tone.ink, strong: true });
	if (safety) drawSafetyBadge(cursor, MARGIN + 50 + wordWidth + 14, top - 40);
	drawText(page, fonts, STATUS_HINTS[status], MARGIN + 50, top - 55, { size: 8, color: palette.ink });
	const count = `${nonconforming} nonconforming unit${nonconforming === 1 ? '' : 's'}`;
	drawText(page, fonts, count, MARGIN + CONTENT_WIDTH - 10 - textWidth(fonts, count, 9), top - 14, { size: 9, color: palette.ink });
	cursor.gap(height + 10);
	drawReasons(cursor, reasons);
}

function drawSafetyBadge(cursor: Cursor, x: number, baseline: number): void {
	const label = 'SAFETY';
	const width = textWidth(cursor.fonts, label, 9) + 12;
	cursor.page.drawRectangle({ x, y: baseline - 4, width, height: 16, borderColor: palette.reject, borderWidth: 1.2 });
	drawText(cursor.page, cursor.fonts, label, x + 6, baseline + 1, { size: 9, color: palette.reject, strong: true });
}

function drawReasons(cursor: Cursor, reasons: ReportReason[]): void {
	if (reasons.length === 0) {
		drawText(cursor.page, cursor.fonts, 'No reasons recorded.', MARGIN, cursor.y - 9, { size: 9, color: palette.inkSoft });
		cursor.gap(16);
		return;
	}
	for (const reason of reasons) drawReason(cursor, reason);
	cursor.gap(4);
}

function drawReason(cursor: Cursor, reason: ReportReason): void {
	const tagWidth = 46;
	const units = reason.units?.length ? ` Units: ${reason.units.join(', ')}.` : '';
	const lines = wrapText(cursor.fonts, `${reason.message}${units}`, 9, CONTENT_WIDTH - tagWidth);
	const codeLine = `code ${reason.code}`;
	cursor.ensure(lines.length * 12 + 12);
	const style = { size: 7.5, color: reason.severity === 'info' ? palette.inkSoft : TONE[reason.severity].ink, strong: true };
	drawText(cursor.page, cursor.fonts, REASON_SEVERITY[reason.severity].word.toUpperCase(), MARGIN, cursor.y - 9, style);
	lines.forEach((line, i) =>
		drawText(cursor.page, cursor.fonts, line, MARGIN + tagWidth, cursor.y - 9 - i * 12, { size: 9, color: palette.ink })
	);
	cursor.gap(lines.length * 12);
	drawText(cursor.page, cursor.fonts, codeLine, MARGIN + tagWidth, cursor.y - 7, { size: 7, color: palette.inkSoft });
	cursor.gap(13);
}
