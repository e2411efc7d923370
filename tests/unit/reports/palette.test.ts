import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { colors } from '$lib/components/charts/palette';
import { THEME_HEX, palette, xlsxColour } from '../../../src/lib/server/reports/palette';

// Colours have one home, Tailwind's @theme in src/app.css; documents that cannot read CSS copy the hex
// values, and these checks keep the copies equal. No outside source applies.

/** The `--color-*` variables of the @theme blocks in src/app.css (only the `static` ones, which Tailwind always emits, when asked). */
function themeColours(onlyStatic = false): Map<string, string> {
	const css = readFileSync(join(__dirname, '../../../src/app.css'), 'utf8');
	const found = new Map<string, string>();
	for (const block of css.matchAll(onlyStatic ? /@theme\s+static\s*\{([^}]*)\}/g : /@theme[^{]*\{([^}]*)\}/g)) {
		for (const [, name, value] of block[1].matchAll(/--color-([a-z0-9-]+)\s*:\s*([^;]+);/g)) found.set(name, value.trim().toLowerCase());
	}
	return found;
}

const hexOf = ({ red, green, blue }: { red: number; green: number; blue: number }) =>
	`#${[red, green, blue]
		.map((c) =>
			Math.round(c * 255)
				.toString(16)
				.padStart(2, '0')
		)
		.join('')}`;

describe('one palette for the web and the documents', () => {
	const theme = themeColours();

	it('reads the tokens from src/app.css', () => {
		expect(theme.get('status-accept')).toMatch(/^#[0-9a-f]{6}$/);
		expect(theme.size).toBeGreaterThan(15);
	});

	it.each(Object.entries(THEME_HEX))('gives %s the same hex in PDFs as on the web', (name, hex) => {
		expect(theme.get(name)).toBe(hex);
	});

	it('draws the PDF status and ink colours from those values', () => {
		expect(hexOf(palette.ink)).toBe(theme.get('ink'));
		expect(hexOf(palette.inkSoft)).toBe(theme.get('ink-soft'));
		expect(hexOf(palette.accept)).toBe(theme.get('status-accept'));
		expect(hexOf(palette.hold)).toBe(theme.get('status-hold'));
		expect(hexOf(palette.reject)).toBe(theme.get('status-reject'));
		expect(hexOf(palette.pending)).toBe(theme.get('status-pending'));
		expect(`#${xlsxColour('volt-700')}`).toBe(theme.get('volt-700'));
	});

	it('keeps the faint reject wash a pale tint of the reject colour', () => {
		const wash = palette.rejectMist;
		expect(Math.min(wash.red, wash.green, wash.blue)).toBeGreaterThan(0.9);
		expect(wash.red).toBeGreaterThan(wash.green); // still reads as the reject hue
	});

	it('lets the charts use only variables that the theme always emits', () => {
		const emitted = themeColours(true);
		const used = Object.values(colors).flatMap((value) => [...value.matchAll(/var\(--color-([a-z0-9-]+)/g)].map((m) => m[1]));
		expect(used.length).toBeGreaterThan(5);
		for (const name of used) expect(emitted.has(name), name).toBe(true);
	});
});
