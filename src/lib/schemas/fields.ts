/**
 * Building blocks for every schema's fields, so strictness is decided once:
 *  - text(): refuses NUL and other control characters (PostgreSQL cannot store NUL in text, and
 *    invisible characters make look-alike POs and serials); multi-line free text keeps tab and
 *    line breaks;
 *  - wholeNumber() / decimal(): finite numbers (zod refuses NaN and ±Infinity), whole where whole;
 *  - fromText() (query strings) and server/forms.ts' validateForm (form fields): numbers that
 *    arrive as text must be written plainly — `12`, `-3.5`, `0.25`, spaces around allowed. `1e7`,
 *    `1,5`, `1e309`, `0x10`, `12abc` and `` are refused, never read as 1, 12 or 0;
 *  - plausibleInstant(): a measurement time that can be true (2000 or later, at most a day ahead).
 */
import { z } from 'zod';

/** C0 controls, DEL and C1 controls, and invisible direction overrides (they reorder what is shown). */
// eslint-disable-next-line no-control-regex -- finding control characters is what this pattern is for
const CONTROL_SINGLE_LINE = /[\u0000-\u001F\u007F-\u009F\u2028\u2029\u202A-\u202E\u2066-\u2069]/;
/** The same, but tab, line feed and carriage return are fine in multi-line free text. */
// eslint-disable-next-line no-control-regex -- finding control characters is what this pattern is for
const CONTROL_MULTI_LINE = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F-\u009F\u202A-\u202E\u2066-\u2069]/;

const SINGLE_LINE_MESSAGE = 'Remove control characters (such as NUL, or a line break in a one-line field)';
const MULTI_LINE_MESSAGE = 'Remove control characters (such as NUL) from this text';

export function hasControlCharacters(value: string, { multiline = false } = {}): boolean {
	return (multiline ? CONTROL_MULTI_LINE : CONTROL_SINGLE_LINE).test(value);
}

/**
 * A text field. Chain `.trim().min(…).max(…)` as usual; `error` is the message for a value that is
 * not text at all. `multiline` allows tab and line breaks (reasons, notes, comments, pasted CSV).
 */
export function text({ error, multiline = false }: { error?: string; multiline?: boolean } = {}) {
	return z
		.string(error ? { error } : undefined)
		.refine((v) => !hasControlCharacters(v, { multiline }), multiline ? MULTI_LINE_MESSAGE : SINGLE_LINE_MESSAGE);
}

/** A whole number (safe integer); `error` names what to enter when it is not one. */
export function wholeNumber(error: string) {
	return z.number({ error }).int(error);
}

/** A finite number; `error` names what to enter when it is not one. */
export function decimal(error: string) {
	return z.number({ error });
}

const WHOLE_TEXT = /^[+-]?\d+$/;
const DECIMAL_TEXT = /^[+-]?(\d+(\.\d*)?|\.\d+)$/;

/** The number written plainly in `raw`, or undefined (exponents, commas, hex, blanks, trailing junk). */
export function strictNumberFromText(raw: string, { whole = false } = {}): number | undefined {
	const trimmed = raw.trim();
	if (!(whole ? WHOLE_TEXT : DECIMAL_TEXT).test(trimmed)) return undefined;
	const value = Number(trimmed);
	return Number.isFinite(value) ? value : undefined;
}

/**
 * A number schema fed from text (a query parameter): plain text becomes its number, anything else
 * stays text, which the number schema refuses with its own message. Numbers pass as they are.
 */
export function fromText<T extends z.ZodType>(schema: T, { whole = false } = {}) {
	return z.preprocess((v) => (typeof v === 'string' ? (strictNumberFromText(v, { whole }) ?? v) : v), schema);
}

/** A path parameter that is a positive whole number written plainly (e.g. a reading id), or null. */
export function wholeNumberParam(raw: string): number | null {
	if (!/^\d{1,15}$/.test(raw)) return null;
	const value = Number(raw);
	return value >= 1 ? value : null;
}

/** Earliest instant accepted for a measurement: no reading in this product predates the year 2000. */
export const EARLIEST_INSTANT = Date.UTC(2000, 0, 1);
/** How far ahead of the server clock a meter's clock may run (time zones and drift). */
export const MAX_FUTURE_MS = 24 * 60 * 60 * 1000;

/** An ISO 8601 date-time with zone that can be true: from the year 2000 to a day after the server's now. */
export function plausibleInstant(what: string) {
	const at = (v: string) => Date.parse(v);
	return z.iso
		.datetime({ offset: true, error: `${what} must be an ISO 8601 date-time with zone` })
		.refine((v) => !(at(v) < EARLIEST_INSTANT), `${what} is before the year 2000`)
		.refine((v) => !(at(v) > Date.now() + MAX_FUTURE_MS), `${what} is more than a day in the future`);
}
