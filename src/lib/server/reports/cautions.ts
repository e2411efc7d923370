import { paragraph } from './blocks';
import { MARGIN, CONTENT_WIDTH, sectionTitle, type Cursor } from './layout';
import { palette } from './palette';
import { triangle } from './shapes';
import { drawText, wrapText } from './text';
import { AIR_LITHIUM_ION_SOC_LIMIT } from '$lib/schemas/lot';
import type { ReportData } from './types';

function cautionTexts(data: ReportData): string[] {
	const texts = [
		'Deep-discharged, swollen, damaged or leaking units: move them to the quarantine area, do not charge them, and keep them apart from combustible material. Handle them per your site procedure and local regulations.',
		'A lithium-ion cell that has rested below its minimum voltage may have internal damage; recharging it can lead to heating. Treat it as a safety reject, not as a unit to recover.'
	];
	const air = data.lot.transport === 'air';
	// The 30 % SOC ceiling for lithium-ion cells/batteries packed alone (UN 3480): IATA DGR Packing Instruction 965 (from memory).
	const declaredTooHigh = data.lot.declared_soc !== null && data.lot.declared_soc > AIR_LITHIUM_ION_SOC_LIMIT;
	texts.push(
		`${air ? 'This lot travels by air. ' : ''}Lithium-ion cells and batteries shipped by air packed on their own must be at no more than 30 % SOC${declaredTooHigh && air ? '; the declared SOC of this lot is above that' : ''}. Check the current dangerous-goods regulations before any shipment or return.`
	);
	return texts;
}

/** Calm, specific cautions at the end; each points to the site procedure and the current rules. */
export function drawCautions(cursor: Cursor, data: ReportData): void {
	sectionTitle(cursor, 'Safety cautions', 60);
	for (const text of cautionTexts(data)) {
		const lines = wrapText(cursor.fonts, text, 9, CONTENT_WIDTH - 18);
		cursor.ensure(Math.min(lines.length, 3) * 12 + 6);
		triangle(cursor.page, MARGIN + 5, cursor.y - 6, 4.5, palette.hold);
		drawText(cursor.page, cursor.fonts, '!', MARGIN + 4.1, cursor.y - 8.3, { size: 6, color: palette.white });
		paragraph(cursor, text, { size: 9, color: palette.ink }, 18, 12);
		cursor.gap(5);
	}
}
