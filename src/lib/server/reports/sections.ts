import { pairColumns, paragraph, type Pair } from './blocks';
import { ampereHours, count, dateTime, millivolts, percent, quantity, volts, MISSING } from '$lib/format';
import { DECISION_KIND, INSPECTION_SEVERITY, LOT_STATUS, TRANSPORT, VARIABLES_RESULT, wordOf } from '$lib/status';
import { sectionTitle, type Cursor } from './layout';
import { palette } from './palette';
import type { ReportData } from './types';
import { EDITION } from '$lib/inspection/iso2859/tables';

const PACKING_WORDS: Record<string, string> = {
	alone: 'On their own',
	with_equipment: 'Packed with equipment',
	in_equipment: 'Contained in equipment'
};

export function drawLotSection(cursor: Cursor, data: ReportData): void {
	const { lot, supplier, part } = data;
	sectionTitle(cursor, 'Lot, supplier and part');
	const left: Pair[] = [
		['Lot code', lot.lot_code],
		['PO number', lot.po_number],
		['Lot status', wordOf(LOT_STATUS, lot.status)],
		['Quantity', quantity(lot.quantity)],
		['Declared SOC', percent(lot.declared_soc)],
		['Transport', TRANSPORT[lot.transport]],
		['UN number', lot.un_number ?? MISSING],
		['Packing', PACKING_WORDS[lot.packing] ?? lot.packing],
		['DG rule applied', lot.dg_rule ?? 'None (no UN number of the rules table)'],
		['Received', dateTime(lot.received_at)],
		['Registered', dateTime(lot.created_at)]
	];
	const right: Pair[] = [
		['Supplier', supplier.name],
		['Part number', part.part_number],
		['Description', part.description || MISSING],
		['Chemistry', part.chemistry],
		['Configuration', `${part.cells_in_series}S${part.cells_in_parallel}P`],
		['Nominal capacity', ampereHours(part.nominal_capacity_ah)],
		['Buyer', data.company.name]
	];
	pairColumns(cursor, left, right);
}

export function drawPlanSection(cursor: Cursor, data: ReportData): void {
	sectionTitle(cursor, `Sampling plan (${EDITION})`);
	const { plan } = data;
	if (!plan) {
		paragraph(cursor, `No sampling plan recorded. Inspection severity: ${wordOf(INSPECTION_SEVERITY, data.severity)}.`, {
			size: 9,
			color: palette.ink
		});
		cursor.gap(8);
		return;
	}
	const size = plan.hundred_percent ? `${count(plan.sample_size)} (100 % inspection)` : count(plan.sample_size);
	const left: Pair[] = [
		['Code letter', plan.code_letter],
		['Plan code letter', plan.plan_code_letter],
		['Inspection level', plan.level],
		['Severity', wordOf(INSPECTION_SEVERITY, data.severity)]
	];
	const right: Pair[] = [
		['Sample size n', size],
		['Ac / Re', `${plan.accept} / ${plan.reject}`],
		['AQL', `${plan.aql} %`]
	];
	pairColumns(cursor, left, right);
}

export function drawStatsSection(cursor: Cursor, data: ReportData): void {
	sectionTitle(cursor, 'Statistics (cell OCV corrected to 25 °C)');
	const { stats, variables } = data;
	if (!stats) {
		paragraph(cursor, 'No statistics: no readings recorded.', { size: 9, color: palette.inkSoft });
		cursor.gap(8);
	} else {
		const left: Pair[] = [
			['Units measured', count(stats.count)],
			['Mean', volts(stats.mean, 4)],
			['Standard deviation', millivolts(stats.sd)],
			['Median', volts(stats.median, 4)]
		];
		const right: Pair[] = [
			['MAD', millivolts(stats.mad)],
			['Minimum', volts(stats.min, 4)],
			['Maximum', volts(stats.max, 4)],
			['Range', millivolts(stats.range)]
		];
		pairColumns(cursor, left, right);
	}
	if (variables) {
		paragraph(cursor, `Variables check (${variables.method}): ${wordOf(VARIABLES_RESULT, variables.result)}. ${variables.detail}`, {
			size: 9,
			color: palette.ink
		});
		cursor.gap(6);
	}
}

/** σ in V, or for a chemistry calibrated in SOC against published cells its largest σ in SOC. */
function modelErrorText(model: ReportData['model']): string {
	if (model.sigma_model_soc_max != null) return `up to ${percent(model.sigma_model_soc_max)} SOC (published cells)`;
	return millivolts(model.sigma_model_v);
}

export function drawModelSection(cursor: Cursor, data: ReportData): void {
	sectionTitle(cursor, 'Model and decision');
	const { model, decision } = data;
	const left: Pair[] = [
		['Model version', model.version],
		['Model chemistry', model.chemistry],
		['Model source', model.source],
		['Model error σ', modelErrorText(model)]
	];
	const right: Pair[] = decision
		? [
				['Decided by', decision.by],
				['Decided at', dateTime(decision.at)],
				['Kind', DECISION_KIND[decision.kind]],
				['Override reason', decision.reason ?? MISSING]
			]
		: [['Decided by', 'no decision recorded yet']];
	pairColumns(cursor, left, right);
}
