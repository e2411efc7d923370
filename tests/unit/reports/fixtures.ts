import type { ReportData, ReportUnit, TagData } from '../../../src/lib/server/reports/types';
import { mulberry32 } from '../../../seed/random';

/** Invented demo data only: the companies, parts and serials below do not exist. */

export function makeUnits(count: number, deepDischargedAt: number[] = []): ReportUnit[] {
	const random = mulberry32(count * 7919); // seeded: the fixtures are the same on every run
	return Array.from({ length: count }, (_, i) => {
		const deep = deepDischargedAt.includes(i);
		const cell = deep ? 1.92 + random() * 0.1 : 3.615 + (random() - 0.5) * 0.03;
		const temperature = 21 + random() * 4;
		const expected = 3.62;
		return {
			serial: `OCW-${String(240000 + i * 13).padStart(7, '0')}`,
			ocv_v: cell * 2,
			temperature_c: temperature,
			ac_resistance_mohm: deep ? null : 18 + random() * 4,
			ocv_cell_v: cell,
			ocv_at_25c_v: cell + (25 - temperature) * -0.0002,
			soc: deep ? 0 : 0.29 + (cell - 3.615) * 4,
			soc_sigma: 0.021,
			soc_low: deep ? 0 : 0.25,
			soc_high: deep ? 0.02 : 0.33,
			determinate: !deep || i % 2 === 0,
			expected_ocv_v: expected,
			residual_v: cell - expected,
			flags: deep ? ['below minimum voltage', 'do not charge'] : [],
			nonconforming: deep
		};
	});
}

export function makeReport(overrides: Partial<ReportData> = {}, unitCount = 300): ReportData {
	const deepAt = [17, 141, unitCount - 3].filter((i) => i >= 0 && i < unitCount);
	const units = makeUnits(unitCount, deepAt);
	const cells = units.map((u) => u.ocv_at_25c_v);
	const sorted = [...cells].sort((a, b) => a - b);
	const mean = cells.reduce((s, v) => s + v, 0) / Math.max(cells.length, 1);
	return {
		generated_at: '2031-05-14T08:42:00.000Z',
		company: { name: 'Lumivale Drives GmbH' },
		lot: {
			id: '5d0b6c1e-3a77-4c1b-9f4e-1c2d3e4f5a6b',
			lot_code: 'LV-2031-0457',
			po_number: 'PO-88120',
			status: 'rejected',
			quantity: 3200,
			declared_soc: 0.3,
			transport: 'air',
			un_number: 'UN 3480',
			packing: 'alone',
			dg_rule: 'IATA DGR 67th ed. PI 965',
			received_at: '2031-05-12T13:05:00.000Z',
			created_at: '2031-05-02T09:00:00.000Z'
		},
		supplier: { name: 'Ostrand Cellworks Co.' },
		part: {
			part_number: 'OC-2S1P-21700-48',
			description: 'Two-cell NMC module, 21700 format, welded strip',
			chemistry: 'NMC',
			cells_in_series: 2,
			cells_in_parallel: 1,
			nominal_capacity_ah: 4.8
		},
		plan: {
			code_letter: 'L',
			plan_code_letter: 'L',
			sample_size: 200,
			accept: 3,
			reject: 4,
			aql: 0.65,
			level: 'II',
			hundred_percent: false
		},
		severity: 'normal',
		disposition: {
			status: 'reject',
			safety: true,
			nonconforming: 3,
			reasons: [
				{
					code: 'DEEP_DISCHARGE',
					severity: 'reject',
					message: 'Three units rest below the minimum cell voltage of 2.500 V and must not be recharged.',
					units: deepAt.map((i) => units[i].serial)
				},
				{ code: 'SOC_DECLARED', severity: 'info', message: 'Estimated lot SOC agrees with the declared 30 % within its uncertainty.' }
			]
		},
		stats: {
			count: cells.length,
			mean,
			sd: Math.sqrt(cells.reduce((s, v) => s + (v - mean) ** 2, 0) / Math.max(cells.length - 1, 1)),
			median: sorted[Math.floor(sorted.length / 2)] ?? 0,
			mad: 0.006,
			min: sorted[0] ?? 0,
			max: sorted.at(-1) ?? 0,
			range: (sorted.at(-1) ?? 0) - (sorted[0] ?? 0)
		},
		variables: { method: 'sigma unknown (s method)', result: 'not applied', detail: 'Attribute plan decided this lot.' },
		limits: { ocv_min_v: 2.5, ocv_max_v: 4.2, expected_ocv_v: 3.62 },
		units,
		model: { version: 'nmc-nernst-rk 2.3.1', chemistry: 'NMC', source: 'Fitted to invented bench data, Restvolt demo set' },
		decision: { by: 'rule engine', at: '2031-05-14T08:40:00.000Z', kind: 'automatic', reason: null },
		...overrides
	};
}

export function makeTag(overrides: Partial<TagData> = {}): TagData {
	return {
		lot_code: 'LV-2031-0457',
		po_number: 'PO-88120',
		status: 'rejected',
		supplier: 'Ostrand Cellworks Co.',
		part_number: 'OC-2S1P-21700-48',
		chemistry: 'NMC',
		quantity: 3200,
		reason: 'Three sampled units rest below the minimum cell voltage (deep discharge).',
		safety: true,
		date: '2031-05-14',
		url: 'https://restvolt.example/lots/5d0b6c1e-3a77-4c1b-9f4e-1c2d3e4f5a6b',
		...overrides
	};
}
