import { pushGraphicsState, popGraphicsState, setTextRenderingMode, TextRenderingMode, setLineWidth, setStrokingRgbColor } from 'pdf-lib';
import type { PDFPage, RGB } from 'pdf-lib';
import type { FontSet } from './fonts';

export interface TextStyle {
	size: number;
	color: RGB;
	/** The shipped face has one weight; "strong" strokes the outline to thicken it. */
	strong?: boolean;
}

interface Run {
	text: string;
	face: 'latin' | 'greek';
}

/** Characters neither face has, replaced by readable ASCII instead of an empty box. */
const FALLBACKS: Record<string, string> = { '≤': '<=', '≥': '>=', '→': '->', '≈': '~', '\t': ' ' };

/** Splits text into runs that one face can draw; unknown characters become a fallback or '?'. */
export function runsOf(fonts: FontSet, text: string): Run[] {
	const runs: Run[] = [];
	for (const ch of text.replace(/[\r\n]+/g, ' ')) {
		const face = fonts.faceFor(ch.codePointAt(0) ?? 63);
		const drawn = face ? ch : (FALLBACKS[ch] ?? '?');
		const drawnFace = face ?? 'latin';
		const last = runs.at(-1);
		if (last && last.face === drawnFace) last.text += drawn;
		else runs.push({ text: drawn, face: drawnFace });
	}
	return runs;
}

export function textWidth(fonts: FontSet, text: string, size: number): number {
	return runsOf(fonts, text).reduce((sum, run) => sum + fonts[run.face].widthOfTextAtSize(run.text, size), 0);
}

/** Draws one line at (x, baseline y), switching faces per run. Returns the drawn width. */
export function drawText(page: PDFPage, fonts: FontSet, text: string, x: number, y: number, style: TextStyle): number {
	if (style.strong) {
		const { red, green, blue } = style.color;
		page.pushOperators(
			pushGraphicsState(),
			setTextRenderingMode(TextRenderingMode.FillAndOutline),
			setLineWidth(style.size * 0.035),
			setStrokingRgbColor(red, green, blue)
		);
	}
	let cursor = x;
	for (const run of runsOf(fonts, text)) {
		const font = fonts[run.face];
		page.drawText(run.text, { x: cursor, y, size: style.size, font, color: style.color });
		cursor += font.widthOfTextAtSize(run.text, style.size);
	}
	if (style.strong) page.pushOperators(popGraphicsState());
	return cursor - x;
}

export function drawTextRight(page: PDFPage, fonts: FontSet, text: string, right: number, y: number, style: TextStyle): void {
	drawText(page, fonts, text, right - textWidth(fonts, text, style.size), y, style);
}

/** Greedy word wrap at spaces (never at the no-break space between a number and its unit); a word longer than the line is broken between characters. */
export function wrapText(fonts: FontSet, text: string, size: number, maxWidth: number): string[] {
	const lines: string[] = [];
	let line = '';
	for (const word of text.split(/[^\S\u00a0]+/).filter(Boolean)) {
		const candidate = line ? `${line} ${word}` : word;
		if (textWidth(fonts, candidate, size) <= maxWidth) {
			line = candidate;
			continue;
		}
		if (line) lines.push(line);
		line = '';
		for (const piece of breakWord(fonts, word, size, maxWidth)) {
			if (line) lines.push(line);
			line = piece;
		}
	}
	if (line) lines.push(line);
	return lines;
}

function breakWord(fonts: FontSet, word: string, size: number, maxWidth: number): string[] {
	const pieces: string[] = [];
	let piece = '';
	for (const ch of word) {
		if (piece && textWidth(fonts, piece + ch, size) > maxWidth) {
			pieces.push(piece);
			piece = '';
		}
		piece += ch;
	}
	if (piece) pieces.push(piece);
	return pieces;
}

/** Shortens text to fit a table cell, ending with an ellipsis when cut. */
export function fitText(fonts: FontSet, text: string, size: number, maxWidth: number): string {
	if (textWidth(fonts, text, size) <= maxWidth) return text;
	let kept = [...text];
	while (kept.length > 0 && textWidth(fonts, `${kept.join('')}…`, size) > maxWidth) kept = kept.slice(0, -1);
	return `${kept.join('')}…`;
}
