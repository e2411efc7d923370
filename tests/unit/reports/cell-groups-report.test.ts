// The readings export shows each pack's lowest and highest cell-group voltage (invented fixture data),
// and leaves both cells empty for a unit read without its groups.
import XlsxPopulate from 'xlsx-populate';
import { describe, expect, it } from 'vitest';
import { lotReadingsXlsx } from '../../../src/lib/server/reports/xlsx';
import { makeReport } from './fixtures';

describe('cell groups in the readings export', () => {
	it('writes the lowest and highest group per unit, empty where none were recorded', async () => {
		const data = makeReport({}, 6);
		data.units[2] = { ...data.units[2], cell_group_min_v: 2.104, cell_group_max_v: 3.652 };
		const sheet = (await XlsxPopulate.fromDataAsync(await lotReadingsXlsx(data))).sheet('Readings')!;
		const header = (sheet.usedRange()?.value()[0] ?? []) as string[];
		const low = header.indexOf('lowest cell group (V)') + 1;
		const high = header.indexOf('highest cell group (V)') + 1;
		expect(low).toBeGreaterThan(0);
		expect(sheet.cell(4, low).value()).toBeCloseTo(2.104, 12);
		expect(sheet.cell(4, high).value()).toBeCloseTo(3.652, 12);
		expect(sheet.cell(3, low).value()).toBeUndefined();
	});
});
