import XlsxPopulate from 'xlsx-populate';
import type { Sheet } from 'xlsx-populate';
import { DECISION_KIND, INSPECTION_SEVERITY, LOT_STATUS, REASON_SEVERITY, TRANSPORT, VERDICT, wordOf } from '$lib/status';
import { dateTime, formatSocInterval } from '$lib/format';
import { xlsxColour } from './palette';
import type { ReportData, ReportUnit } from './types';

type Cell = string | number | boolean | null;

export interface LotListRow {
	lot_code: string;
	po_number: string;
	supplier: string;
	part_number: string;
	chemistry: string;
	quantity: number;
	status: string;
	declared_soc: number | null;
	transport: string;
	created_at: string | Date;
}

const HEADER_STYLE = { bold: true, fontColor: 'ffffff', fill: xlsxColour('volt-700') };
const NOTE_STYLE = { italic: true, fontColor: xlsxColour('ink-soft') };

/** SOC travels as a fraction; spreadsheets show percent, still as numbers. */
const pct = (fraction: number | null): number | null => (fraction === null ? null : fraction * 100);
const mv = (volts: number | null): number | null => (volts === null ? null : volts * 1000);

const READING_COLUMNS: Array<{ title: string; width: number; format?: string; value(u: ReportUnit, i: number): Cell }> = [
	{ title: '#', width: 6, value: (_u, i) => i + 1 },
	{ title: 'serial', width: 18, value: (u) => u.serial },
	{ title: 'OCV (V)', width: 10, format: '0.000', value: (u) => u.ocv_v },
	{ title: 'temperature (°C)', width: 15, format: '0.0', value: (u) => u.temperature_c },
	{ title: 'AC resistance (mΩ)', width: 17, format: '0.00', value: (u) => u.ac_resistance_mohm },
	{ title: 'cell OCV (V)', width: 12, format: '0.0000', value: (u) => u.ocv_cell_v },
	{ title: 'cell OCV at 25 °C (V)', width: 19, format: '0.0000', value: (u) => u.ocv_at_25c_v },
	{ title: 'SOC (%)', width: 9, format: '0.0', value: (u) => pct(u.soc) },
	{ title: 'SOC σ (%)', width: 10, format: '0.0', value: (u) => pct(u.soc_sigma) },
	{ title: 'SOC low (%)', width: 11, format: '0.0', value: (u) => pct(u.soc_low) },
	{ title: 'SOC high (%)', width: 12, format: '0.0', value: (u) => pct(u.soc_high) },
	{ title: 'SOC determinate', width: 15, value: (u) => (u.determinate ? 'yes' : VERDICT.indeterminate.word.toLowerCase()) },
	{ title: 'expected OCV (V)', width: 16, format: '0.0000', value: (u) => u.expected_ocv_v },
	{ title: 'residual (mV)', width: 13, format: '0.0', value: (u) => mv(u.residual_v) },
	{ title: 'lowest cell group (V)', width: 19, format: '0.000', value: (u) => u.cell_group_min_v ?? null },
	{ title: 'highest cell group (V)', width: 20, format: '0.000', value: (u) => u.cell_group_max_v ?? null },
	{ title: 'nonconforming', width: 14, value: (u) => (u.nonconforming ? 'yes' : 'no') },
	{ title: 'flags', width: 36, value: (u) => u.flags.join('; ') },
	// the same text as the report and the lot page, e.g. "38 % (31–45 %)" or "indeterminate 5–80 %"
	{ title: 'SOC, 95 % interval', width: 22, value: (u) => formatSocInterval(u) }
];

/** Writes a header row and data rows from row `firstRow`; null stays an empty cell. */
function writeTable(sheet: Sheet, firstRow: number, headers: string[], rows: Cell[][]): void {
	headers.forEach((title, c) =>
		sheet
			.cell(firstRow, c + 1)
			.value(title)
			.style(HEADER_STYLE)
	);
	rows.forEach((row, r) => {
		row.forEach((value, c) => {
			if (value !== null) sheet.cell(firstRow + 1 + r, c + 1).value(value);
		});
	});
}

/** The lot's readings (one row per unit) and a summary of the disposition and its reasons. */
export async function lotReadingsXlsx(data: ReportData): Promise<Buffer> {
	const workbook = await XlsxPopulate.fromBlankAsync();
	const readings = workbook.sheet(0)!.name('Readings');
	const rows = data.units.map((unit, i) => READING_COLUMNS.map((column) => column.value(unit, i)));
	writeTable(
		readings,
		1,
		READING_COLUMNS.map((c) => c.title),
		rows
	);
	READING_COLUMNS.forEach((column, c) => {
		readings.column(c + 1).width(column.width);
		if (column.format && rows.length) readings.range(2, c + 1, rows.length + 1, c + 1).style({ numberFormat: column.format });
	});
	readings.freezePanes(0, 1);
	writeSummary(workbook.addSheet('Summary'), data);
	return workbook.outputAsync();
}

