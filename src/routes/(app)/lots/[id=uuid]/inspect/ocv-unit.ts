// Which unit a meter file's OCV column is in, from its header and its values: a column headed "mV",
// or whose values fit the part only when read as millivolts (3652 for a 3.00–4.18 V cell), is mV.
// The window is the entry guard's plausible one (src/lib/inspection/entry-guard.ts).
import { median } from '$lib/inspection';
import { plausibleWindow, type GuardPart } from '$lib/inspection/entry-guard';

export interface OcvUnitGuess {
	unit: 'V' | 'mV';
	/** Why, in a sentence for the inspector; null when nothing pointed either way. */
	why: string | null;
}

const cellNumber = (text: string | undefined) =>
	text === undefined || text.trim() === '' ? Number.NaN : Number(text.trim().replace(',', '.'));

export function guessOcvUnit(header: string, cells: ReadonlyArray<string | undefined>, part: GuardPart): OcvUnitGuess {
	if (/m\s*v\b|millivolt/i.test(header)) return { unit: 'mV', why: `The OCV column’s header “${header}” says millivolts.` };
	const values = cells.map(cellNumber).filter(Number.isFinite);
	if (values.length === 0) return { unit: 'V', why: null };
	const typical = median(values);
	const w = plausibleWindow(part);
	const fits = (v: number) => v >= w.plausible_low_v && v <= w.plausible_high_v;
	if (!fits(typical) && fits(typical / 1000)) {
		return {
			unit: 'mV',
			why: `The OCV column holds values like ${typical}, which fit this part (${w.window_low_v.toFixed(2)}–${w.window_high_v.toFixed(2)} V) only as millivolts, so they are read as mV.`
		};
	}
	return { unit: 'V', why: null };
}
