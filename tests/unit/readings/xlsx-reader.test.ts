// Meter files in XLSX: the first sheet read through xlsx-populate into the import's table of strings,
// then guessed and mapped like a CSV file. The workbooks are written here with xlsx-populate; the
// expected tables are worked out by hand from the values written.
import { describe, expect, it } from 'vitest';
import XlsxPopulate from 'xlsx-populate';
import { guessMapping, mapTable, readXlsxTable, xlsxCellText } from '../../../src/lib/server/services/meter-file';
import { importMappingSchema } from '../../../src/lib/schemas/readings';

interface RichTextLike {
	add(text: string, styles?: Record<string, unknown>): RichTextLike;
}
// The project's typings (src/lib/server/reports/xlsx-populate.d.ts) cover writing plain values only.
const { RichText, FormulaError } = XlsxPopulate as unknown as { RichText: new () => RichTextLike; FormulaError: { NA: unknown } };

type Book = Awaited<ReturnType<typeof XlsxPopulate.fromBlankAsync>>;

async function workbookWith(fill: (wb: Book) => void): Promise<Buffer> {
	const wb = await XlsxPopulate.fromBlankAsync();
	fill(wb);
	return (await wb.outputAsync()) as Buffer;
}

describe('readXlsxTable: the first sheet as text', () => {
	it('reads strings, numbers, booleans and empty cells of a meter sheet', async () => {
		const bytes = await workbookWith((wb) => {
			const s = wb.sheet(0)!;
			s.range('A1:F1').value([['Serial', 'OCV (V)', 'Temperature (°C)', 'Measured at', 'OK', 'Note']]);
			s.range('A2:F4').value([
				['VC-0001', 3.6512, 23.4, 46083.5, true, 'Cells & packs <fine>'],
				['00042', -0.0015, 25, 46083.75, false, 'quote " and apostrophe \''],
				['VC-0003', 1e-7, 1234567.891, null, null, '  spaced  ']
			]);
		});
		expect(await readXlsxTable(bytes)).toEqual([
			['Serial', 'OCV (V)', 'Temperature (°C)', 'Measured at', 'OK', 'Note'],
			['VC-0001', '3.6512', '23.4', '46083.5', 'true', 'Cells & packs <fine>'],
			['00042', '-0.0015', '25', '46083.75', 'false', 'quote " and apostrophe \''], // text stays text: leading zeros kept
			['VC-0003', '1e-7', '1234567.891', '', '', '  spaced  ']
		]);
	});

	it('starts the table at the first used row and column and reads columns past Z (AA, AB)', async () => {
		const bytes = await workbookWith((wb) => {
			const s = wb.sheet(0)!;
			s.cell('C4').value('first');
			s.cell('AA6').value(3.7);
			s.cell('AB7').value('last & least');
		});
		const table = await readXlsxTable(bytes);
		expect(table.length).toBe(4); // rows 4..7
		expect(table.every((row) => row.length === 26)).toBe(true); // columns C..AB
		expect([table[0][0], table[2][24], table[3][25]]).toEqual(['first', '3.7', 'last & least']);
		expect(table[1].every((c) => c === '')).toBe(true);
	});

	it('joins the runs of rich text', async () => {
		const bytes = await workbookWith((wb) => {
			const rich = new RichText();
			rich.add('Cell ', { bold: true }).add('A&B', { italic: true }).add(' <ok>');
			wb.sheet(0)!
				.cell('A1')
				.value(rich as unknown as string);
			wb.sheet(0)!.cell('B1').value('plain');
		});
		expect(await readXlsxTable(bytes)).toEqual([['Cell A&B <ok>', 'plain']]);
	});

	it('writes an error value as its code (xlsx-populate reads #N/A cells as a FormulaError but cannot write one)', () => {
		expect(xlsxCellText(FormulaError.NA)).toBe('#N/A');
		expect([xlsxCellText(undefined), xlsxCellText(null), xlsxCellText(false), xlsxCellText(0.1 + 0.2)]).toEqual([
			'',
			'',
			'false',
			'0.30000000000000004'
		]);
	});

	it('reads the first sheet when the workbook has several, and nothing from an empty sheet', async () => {
		const several = await workbookWith((wb) => {
			wb.sheet(0)!.cell('A1').value('first sheet');
			wb.addSheet('Second').cell('A1').value('second sheet');
		});
		expect(await readXlsxTable(several)).toEqual([['first sheet']]);
		expect(await readXlsxTable(await workbookWith(() => undefined))).toEqual([]);
	});

	it('refuses bytes that are not a workbook', async () => {
		await expect(readXlsxTable(Buffer.from('PK\u0003\u0004 not really a zip'))).rejects.toThrow();
		await expect(readXlsxTable(Buffer.from('Serial,OCV\nA1,3.6\n'))).rejects.toThrow();
	});
});

describe('an XLSX meter file through the mapping', () => {
	it('maps 2,000 generated rows to readings: guessed columns, serial-day times, one row number per file row', async () => {
		const start = 46083.5; // 2026-03-02 12:00 UTC as a spreadsheet serial day (1899-12-30 epoch)
		const rows = Array.from({ length: 2000 }, (_, i) => [
			`S-${String(i).padStart(5, '0')}`,
			3.6 + (i % 97) / 1000,
			20 + (i % 7) * 0.5,
			start + i / 1440
		]);
		const bytes = await workbookWith((wb) => {
			wb.sheet(0)!
				.range('A1:D1')
				.value([['Serial', 'OCV (V)', 'Temperature (°C)', 'Measured at']]);
			wb.sheet(0)!
				.range(2, 1, rows.length + 1, 4)
				.value(rows);
		});
		const table = await readXlsxTable(bytes);
		const guessed = guessMapping(table[0]);
		expect(guessed).toEqual({ serial: 0, ocv: 1, ocv_unit: 'V', temperature: 2, time: 3, first_row: 1 });
		const mapped = mapTable(table, importMappingSchema.parse(guessed));
		expect(mapped.errors).toEqual([]);
		expect(mapped.rows.length).toBe(2000);
		expect(mapped.fileRows[1999]).toBe(2001);
		expect(mapped.rows[0]).toEqual({
			serial: 'S-00000',
			ocv_v: 3.6,
			temperature_c: 20,
			ac_resistance_mohm: null,
			measured_at: '2026-03-02T12:00:00.000Z'
		});
		// Row 1441 of the data is 1440 minutes = one day later; 1440 % 97 = 82 and 1440 % 7 = 5.
		expect(mapped.rows[1440]).toEqual({
			serial: 'S-01440',
			ocv_v: 3.6 + 82 / 1000,
			temperature_c: 22.5,
			ac_resistance_mohm: null,
			measured_at: '2026-03-03T12:00:00.000Z'
		});
	});
});
