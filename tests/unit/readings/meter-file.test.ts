// CSV parsing through papaparse (RFC 4180, https://www.rfc-editor.org/rfc/rfc4180), header guessing and
// column mapping of meter files. Expected values are worked out by hand from the inputs written here.
import { describe, expect, it } from 'vitest';
import {
	CsvSyntaxError,
	detectDelimiter,
	guessMapping,
	mapTable,
	parseCsv,
	parseNumber,
	parseTime
} from '../../../src/lib/server/services/meter-file';
import { importMappingSchema } from '../../../src/lib/schemas/readings';

describe('parseCsv', () => {
	it('splits RFC 4180 records: quoted delimiters, doubled quotes, line breaks inside quotes, CRLF', () => {
		const text = 'a,b,c\r\n"x, y","say ""hi""","line1\nline2"\r\n1,,3';
		expect(parseCsv(text)).toEqual([
			['a', 'b', 'c'],
			['x, y', 'say "hi"', 'line1\nline2'],
			['1', '', '3']
		]);
	});

	it('drops a UTF-8 byte-order mark and keeps a last line without a newline', () => {
		expect(parseCsv('\uFEFFserial,ocv\nA1,3.6')).toEqual([
			['serial', 'ocv'],
			['A1', '3.6']
		]);
	});

	it('detects semicolon and tab delimiters (common in European meter exports)', () => {
		expect(detectDelimiter('Serial;OCV;T\nA;3,6;25\nB;3,7;25')).toBe(';');
		expect(detectDelimiter('Serial\tOCV\nA\t3.6')).toBe('\t');
		expect(detectDelimiter('Serial,OCV\nA,3.6')).toBe(',');
	});

	it('finds the semicolon of a decimal-comma file that ends in a line break or has empty lines', () => {
		expect(detectDelimiter('Serial;OCV\r\nA;3,6\r\nB;3,7\r\n')).toBe(';');
		expect(parseCsv('Serial;OCV\n\nA;3,6\n  \nB;3,7\n')).toEqual([['Serial', 'OCV'], [''], ['A', '3,6'], ['  '], ['B', '3,7']]);
	});

	it('reads a one-column file with the default delimiter and adds no row for the final line break', () => {
		expect(parseCsv('serial\nA1\nA2\n')).toEqual([['serial'], ['A1'], ['A2']]);
		expect(parseCsv('serial\nA1\n\n')).toEqual([['serial'], ['A1'], ['']]);
	});

	it('refuses broken quoting, naming the row where it starts', () => {
		const refusal = (text: string) => {
			try {
				parseCsv(text);
			} catch (error) {
				return error instanceof CsvSyntaxError ? { row: error.row, message: error.message } : error;
			}
			return null;
		};
		expect(refusal('serial,ocv\nA1,3.6\n"A2,3.7\nA3,3.8')).toEqual({ row: 3, message: 'Quoted field unterminated' });
		expect(refusal('serial,ocv\nA1,3.6\n"A"2,3.7')).toMatchObject({ row: 3 });
	});
});

describe('parseNumber and parseTime', () => {
	it('reads decimal points, decimal commas and trailing units; refuses text', () => {
		expect(parseNumber('3.712')).toBe(3.712);
		expect(parseNumber('3,712')).toBe(3.712);
		expect(parseNumber(' 3712 mV')).toBe(3712);
		expect(parseNumber('+25.1')).toBe(25.1);
		expect(parseNumber('')).toBeNull();
		expect(parseNumber('abc')).toBeNaN();
		expect(parseNumber('1,234,5')).toBeNaN();
	});

	it('reads ISO times, zone-less times as UTC and spreadsheet serial days (1899-12-30 epoch)', () => {
		expect(parseTime('2026-03-02T09:15:00+01:00')).toBe('2026-03-02T08:15:00.000Z');
		expect(parseTime('2026-03-02 09:15')).toBe('2026-03-02T09:15:00.000Z');
		// 46083 days after 1899-12-30 is 2026-03-02 (25569 = 1970-01-01 in the same count).
		expect(parseTime('46083.5')).toBe('2026-03-02T12:00:00.000Z');
		expect(parseTime('yesterday')).toBe('invalid');
		expect(parseTime('')).toBeNull();
	});
});

describe('guessMapping and mapTable', () => {
	it('guesses the columns from a header and the OCV unit from "mV"', () => {
		expect(guessMapping(['Serial', 'OCV (mV)', 'Temp (°C)', 'ACIR (mΩ)', 'Time'])).toEqual({
			serial: 0,
			ocv: 1,
			ocv_unit: 'mV',
			temperature: 2,
			ac_resistance: 3,
			time: 4,
			first_row: 1
		});
		expect(guessMapping(['Barcode', 'Temperature', 'Voltage V'])).toMatchObject({ serial: 0, temperature: 1, ocv: 2, ocv_unit: 'V' });
	});

	it('converts mV to V, reports row-level errors with file row numbers and skips empty lines', () => {
		const table = parseCsv('S;U mV;T\nA1;3712,5;25\n\nA2;;25\nA3;3700;hot\nA4;-5;25\nA5;3690;24');
		const mapping = importMappingSchema.parse({ serial: 0, ocv: 1, ocv_unit: 'mV', temperature: 2 });
		const out = mapTable(table, mapping);
		expect(out.rows.map((r) => [r.serial, r.ocv_v, r.temperature_c])).toEqual([
			['A1', 3.7125, 25],
			['A5', 3.69, 24]
		]);
		expect(out.fileRows).toEqual([2, 7]);
		expect(out.skippedEmpty).toBe(1);
		expect(out.errors).toEqual([
			{ row: 4, column: 'OCV', message: 'OCV is empty' },
			{ row: 5, column: 'temperature', message: '“hot” is not a number' },
			{ row: 6, column: 'ocv_v', message: 'ocv_v must be ≥ 0 V (check the probe polarity)' }
		]);
	});

	it('uses the default temperature when the file has no temperature column', () => {
		const mapping = importMappingSchema.parse({ serial: 0, ocv: 1, default_temperature_c: 22 });
		expect(
			mapTable(
				[
					['s', 'v'],
					['B1', '3.3']
				],
				mapping
			).rows
		).toEqual([{ serial: 'B1', ocv_v: 3.3, temperature_c: 22, ac_resistance_mohm: null, measured_at: null }]);
		const none = importMappingSchema.parse({ serial: 0, ocv: 1 });
		expect(
			mapTable(
				[
					['s', 'v'],
					['B1', '3.3']
				],
				none
			).errors[0]
		).toMatchObject({ row: 2, column: 'temperature' });
	});
});
