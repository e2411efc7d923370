// Packs: the weakest cell group counts. Thresholds are not new here: a group is judged against the
// chemistry model's own rest-voltage limits (min_safe_v, max_v in src/lib/electrochem/models, which
// mark them "common practice"; Li-ion discharge cut-off 2.5 V and charge limit ≈ 4.2 V per cell as in
// Linden's Handbook of Batteries, 4th ed., lithium-ion chapter, from memory). The part's imbalance
// limit (default 50 mV) is common practice for a balanced pack at rest. The pack readings go through
// the real NMC library model, so "the average is fine" is the electrochem core's own verdict.
import { describe, expect, it } from 'vitest';
import { evaluateReading, getLibraryModel } from '../../../src/lib/electrochem';
import {
	cellGroupProblems,
	checkCellGroups,
	decideLot,
	evaluateLot,
	samplingPlan,
	type DispositionInput,
	type UnitInput
} from '../../../src/lib/inspection';

const NMC = getLibraryModel('NMC');
const SERIES = 10;
const cellLimits = { min_safe_v: NMC.min_safe_v, max_v: NMC.max_v };

/** A 10s pack: every group at `v` except the ones given. */
const groups = (v: number, changes: Record<number, number> = {}) =>
	Array.from({ length: SERIES }, (_, i) => changes[i + 1] ?? v + ((i % 3) - 1) * 0.002);

function pack(serial: string, cellGroups: number[] | null, packV = (cellGroups ?? groups(3.7)).reduce((a, v) => a + v, 0)): UnitInput {
	const result = evaluateReading(NMC, { ocv_v: packV, temperature_c: 25 }, { cells_in_series: SERIES });
	return { serial, result, cell_group_voltages: cellGroups };
}

const lot = (units: UnitInput[], imbalance = 50): DispositionInput => ({
	lot: { quantity: 20, declared_soc: null, transport: 'road', lithium_ion: true, documents: ['coc', 'un38_3_summary'] },
	plan: samplingPlan({ lotSize: 20, aql: 6.5, level: 'II', severity: 'normal' }), // C → D: n 8, Ac 1, Re 2
	severity: 'normal',
	limits: {
		ocv_min_v: 3.0,
		ocv_max_v: 4.2,
		residual_tolerance_v: 0.05,
		spread_limit_mv: 400,
		outlier_k: 4,
		self_discharge_limit_mv_per_day: 3,
		declared_soc_tolerance: 0.1,
		imbalance_limit_mv: imbalance
	},
	units,
	cells_in_series: SERIES,
	cell_limits: cellLimits
});
/** The first pack and seven sound ones, their levels a few mV apart as in a real lot. */
const eightPacks = (first: UnitInput) => [
	first,
	...[2, 3, 4, 5, 6, 7, 8].map((i) => pack(`PK-00${i}`, groups(3.7 + ((i % 4) - 1.5) * 0.006)))
];
const codes = (d: ReturnType<typeof decideLot>) => d.reasons.map((r) => r.code);

describe('checkCellGroups', () => {
	it('finds the weakest and strongest group and the imbalance in mV', () => {
		const c = checkCellGroups([3.7, 3.71, 3.64, 3.69], { ...cellLimits, imbalance_limit_mv: 50 });
		expect(c).toMatchObject({ count: 4, min_v: 3.64, max_v: 3.71, weakest_group: 3, deep_discharge_groups: [], over_voltage_groups: [] });
		expect(c.imbalance_mv).toBeCloseTo(70, 9);
		expect(c.imbalance_over_limit).toBe(true);
	});
	it('numbers the groups below min_safe_v and above max_v (1-based)', () => {
		const c = checkCellGroups([3.7, 2.1, 4.3, 2.4], { ...cellLimits, imbalance_limit_mv: 5000 });
		expect([c.deep_discharge_groups, c.over_voltage_groups, c.imbalance_over_limit]).toEqual([[2, 4], [3], false]);
	});
});

