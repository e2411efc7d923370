/**
 * The entry guard: an OCV far outside the part's window is almost always a typing slip (36.5 for
 * 3.65, millivolts typed into the volts field, a cell value typed where the pack value belongs).
 * The server refuses such a value unless the inspector confirms it; the bench asks first and offers
 * the likely slip. One pure function serves both, so they never disagree.
 */

/** The part's acceptance window per cell and its cells in series (1 for a single cell). */
export interface GuardPart {
	ocv_min_cell_v: number;
	ocv_max_cell_v: number;
	cells_in_series: number;
}

/**
 * How far past the window a value stays plausible (Restvolt's choice, not a standard). Above: the
 * window's upper limit + 25 % of it (4.20 V → 5.25 V), beyond any charger's end voltage. Below: half
 * the window's lower limit (3.00 V → 1.50 V), so a deeply discharged unit (a real finding, typically
 * 0.4 V under the chemistry's minimum) is stored without a question while a decimal shift (×10, ÷10)
 * or millivolts typed as volts always lands outside.
 */
export const PLAUSIBLE_MARGIN_ABOVE = 0.25;
export const PLAUSIBLE_FRACTION_BELOW = 0.5;

export type SlipKind = 'decimal_shift' | 'millivolts' | 'cell_for_pack';

export interface PlausibleWindow {
	/** The acceptance window for the value as typed (per pack for a pack part), V. */
	window_low_v: number;
	window_high_v: number;
	/** The window widened by the margin: values outside it need a confirmation. */
	plausible_low_v: number;
	plausible_high_v: number;
}

export interface GuardVerdict {
	plausible: boolean;
	/** The likely intended value, when exactly one reading of the slip lands in the window. */
	suggestion: { value_v: number; slip: SlipKind } | null;
}

export function plausibleWindow(part: GuardPart): PlausibleWindow {
	const n = part.cells_in_series;
	return {
		window_low_v: part.ocv_min_cell_v * n,
		window_high_v: part.ocv_max_cell_v * n,
		plausible_low_v: PLAUSIBLE_FRACTION_BELOW * part.ocv_min_cell_v * n,
		plausible_high_v: (1 + PLAUSIBLE_MARGIN_ABOVE) * part.ocv_max_cell_v * n
	};
}

/** Readings of a slip, in the order the bench offers them. */
function candidates(value: number, part: GuardPart): Array<{ value_v: number; slip: SlipKind }> {
	// For a pack, a cell's voltage is the likelier slip than a decimal shift landing on the same value.
	const list: Array<{ value_v: number; slip: SlipKind }> =
		part.cells_in_series > 1 ? [{ value_v: value * part.cells_in_series, slip: 'cell_for_pack' }] : [];
	list.push(
		{ value_v: value / 1000, slip: 'millivolts' },
		{ value_v: value / 10, slip: 'decimal_shift' },
		{ value_v: value / 100, slip: 'decimal_shift' },
		{ value_v: value * 10, slip: 'decimal_shift' },
		{ value_v: value * 100, slip: 'decimal_shift' }
	);
	// Rounded to the meter's 0.1 mV so that 36.5 / 10 reads 3.65, not 3.6500000000000004.
	return list.map((c) => ({ ...c, value_v: Math.round(c.value_v * 10_000) / 10_000 }));
}

/** Is the typed OCV plausible for the part, and if not, which slip most likely produced it? */
export function guardOcv(value: number, part: GuardPart): GuardVerdict {
	const w = plausibleWindow(part);
	if (value >= w.plausible_low_v && value <= w.plausible_high_v) return { plausible: true, suggestion: null };
	const inWindow = candidates(value, part).filter((c) => c.value_v >= w.window_low_v && c.value_v <= w.window_high_v);
	return { plausible: false, suggestion: inWindow[0] ?? null };
}

const SLIP_WORDS: Record<SlipKind, string> = {
	decimal_shift: 'the decimal point may be in the wrong place',
	millivolts: 'this looks like millivolts typed as volts',
	cell_for_pack: 'this looks like one cell’s voltage where the pack voltage belongs'
};

const v = (x: number) => `${Number(x.toFixed(4))}`;

/** The sentence the bench shows and the server's issue carries, e.g. "36.5 V is far outside 3.00–4.20 V. Did you mean 3.65 V?" */
export function implausibleMessage(value: number, part: GuardPart): string {
	const w = plausibleWindow(part);
	const { suggestion } = guardOcv(value, part);
	const decimals = part.cells_in_series > 1 ? 1 : 2;
	const window = `${w.window_low_v.toFixed(decimals)}–${w.window_high_v.toFixed(decimals)} V`;
	const head = `${v(value)} V is far outside ${window}.`;
	if (!suggestion) return `${head} Check the value; if it is right, confirm it.`;
	return `${head} Did you mean ${v(suggestion.value_v)} V (${SLIP_WORDS[suggestion.slip]})?`;
}