function summaryPairs(data: ReportData): Array<[string, Cell]> {
	const { lot, part, plan, stats, disposition, decision } = data;
	return [
		['Lot code', lot.lot_code],
		['PO number', lot.po_number],
		['Supplier', data.supplier.name],
		['Part number', part.part_number],
		['Chemistry', part.chemistry],
		['Quantity', lot.quantity],
		['Declared SOC (%)', pct(lot.declared_soc)],
		['Transport', TRANSPORT[lot.transport]],
		['Lot status', wordOf(LOT_STATUS, lot.status)],
		['Disposition', VERDICT[disposition.status].word],
		['Safety', disposition.safety ? 'yes' : 'no'],
		['Nonconforming units', disposition.nonconforming],
		['Sample size', plan ? plan.sample_size : null],
		['Ac / Re', plan ? `${plan.accept} / ${plan.reject}` : null],
		['Severity', wordOf(INSPECTION_SEVERITY, data.severity)],
		['Mean cell OCV at 25 °C (V)', stats ? stats.mean : null],
		['SD cell OCV (mV)', stats ? stats.sd * 1000 : null],
		['Window (V)', `${data.limits.ocv_min_v} – ${data.limits.ocv_max_v}`],
		['Model', `${data.model.version} (${data.model.source})`],
		['Decision', decision ? DECISION_KIND[decision.kind] : 'no decision yet'],
		['Decided by', decision ? decision.by : null],
		['Generated', dateTime(data.generated_at)]
	];
}

function writeSummary(sheet: Sheet, data: ReportData): void {
	const pairs = summaryPairs(data);
	pairs.forEach(([label, value], r) => {
		sheet
			.cell(r + 1, 1)
			.value(label)
			.style({ bold: true });
		if (value !== null) sheet.cell(r + 1, 2).value(value);
	});
	const reasonRows = data.disposition.reasons.map((reason): Cell[] => [
		REASON_SEVERITY[reason.severity].word,
		reason.code,
		reason.message,
		(reason.units ?? []).join(', ')
	]);
	writeTable(sheet, pairs.length + 2, ['severity', 'code', 'reason', 'units'], reasonRows);
	[28, 40, 70, 40].forEach((width, c) => sheet.column(c + 1).width(width));
}

const LOT_COLUMNS: Array<{ title: string; width: number; value(row: LotListRow): Cell }> = [
	{ title: 'lot code', width: 16, value: (r) => r.lot_code },
	{ title: 'PO number', width: 14, value: (r) => r.po_number },
	{ title: 'supplier', width: 28, value: (r) => r.supplier },
	{ title: 'part number', width: 20, value: (r) => r.part_number },
	{ title: 'chemistry', width: 11, value: (r) => r.chemistry },
	{ title: 'quantity', width: 10, value: (r) => r.quantity },
	{ title: 'status', width: 18, value: (r) => wordOf(LOT_STATUS, r.status) },
	{ title: 'declared SOC (%)', width: 16, value: (r) => pct(r.declared_soc) },
	{ title: 'transport', width: 10, value: (r) => wordOf(TRANSPORT, r.transport) },
	{ title: 'created', width: 22, value: (r) => dateTime(r.created_at) }
];

/** Filter values that are codes are written as the words the lot list shows. */
const FILTER_WORDS: Record<string, (value: string) => string> = {
	status: (value) => wordOf(LOT_STATUS, value),
	transport: (value) => wordOf(TRANSPORT, value)
};

/** Describes the filters in one line so a saved sheet still says what it contains. */
export function filterNote(filters: Record<string, string>): string {
	const applied = Object.entries(filters).filter(([, value]) => value !== '');
	if (applied.length === 0) return 'Filters applied: none (all lots)';
	const word = (key: string, value: string) => FILTER_WORDS[key]?.(value) ?? value;
	return `Filters applied: ${applied.map(([key, value]) => `${key} = ${word(key, value)}`).join('; ')}`;
}

/** The lot list as shown on screen: a note row with the filters, then the header and one row per lot. */
export async function lotListXlsx(rows: LotListRow[], filters: Record<string, string>): Promise<Buffer> {
	const workbook = await XlsxPopulate.fromBlankAsync();
	const sheet = workbook.sheet(0)!.name('Lots');
	sheet.cell(1, 1).value(filterNote(filters)).style(NOTE_STYLE);
	writeTable(
		sheet,
		2,
		LOT_COLUMNS.map((c) => c.title),
		rows.map((row) => LOT_COLUMNS.map((c) => c.value(row)))
	);
	LOT_COLUMNS.forEach((column, c) => sheet.column(c + 1).width(column.width));
	sheet.freezePanes(0, 2);
	return workbook.outputAsync();
}