describe('weakest group in the disposition', () => {
	it('one dead group triggers deep discharge although the average cell voltage is fine', () => {
		const weak = groups(3.7, { 7: 1.9 });
		const unit = pack('PK-001', weak);
		// The electrochem core sees only the average (≈ 3.52 V per cell): no deep discharge there.
		expect(unit.result.ocv_cell_v).toBeGreaterThan(NMC.min_safe_v + 0.5);
		expect(unit.result.flags).not.toContain('deep_discharge');
		const d = decideLot(lot(eightPacks(unit)));
		expect([d.status, d.safety]).toEqual(['reject', true]);
		const deep = d.reasons.find((r) => r.code === 'deep_discharge');
		expect(deep?.units).toEqual(['PK-001']);
		expect(deep?.message).toContain('PK-001 group 7 at 1.900 V');
		expect(d.units[0].cell_groups).toMatchObject({ weakest_group: 7, min_v: 1.9 });
	});
	it('the same pack read without its groups is not flagged, and the lot says why it cannot see it', () => {
		const blind = pack(
			'PK-001',
			null,
			groups(3.7, { 7: 1.9 }).reduce((a, v) => a + v, 0)
		);
		const d = decideLot(lot(eightPacks(blind)));
		expect(d.safety).toBe(false);
		const note = d.reasons.find((r) => r.code === 'cell_groups_not_recorded');
		expect(note).toMatchObject({ severity: 'info', units: ['PK-001'] });
		expect(note?.message).toContain('one dead cell group can hide in the total');
	});
	it('imbalance over the part limit makes the unit nonconforming; under it, none', () => {
		const spread = groups(3.7, { 3: 3.62 }); // ≈ 82 mV between groups
		const over = decideLot(lot(eightPacks(pack('PK-001', spread)), 50));
		expect(over.nonconforming_serials).toEqual(['PK-001']);
		expect(over.reasons.find((r) => r.code === 'imbalance_over_limit')?.units).toEqual(['PK-001']);
		const within = decideLot(lot(eightPacks(pack('PK-001', spread)), 100));
		expect(within.nonconforming).toBe(0);
		expect(within.status).toBe('accept');
	});
	it('an overcharged group holds the lot (over_voltage)', () => {
		const d = decideLot(lot(eightPacks(pack('PK-001', groups(4.1, { 2: 4.32 })))));
		expect(d.units[0].unit_flags).toContain('over_voltage');
		expect(d.reasons.find((r) => r.code === 'over_voltage')).toMatchObject({ severity: 'hold', units: ['PK-001'] });
		expect(d.status).toBe('hold');
	});
	it('groups whose count no longer matches the series count are not used', () => {
		const d = decideLot({ ...lot(eightPacks(pack('PK-001', groups(3.7, { 7: 1.9 })))), cells_in_series: 12 });
		expect(d.safety).toBe(false);
		expect(codes(d)).toContain('cell_groups_not_recorded');
	});
	it('a later reading without groups (second OCV) keeps the groups of the earlier one', () => {
		const first = pack('PK-001', groups(3.7, { 7: 1.9 }));
		const later = pack('PK-001', null, 35.2);
		const rest = eightPacks(first).slice(1);
		const d = evaluateLot({
			...lot([]),
			readings: [
				{ serial: 'PK-001', measured_at: '2031-05-01T10:00:00Z', result: first.result, cell_group_voltages: first.cell_group_voltages },
				{ serial: 'PK-001', measured_at: '2031-05-02T10:00:00Z', result: later.result, cell_group_voltages: null },
				...rest.map((u) => ({
					serial: u.serial,
					measured_at: '2031-05-01T10:00:00Z',
					result: u.result,
					cell_group_voltages: u.cell_group_voltages
				}))
			]
		});
		expect(d.reasons.find((r) => r.code === 'deep_discharge')?.units).toEqual(['PK-001']);
	});
});

describe('cellGroupProblems (what the API refuses)', () => {
	const pack10 = { cells_in_series: 10, ocv_v: 37 };
	it('accepts ten plausible groups that add up to the pack voltage', () => {
		expect(cellGroupProblems(groups(3.7), pack10)).toEqual([]);
	});
	it('refuses a count other than the series count, out-of-range values and a sum far from the pack OCV', () => {
		expect(cellGroupProblems(groups(3.7).slice(1), pack10)[0]).toContain('expected 10 group voltages');
		expect(cellGroupProblems(groups(3.7, { 4: 3700 }), pack10)[0]).toContain('group(s) 4');
		expect(cellGroupProblems(groups(3.7, { 4: Number.NaN }), pack10)[0]).toContain('group(s) 4');
		expect(cellGroupProblems(groups(3.3), pack10)[0]).toContain('add up to');
		expect(cellGroupProblems([3.7], { cells_in_series: 1, ocv_v: 3.7 })[0]).toContain('packs only');
	});
});
