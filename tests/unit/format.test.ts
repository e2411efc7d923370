import { describe, expect, it } from 'vitest';
import {
	ampereHours,
	celsius,
	celsiusSetting,
	count,
	dateOnly,
	dateTime,
	fileSize,
	fixed,
	formatSocInterval,
	megabytes,
	millivolts,
	milliohms,
	MISSING,
	percent,
	percentRange,
	ppm,
	quantity,
	signed,
	signedMillivolts,
	socInterval,
	socSigma,
	timeOnly,
	volts
} from '$lib/format';

// The display habits of DESIGN.md ("numbers keep their units", SOC as "31 % (22–40 %)", fixed
// decimals that suit the instrument); unit conversions are SI (milli = 10⁻³, percent = 10⁻²).
// A value and its unit are joined by U+00A0 (no-break space); negatives use U+2212 (minus sign).
const plain = (text: string) => text.replaceAll('\u00a0', ' ');

describe('numbers with units', () => {
	it('writes volts to 1 mV by default and to 0.1 mV for cells on request', () => {
		expect(volts(3.29951)).toBe('3.300\u00a0V');
		expect(plain(volts(3.29951, 4))).toBe('3.2995 V');
		expect(plain(volts(7.2, 2))).toBe('7.20 V');
	});

	it('takes volts and writes millivolts (1 V = 1000 mV)', () => {
		expect(plain(millivolts(0.0123))).toBe('12.3 mV');
		expect(plain(millivolts(0.0123, 0))).toBe('12 mV');
		expect(plain(millivolts(-0.0024, 0))).toBe('\u22122 mV');
	});

	it('signs differences and never prints a negative zero', () => {
		expect(plain(signedMillivolts(0.0012))).toBe('+1.2 mV');
		expect(plain(signedMillivolts(-0.0004))).toBe('\u22120.4 mV');
		expect(plain(signedMillivolts(0.00001))).toBe('0.0 mV');
		expect(signed(-0.00004, 3)).toBe('0.000');
		expect(fixed(-0.00004, 3)).toBe('0.000');
		expect(fixed(-1.25, 1)).toBe('\u22121.3'); // toFixed rounds half away from zero here (binary 1.25 is exact)
	});

	it('writes °C, mΩ and Ah with fixed decimals, and chosen temperatures whole when they are', () => {
		expect(plain(celsius(24.96))).toBe('25.0 °C');
		expect(plain(celsius(-20, 0))).toBe('\u221220 °C');
		expect(plain(celsiusSetting(25))).toBe('25 °C');
		expect(plain(celsiusSetting(22.5))).toBe('22.5 °C');
		expect(plain(milliohms(18.349))).toBe('18.3 mΩ');
		expect(plain(ampereHours(4.8))).toBe('4.80 Ah');
	});

	it('takes SOC as a fraction and writes percent', () => {
		expect(plain(percent(0.3))).toBe('30 %');
		expect(plain(percent(0.305, 1))).toBe('30.5 %');
		expect(plain(percent(1))).toBe('100 %');
	});

	it('writes an SOC estimate with its interval as the design notes show it', () => {
		expect(plain(socInterval(0.31, 0.22, 0.4))).toBe('31 % (22–40 %)');
		expect(plain(percentRange(0.1, 0.4))).toBe('10–40 %');
		expect(plain(socInterval(0.31, null, 0.4))).toBe('31 %');
		expect(plain(socSigma(0.312, 0.041))).toBe('31 % ± 4 %');
		expect(plain(socSigma(0.312, 0.041, 1))).toBe('31.2 % ± 4.1 %');
	});

	it('writes an evaluated reading as its interval, and an indeterminate one in words without a falsely precise estimate', () => {
		expect(plain(formatSocInterval({ soc: 0.38, soc_low: 0.31, soc_high: 0.45, determinate: true }))).toBe('38 % (31–45 %)');
		expect(plain(formatSocInterval({ soc: 0.38, soc_low: 0.31, soc_high: 0.45 }))).toBe('38 % (31–45 %)');
		expect(plain(formatSocInterval({ soc: 0.5, soc_low: 0.05, soc_high: 0.8, determinate: false }))).toBe('indeterminate 5–80 %');
		expect(formatSocInterval({ soc: null, soc_low: null, soc_high: null, determinate: false })).toBe(MISSING);
	});

	it('keeps the number and its unit together with a no-break space', () => {
		for (const text of [volts(3.6), millivolts(0.002), celsius(25), percent(0.3), milliohms(12), ppm(120), quantity(3)]) {
			expect(text).toMatch(/\d\u00a0\S+$/);
			expect(text).not.toContain(' ');
		}
	});

	it('writes file sizes in KB under 1 MB and in MB (1024 × 1024 bytes) above', () => {
		expect(plain(fileSize(200))).toBe('1 KB');
		expect(plain(fileSize(150 * 1024))).toBe('150 KB');
		expect(plain(fileSize(1024 * 1024))).toBe('1.0 MB');
		expect(plain(megabytes(20 * 1024 * 1024 + 1))).toBe('20.0 MB');
		expect(plain(megabytes(20 * 1024 * 1024, 0))).toBe('20 MB');
	});

	it('groups thousands and names what is counted', () => {
		expect(count(12500)).toBe('12,500');
		expect(count(1234567.4)).toBe('1,234,567');
		expect(count(-1500)).toBe('\u22121,500');
		expect(plain(ppm(12500))).toBe('12,500 ppm');
		expect(plain(quantity(1))).toBe('1 unit');
		expect(plain(quantity(1200))).toBe('1,200 units');
		expect(plain(quantity(2, 'reading'))).toBe('2 readings');
	});

	it('shows a missing or non-finite value as an em dash, without a unit', () => {
		for (const missing of [null, undefined, Number.NaN, Number.POSITIVE_INFINITY]) {
			expect(volts(missing)).toBe(MISSING);
			expect(millivolts(missing)).toBe(MISSING);
			expect(signedMillivolts(missing)).toBe(MISSING);
			expect(percent(missing)).toBe(MISSING);
			expect(count(missing)).toBe(MISSING);
			expect(quantity(missing)).toBe(MISSING);
			expect(socInterval(missing, 0.1, 0.2)).toBe(MISSING);
		}
		expect(MISSING).toBe('—');
	});
});

describe('times in one style, in UTC with the zone named', () => {
	it('writes ISO 8601 dates and minutes (ISO 8601-1:2019) and says UTC', () => {
		expect(dateTime('2031-05-15T10:05:42.120Z')).toBe('2031-05-15 10:05 UTC');
		expect(dateTime('2031-05-15T12:05:42+02:00')).toBe('2031-05-15 10:05 UTC');
		expect(dateTime(new Date(Date.UTC(2031, 0, 2, 3, 4, 5)))).toBe('2031-01-02 03:04 UTC');
		expect(dateTime('2031-05-15T10:05:42Z', { seconds: true })).toBe('2031-05-15 10:05:42 UTC');
		expect(timeOnly('2031-05-15T23:59:00Z')).toBe('23:59 UTC');
	});

	it('keeps a calendar date as that date and crosses midnight in UTC, not in local time', () => {
		expect(dateOnly('2026-12-20')).toBe('2026-12-20');
		expect(dateOnly('2031-05-15T23:30:00-02:00')).toBe('2031-05-16');
	});

	it('shows a missing or unreadable time as an em dash', () => {
		for (const missing of [null, undefined, '', 'not a date']) {
			expect(dateTime(missing)).toBe(MISSING);
			expect(dateOnly(missing)).toBe(MISSING);
			expect(timeOnly(missing)).toBe(MISSING);
		}
	});
});
