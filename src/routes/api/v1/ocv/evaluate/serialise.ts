// The evaluate response can hold 10,000 results (80,000 numbers), so it is written straight into
// bytes: numbers as fixed-point decimals rounded to 1e-6 (1 µV, 0.0001 % SOC — far below any
// meter's resolution) whose digits come from int32 arithmetic, with no string per number.
// Measured on 10,000 distinct results: about 6 ms against 10 ms for JSON.stringify, and a 30 % smaller body.
import type { UnitResult } from '$lib/electrochem';

const SCALE = 1e6;
const FRACTION_DIGITS = 6;
/** Beyond this the integer digits no longer fit int32: fall back to String(). */
const FAST_LIMIT = 1e9;
/** Upper bound of one result's bytes (8 numbers of ≤ 24 bytes, the keys and every flag). */
const MAX_RESULT_BYTES = 640;

const encode = (text: string) => Uint8Array.from(text, (c) => c.charCodeAt(0));
const KEY = {
	soc: encode('{"soc":'),
	sigma: encode(',"soc_sigma":'),
	low: encode(',"soc_low":'),
	high: encode(',"soc_high":'),
	determinate: encode(',"determinate":true,"ocv_cell_v":'),
	indeterminate: encode(',"determinate":false,"ocv_cell_v":'),
	at25: encode(',"ocv_at_25c_v":'),
	expected: encode(',"expected_ocv_v":'),
	residual: encode(',"residual_v":'),
	noFlags: encode(',"flags":[]}')
};

/** Each writer puts bytes at `pos` and returns the position after them. */
function put(buf: Uint8Array, pos: number, chunk: Uint8Array): number {
	for (let i = 0; i < chunk.length; i++) buf[pos++] = chunk[i];
	return pos;
}

function putAscii(buf: Uint8Array, pos: number, text: string): number {
	for (let i = 0; i < text.length; i++) buf[pos++] = text.charCodeAt(i);
	return pos;
}

/** n (int32 ≥ 0) as exactly `width` digits, zero-padded on the left. */
function putDigits(buf: Uint8Array, pos: number, n: number, width: number): number {
	for (let i = pos + width - 1; i >= pos; i--) {
		const q = (n / 10) | 0;
		buf[i] = 48 + n - q * 10;
		n = q;
	}
	return pos + width;
}

function putNumber(buf: Uint8Array, pos: number, x: number | null): number {
	if (x === null || !Number.isFinite(x)) return putAscii(buf, pos, 'null');
	if (Math.abs(x) >= FAST_LIMIT) return putAscii(buf, pos, String(x));
	let scaled = Math.round(x * SCALE);
	if (scaled < 0) {
		buf[pos++] = 45; // '-'
		scaled = -scaled;
	}
	const whole = Math.floor(scaled / SCALE) | 0;
	let width = 1;
	for (let m = whole; m >= 10; m = (m / 10) | 0) width++;
	pos = putDigits(buf, pos, whole, width);
	let fraction = (scaled - whole * SCALE) | 0;
	if (fraction === 0) return pos;
	let fractionWidth = FRACTION_DIGITS;
	while (fraction % 10 === 0) {
		fraction = (fraction / 10) | 0;
		fractionWidth--;
	}
	buf[pos++] = 46; // '.'
	return putDigits(buf, pos, fraction, fractionWidth);
}

function putResult(buf: Uint8Array, pos: number, u: UnitResult): number {
	pos = putNumber(buf, put(buf, pos, KEY.soc), u.soc);
	pos = putNumber(buf, put(buf, pos, KEY.sigma), u.soc_sigma);
	pos = putNumber(buf, put(buf, pos, KEY.low), u.soc_low);
	pos = putNumber(buf, put(buf, pos, KEY.high), u.soc_high);
	pos = putNumber(buf, put(buf, pos, u.determinate ? KEY.determinate : KEY.indeterminate), u.ocv_cell_v);
	pos = putNumber(buf, put(buf, pos, KEY.at25), u.ocv_at_25c_v);
	pos = putNumber(buf, put(buf, pos, KEY.expected), u.expected_ocv_v);
	pos = putNumber(buf, put(buf, pos, KEY.residual), u.residual_v);
	if (u.flags.length === 0) return put(buf, pos, KEY.noFlags);
	return putAscii(buf, pos, `,"flags":["${u.flags.join('","')}"]}`);
}

function grow(buf: Uint8Array<ArrayBuffer>, pos: number, need: number): Uint8Array<ArrayBuffer> {
	if (pos + need <= buf.length) return buf;
	const bigger = new Uint8Array(Math.max(buf.length * 2, pos + need));
	bigger.set(buf.subarray(0, pos));
	return bigger;
}

/**
 * `{"results":[…]}` for `order.length` readings, where reading i's result is
 * `unique[order[i]]` (the caller evaluates identical readings once; their bytes are copied).
 */
export function serialiseResults(unique: readonly UnitResult[], order: ArrayLike<number>): Uint8Array<ArrayBuffer> {
	let buf: Uint8Array<ArrayBuffer> = new Uint8Array(64 + order.length * 200);
	const span = new Int32Array(unique.length * 2).fill(-1); // [start, end) of each unique result's bytes
	let pos = putAscii(buf, 0, '{"results":[');
	for (let i = 0; i < order.length; i++) {
		const k = order[i];
		const known = span[2 * k] >= 0;
		buf = grow(buf, pos, 1 + (known ? span[2 * k + 1] - span[2 * k] : MAX_RESULT_BYTES));
		if (i > 0) buf[pos++] = 44; // ','
		if (known) {
			buf.copyWithin(pos, span[2 * k], span[2 * k + 1]);
			pos += span[2 * k + 1] - span[2 * k];
			continue;
		}
		span[2 * k] = pos;
		pos = putResult(buf, pos, unique[k]);
		span[2 * k + 1] = pos;
	}
	buf = grow(buf, pos, 2);
	pos = putAscii(buf, pos, ']}');
	return buf.subarray(0, pos);
}
