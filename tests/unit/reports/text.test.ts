import { PDFDocument } from 'pdf-lib';
import { describe, expect, it } from 'vitest';
import { embedFonts } from '../../../src/lib/server/reports/fonts';
import { fitText, runsOf, textWidth, wrapText } from '../../../src/lib/server/reports/text';
import { millivolts, volts } from '$lib/format';

// Layout helpers checked against their own contract on invented text; no outside source applies.
async function fonts() {
	return embedFonts(await PDFDocument.create());
}

describe('text layout', () => {
	it('wraps without exceeding the width and without losing or reordering words', async () => {
		const set = await fonts();
		const text = 'Deep-discharged units must stay in quarantine; a supercalifragilisticexpialidociousserialnumber breaks too.';
		const lines = wrapText(set, text, 9, 90);
		expect(lines.length).toBeGreaterThan(2);
		for (const line of lines) expect(textWidth(set, line, 9)).toBeLessThanOrEqual(90);
		expect(lines.join('').replace(/\s/g, '')).toBe(text.replace(/\s/g, ''));
	});

	it('uses the Greek face for σ and Ω, and a readable fallback for characters neither face has', async () => {
		const set = await fonts();
		expect(runsOf(set, 'SOC ± σ').map((r) => r.face)).toEqual(['latin', 'greek']);
		expect(runsOf(set, '12 mΩ').at(-1)).toEqual({ text: 'Ω', face: 'greek' });
		expect(runsOf(set, 'SOC ≤ 30 %')).toEqual([{ text: 'SOC <= 30 %', face: 'latin' }]);
	});

	it('shortens a cell with an ellipsis only when it does not fit', async () => {
		const set = await fonts();
		expect(fitText(set, 'OCW-0240000', 7.5, 200)).toBe('OCW-0240000');
		const cut = fitText(set, 'below minimum voltage, do not charge', 7.5, 60);
		expect(cut.endsWith('…')).toBe(true);
		expect(textWidth(set, cut, 7.5)).toBeLessThanOrEqual(60);
	});
});

describe('numbers from $lib/format in documents', () => {
	it('draws the true minus sign and the no-break space with the Latin face', async () => {
		const set = await fonts();
		expect(runsOf(set, millivolts(-0.0123))).toEqual([{ text: '\u221212.3\u00a0mV', face: 'latin' }]);
	});

	it('never wraps between a number and its unit', async () => {
		const set = await fonts();
		const text = `window max ${volts(4.2)} and window min ${volts(2.5)}`;
		const width = textWidth(set, 'window max 4.200', 9);
		const lines = wrapText(set, text, 9, width);
		expect(lines.length).toBeGreaterThan(1);
		for (const line of lines) expect(line).not.toMatch(/^V\b|\d$/);
	});
});
