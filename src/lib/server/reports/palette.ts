import { rgb } from 'pdf-lib';

/** Restvolt's document palette: deep teal and ink, with muted status tones (always paired with a word and a shape). */
export const palette = {
	ink: rgb(0.063, 0.141, 0.169),
	inkSoft: rgb(0.302, 0.373, 0.400),
	rule: rgb(0.780, 0.827, 0.835),
	teal: rgb(0.047, 0.318, 0.337),
	tealDeep: rgb(0.031, 0.200, 0.220),
	tealMist: rgb(0.906, 0.949, 0.945),
	white: rgb(1, 1, 1),
	accept: rgb(0.137, 0.459, 0.337),
	hold: rgb(0.576, 0.392, 0.020),
	reject: rgb(0.624, 0.165, 0.141),
	pending: rgb(0.337, 0.396, 0.420),
	rejectMist: rgb(0.984, 0.925, 0.918),
	holdMist: rgb(0.992, 0.957, 0.886)
} as const;
