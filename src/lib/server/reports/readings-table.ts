import type { PDFPage } from 'pdf-lib';
import { paragraph } from './blocks';
import { fixed, formatSocInterval, MISSING } from '$lib/format';
import type { Cursor } from './layout';
import { palette } from './palette';
import { cross } from './shapes';
import { drawTable, type Column } from './table';
import type { ReportUnit } from './types';

/** SOC with its 95 % interval ("38 % (31–45 %)"), or in words when the interval cannot place the cell. */
function socCell(unit: ReportUnit): string {
	return formatSocInterval(unit);
}

function flagsCell(unit: ReportUnit): string {
	const flags = unit.flags.join(', ');
	if (unit.nonconforming) return flags ? `NC: ${flags}` : 'NC';
	return flags || MISSING;
}

const COLUMNS: Column<ReportUnit>[] = [
	{ title: '#', weight: 4.5, align: 'right', cell: (_u, i) => String(i + 1) },
	{ title: 'serial', weight: 12, align: 'left', cell: (u) => u.serial },
	{ title: 'OCV V', weight: 8, align: 'right', cell: (u) => fixed(u.ocv_v, 3) },
	{ title: 'T °C', weight: 6, align: 'right', cell: (u) => fixed(u.temperature_c, 1) },
	{ title: 'cell V @25 °C', weight: 10.5, align: 'right', cell: (u) => fixed(u.ocv_at_25c_v, 4) },
	{ title: 'SOC (95 % interval)', weight: 15.5, align: 'right', cell: socCell },
	{ title: 'expected V', weight: 8.5, align: 'right', cell: (u) => fixed(u.expected_ocv_v, 4) },
	{ title: 'residual mV', weight: 9, align: 'right', cell: (u) => fixed(u.residual_v === null ? null : u.residual_v * 1000, 1) },
	{ title: 'flags', weight: 20, align: 'left', cell: flagsCell }
];

/** Packs with cell-group voltages: their lowest–highest group, taken out of the flags column's width. */
const GROUP_COLUMN: Column<ReportUnit> = {
	title: 'groups V min–max',
	weight: 10.5,
	align: 'right',
	cell: (u) =>
		u.cell_group_min_v == null || u.cell_group_max_v == null ? MISSING : `${fixed(u.cell_group_min_v, 3)}–${fixed(u.cell_group_max_v, 3)}`
};

function columnsFor(units: readonly ReportUnit[]): Column<ReportUnit>[] {
	if (!units.some((u) => u.cell_group_min_v != null)) return COLUMNS;
	const flags = COLUMNS.at(-1)!;
	return [...COLUMNS.slice(0, -1), GROUP_COLUMN, { ...flags, weight: flags.weight - GROUP_COLUMN.weight }];
}

/** Nonconforming rows get a cross in the margin and a faint tint: shape and the "NC" word, not colour alone. */
function markNonconforming(page: PDFPage, unit: ReportUnit, box: { x: number; y: number; width: number; height: number }): void {
	if (!unit.nonconforming) return;
	page.drawRectangle({ ...box, color: palette.rejectMist });
	cross(page, box.x + 4, box.y + box.height / 2, 2.2, palette.reject, 1);
}

export function drawReadingsTable(cursor: Cursor, units: ReportUnit[]): void {
	if (units.length === 0) {
		paragraph(cursor, 'No readings recorded for this lot yet.', { size: 9, color: palette.inkSoft });
		cursor.gap(8);
		return;
	}
	drawTable(cursor, columnsFor(units), units, { decorate: markNonconforming, continuedTitle: 'Readings (continued)' });
}
