import { readFile } from 'node:fs/promises';
import { join } from 'node:path';
import fontkit from '@pdf-lib/fontkit';
import type { PDFDocument, PDFFont } from 'pdf-lib';

/** Roboto Flex ships split by script; Latin carries almost everything, Greek adds σ and Ω. */
export interface FontSet {
	latin: PDFFont;
	greek: PDFFont;
	/** Which embedded face can draw this code point, or null when neither can. */
	faceFor(codePoint: number): 'latin' | 'greek' | null;
}

interface GlyphSource {
	hasGlyphForCodePoint(codePoint: number): boolean;
}

const FONT_DIR = ['node_modules', '@fontsource', 'roboto-flex', 'files'];

/** The app always runs from the project root (dev, tests and `node build`), so resolve fonts from there. */
function fontPath(script: 'latin' | 'greek'): string {
	return join(process.cwd(), ...FONT_DIR, `roboto-flex-${script}-400-normal.woff`);
}

export async function embedFonts(doc: PDFDocument): Promise<FontSet> {
	doc.registerFontkit(fontkit);
	const [latinBytes, greekBytes] = await Promise.all([readFile(fontPath('latin')), readFile(fontPath('greek'))]);
	const latin = await doc.embedFont(latinBytes, { subset: true });
	const greek = await doc.embedFont(greekBytes, { subset: true });
	const latinGlyphs = fontkit.create(latinBytes) as unknown as GlyphSource;
	const greekGlyphs = fontkit.create(greekBytes) as unknown as GlyphSource;
	return {
		latin,
		greek,
		faceFor(codePoint) {
			if (latinGlyphs.hasGlyphForCodePoint(codePoint)) return 'latin';
			if (greekGlyphs.hasGlyphForCodePoint(codePoint)) return 'greek';
			return null;
		}
	};
}
