/** Free-text limits, stated to the person before the server has to refuse. */

/** The counter appears once the text passes this share of its limit (common practice: near the end). */
const NEAR_SHARE = 0.8;

export interface LengthNote {
	/** Whether to show the counter at all. */
	show: boolean;
	over: boolean;
	text: string;
}

const grouped = (n: number) => n.toLocaleString('en-GB');

/** What to say about `length` characters against a limit of `max`: nothing far below it, a count near it. */
export function lengthNote(length: number, max: number): LengthNote {
	const over = length > max;
	const text = over
		? `${grouped(length)} of at most ${grouped(max)} characters: shorten it by ${grouped(length - max)} to save.`
		: `${grouped(length)} of at most ${grouped(max)} characters.`;
	return { show: length >= max * NEAR_SHARE, over, text };
}

/** The refusal for text over its limit, naming the field; the text itself is kept, never cut. */
export function tooLongMessage(field: string, length: number, max: number): string {
	return `${field} is limited to ${grouped(max)} characters and this one has ${grouped(length)}; shorten it. Nothing was saved or cut.`;
}

/** Longest reason for cancelling a lot, in characters (kept in the lot's history). */
export const CANCEL_REASON_MAX = 500;
