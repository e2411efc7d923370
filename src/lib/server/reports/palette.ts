import { rgb, type RGB } from 'pdf-lib';

/**
 * The web's design tokens (Tailwind's @theme in src/app.css, named as there without `--color-`) as
 * hex, for what cannot read CSS: PDFs, XLSX styles and the HTML of e-mails.
 * tests/unit/reports/palette.test.ts checks every entry against src/app.css.
 */
export const THEME_HEX = {
	ink: '#1c2430',
	'ink-soft': '#3d4756',
	line: '#d9d4c7',
	'volt-50': '#eefaf8',
	'volt-700': '#0d5f59',
	'volt-900': '#0a3b38',
	'amp-100': '#fdf0d5',
	'status-accept': '#2e7d32',
	'status-hold': '#b54708',
	'status-reject': '#b42318',
	'status-pending': '#475467'
} as const;

function fromHex(hex: string): RGB {
	const channel = (at: number) => parseInt(hex.slice(at, at + 2), 16) / 255;
	return rgb(channel(1), channel(3), channel(5));
}

/** A pale wash of a colour over white, as the web's faint status backgrounds (bg-status-reject/5) lie on a white panel. */
function wash(hex: string, strength: number): RGB {
	const { red, green, blue } = fromHex(hex);
	const mix = (c: number) => 1 - strength + strength * c;
	return rgb(mix(red), mix(green), mix(blue));
}

/** Restvolt's document palette: teal and ink, and the status tones (always paired with a word and a shape). */
export const palette = {
	ink: fromHex(THEME_HEX.ink),
	inkSoft: fromHex(THEME_HEX['ink-soft']),
	rule: fromHex(THEME_HEX.line),
	teal: fromHex(THEME_HEX['volt-700']),
	tealDeep: fromHex(THEME_HEX['volt-900']),
	tealMist: fromHex(THEME_HEX['volt-50']),
	white: rgb(1, 1, 1),
	accept: fromHex(THEME_HEX['status-accept']),
	hold: fromHex(THEME_HEX['status-hold']),
	reject: fromHex(THEME_HEX['status-reject']),
	pending: fromHex(THEME_HEX['status-pending']),
	rejectMist: wash(THEME_HEX['status-reject'], 0.08),
	holdMist: fromHex(THEME_HEX['amp-100'])
} as const;

/** XLSX styles take hex without the hash. */
export const xlsxColour = (name: keyof typeof THEME_HEX) => THEME_HEX[name].slice(1);
