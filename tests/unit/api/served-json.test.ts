import { describe, expect, it } from 'vitest';
import { servedJson } from '../../../src/lib/server/services/evaluation-body';

// The JSON grammar (RFC 8259 section 7) lets any character be written as \uXXXX, a character
// outside the Basic Multilingual Plane as its UTF-16 surrogate pair of escapes.
describe('servedJson', () => {
	const value = {
		message: 'Median estimated SOC 41 % (interval 35–47 %) differs by more than ±5 %; score ≥ 30; supplier’s action',
		unit: 'Ω',
		emoji: '🔋',
		plain: 'ASCII stays as it is: "quoted" \\ back-slashed',
		numbers: [3.612345, -0.000001, null]
	};

	it('writes only ASCII characters', () => {
		expect(servedJson(value)).toMatch(/^[\x00-\x7f]*$/);
	});

	it('parses back to the same value', () => {
		expect(JSON.parse(servedJson(value))).toEqual(value);
	});

	it('escapes as RFC 8259 spells it: en dash U+2013, plus-minus U+00B1, a surrogate pair for U+1F50B', () => {
		const text = servedJson(value);
		expect(text).toContain('35\\u201347');
		expect(text).toContain('\\u00b15');
		expect(text).toContain('\\ud83d\\udd0b');
	});

	it('leaves ASCII-only JSON byte for byte as JSON.stringify writes it', () => {
		const ascii = { a: 'b "c" \\ d', n: [1, 2.5] };
		expect(servedJson(ascii)).toBe(JSON.stringify(ascii));
	});

	it('has the same bytes in Latin-1 and UTF-8, so the endpoint may copy it as Latin-1', () => {
		const text = servedJson(value);
		expect(Buffer.from(text, 'latin1').equals(Buffer.from(text, 'utf8'))).toBe(true);
	});
});
