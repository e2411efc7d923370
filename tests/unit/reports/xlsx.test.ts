import XlsxPopulate from 'xlsx-populate';
import { describe, expect, it } from 'vitest';
import { filterNote, lotListXlsx, lotReadingsXlsx, type LotListRow } from '../../../src/lib/server/reports/xlsx';
import type { LotStatus } from '$lib/schemas/lot';
import { LOT_STATUS } from '$lib/status';
import { formatSocInterval } from '$lib/format';
import { makeReport } from './fixtures';
import { readZipSheets } from './xlsx-zip';

// Invented fixture data; each workbook is read back twice: by xlsx-populate and by a plain unzip of the
// SpreadsheetML parts (ECMA-376 Part 1: numeric cells carry no t="s" and hold the number in <v>).
describe('lotReadingsXlsx', () => {
	it('writes one numeric row per unit on "Readings", read back by xlsx-populate', async () => {
		const data = makeReport({}, 40);
		const workbook = await XlsxPopulate.fromDataAsync(await lotReadingsXlsx(data));
		const sheet = workbook.sheet('Readings')!;
		expect(sheet.cell('B1').value()).toBe('serial');
		expect(sheet.cell('C1').value()).toBe('OCV (V)');
		const intervalColumn = Array.from({ length: 40 }, (_, i) => i + 1).find((c) => sheet.cell(1, c).value() === 'SOC, 95 % interval');
		expect(intervalColumn).toBeDefined();
		data.units.forEach((unit, i) => {
			const row = i + 2;
			expect(sheet.cell(row, 1).value()).toBe(i + 1);
			expect(sheet.cell(row, 2).value()).toBe(unit.serial);
			expect(sheet.cell(row, 3).value()).toBeCloseTo(unit.ocv_v, 12);
			expect(sheet.cell(row, 8).value()).toBeCloseTo(unit.soc * 100, 9);
			expect(sheet.cell(row, intervalColumn!).value()).toBe(formatSocInterval(unit));
		});
		expect(sheet.cell(data.units.length + 2, 2).value()).toBeUndefined();
	});

	it('stores numbers as numbers and strings as shared strings in the zip parts', async () => {
		const data = makeReport({}, 25);
		const sheets = await readZipSheets(await lotReadingsXlsx(data));
		expect([...sheets.keys()]).toEqual(['Readings', 'Summary']);
		const readings = sheets.get('Readings')!;
		const unit = data.units[4];
		expect(readings.get('B6')).toEqual({ type: 'string', value: unit.serial });
		expect(readings.get('C6')?.type).toBe('number');
		expect(Number(readings.get('C6')?.value)).toBeCloseTo(unit.ocv_v, 12);
		expect(Number(readings.get('D6')?.value)).toBeCloseTo(unit.temperature_c, 12);
		// residual in mV = volts × 1000
		expect(Number(readings.get('N6')?.value)).toBeCloseTo(unit.residual_v! * 1000, 9);
	});

	it('leaves a missing AC resistance empty instead of writing zero', async () => {
		const data = makeReport({}, 25); // unit 17 of 25 is deep-discharged with no AC resistance
		expect(data.units[17].ac_resistance_mohm).toBeNull();
		const readings = (await readZipSheets(await lotReadingsXlsx(data))).get('Readings')!;
		expect(readings.get('E19')).toBeUndefined();
		expect(readings.get('E18')?.type).toBe('number');
	});

	it('summarises the lot, the disposition word and every reason, in words rather than codes', async () => {
		const data = makeReport({}, 30);
		const summary = (await readZipSheets(await lotReadingsXlsx(data))).get('Summary')!;
		const strings = [...summary.values()].filter((c) => c.type === 'string').map((c) => c.value);
		expect(strings).toContain(data.lot.lot_code);
		// the words of src/lib/status.ts, as on the lot page
		expect(strings).toContain('Reject');
		expect(strings).toContain(LOT_STATUS[data.lot.status as LotStatus].word);
		expect(strings).toContain('Air');
		expect(strings).toContain('Normal');
		expect(strings).not.toContain(data.lot.status);
		expect(strings).not.toContain('air');
		for (const reason of data.disposition.reasons) {
			expect(strings).toContain(reason.code);
			expect(strings).toContain(reason.message);
		}
	});
});

describe('lotListXlsx', () => {
	const rows: LotListRow[] = [
		{
			lot_code: 'LV-2031-0457',
			po_number: 'PO-88120',
			supplier: 'Ostrand Cellworks Co.',
			part_number: 'OC-2S1P-21700-48',
			chemistry: 'NMC',
			quantity: 3200,
			status: 'rejected',
			declared_soc: 0.3,
			transport: 'air',
			created_at: '2031-05-02T09:00:00.000Z'
		},
		{
			lot_code: 'LV-2031-0461',
			po_number: 'PO-88131',
			supplier: 'Brindle & Vask Energy',
			part_number: 'BV-LFP-32140',
			chemistry: 'LFP',
			quantity: 480,
			status: 'on_hold',
			declared_soc: null,
			transport: 'sea',
			created_at: '2031-05-06T11:30:00.000Z'
		}
	];

	it('puts the filter note first, then the header and one row per lot', async () => {
		const filters = { status: 'rejected', supplier: '', chemistry: 'NMC' };
		const workbook = await XlsxPopulate.fromDataAsync(await lotListXlsx(rows, filters));
		const sheet = workbook.sheet('Lots')!;
		expect(sheet.cell('A1').value()).toBe('Filters applied: status = Rejected; chemistry = NMC');
		expect(sheet.cell('A2').value()).toBe('lot code');
		expect(sheet.cell('A3').value()).toBe('LV-2031-0457');
		expect(sheet.cell('C4').value()).toBe('Brindle & Vask Energy');
		expect(sheet.cell('F4').value()).toBe(480);
		expect(sheet.cell('G3').value()).toBe('Rejected'); // the state's word, not its code
		expect(sheet.cell('G4').value()).toBe('On hold');
		expect(sheet.cell('I4').value()).toBe('Sea');
		expect(sheet.cell('J3').value()).toBe('2031-05-02 09:00 UTC');
		expect(sheet.cell('H3').value()).toBeCloseTo(30, 12);
		expect(sheet.cell('H4').value()).toBeUndefined();
	});

	it('keeps quantities numeric and escapes text in the zip parts', async () => {
		const cells = (await readZipSheets(await lotListXlsx(rows, {}))).get('Lots')!;
		expect(cells.get('A1')?.value).toBe('Filters applied: none (all lots)');
		expect(cells.get('F3')).toEqual({ type: 'number', value: '3200' });
		expect(cells.get('C4')).toEqual({ type: 'string', value: 'Brindle & Vask Energy' });
		expect(cells.get('A5')).toBeUndefined();
	});

	it('describes filters without the empty ones', () => {
		expect(filterNote({ q: '', transport: 'air' })).toBe('Filters applied: transport = Air');
		expect(filterNote({ status: 'pending_decision', supplier: 'Ostrand Cellworks Co.' })).toBe(
			'Filters applied: status = Awaiting decision; supplier = Ostrand Cellworks Co.'
		);
	});
});
