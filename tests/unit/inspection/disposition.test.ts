// Disposition rules: one test per reason code plus precedence. Unit results are built directly
// (the electrochem models are not involved). Rules come from the product brief; the 30 % SOC limit for
// lithium-ion cells shipped alone by air is from the IATA DG Regulations (PI 965/968 Section IA/IB,
// from memory) and the "do not recharge a deep-discharged Li-ion cell" rule is common practice.
import { describe, expect, it } from 'vitest';
import { decideLot, evaluateLot, samplingPlan, type DispositionInput, type UnitInput, type UnitResult } from '../../../src/lib/inspection';

const result = (o: Partial<UnitResult> = {}): UnitResult => ({
	soc: 0.25,
	soc_sigma: 0.02,
	soc_low: 0.21,
	soc_high: 0.29,
	determinate: true,
	ocv_cell_v: 3.65,
	ocv_at_25c_v: 3.65,
	expected_ocv_v: 3.65,
	residual_v: 0,
	flags: [],
	...o
});
// 13 units with a small, deterministic spread (±3 mV).
const goodUnits = (n = 13): UnitInput[] =>
	Array.from({ length: n }, (_, i) => {
		const v = 3.65 + ((i % 7) - 3) * 0.001;
		return { serial: `RV-${String(i + 1).padStart(3, '0')}`, result: result({ ocv_cell_v: v, ocv_at_25c_v: v }) };
	});
const base = (units = goodUnits()): DispositionInput => ({
	lot: { quantity: 60, declared_soc: 0.25, transport: 'air', lithium_ion: true, documents: ['coc', 'un38_3_summary'] },
	plan: samplingPlan({ lotSize: 60, aql: 6.5, level: 'II', severity: 'normal' }), // E: n 13, Ac 2, Re 3
	severity: 'normal',
	limits: {
		ocv_min_v: 3.5,
		ocv_max_v: 3.8,
		residual_tolerance_v: 0.02,
		spread_limit_mv: 30,
		outlier_k: 4,
		self_discharge_limit_mv_per_day: 3,
		declared_soc_tolerance: 0.1
	},
	units
});
const with_ = (i: number, o: Partial<UnitInput>, units = goodUnits()) => {
	units[i] = { ...units[i], ...o };
	return units;
};
// The base lot flies (IATA DGR PI 965), which always adds the cargo-aircraft-only note; the DG rules have their
// own tests (dangerous-goods.test.ts), so these rule tests leave the notes out.
const notes = (d: ReturnType<typeof decideLot>) => d.reasons.filter((r) => r.code !== 'dg_note');
const codes = (d: ReturnType<typeof decideLot>) => notes(d).map((r) => r.code);

describe('decideLot reasons', () => {
	it('clean lot is accepted', () => {
		const d = decideLot(base());
		expect(d.status).toBe('accept');
		expect(notes(d)).toEqual([]);
		expect(d.nonconforming).toBe(0);
	});
	it('deep_discharge -> reject, safety', () => {
		const d = decideLot(base(with_(2, { result: result({ flags: ['deep_discharge'], ocv_cell_v: 3.6, ocv_at_25c_v: 3.6 }) })));
		expect([d.status, d.safety]).toEqual(['reject', true]);
		expect(d.reasons.find((r) => r.code === 'deep_discharge')?.units).toEqual(['RV-003']);
	});
	it('nonconforming_over_limit when the count reaches Re (window, residual, self-discharge)', () => {
		let units = with_(0, { result: result({ ocv_cell_v: 3.45, ocv_at_25c_v: 3.45 }) });
		units = with_(1, { result: result({ residual_v: 0.05 }) }, units);
		const input = base(units);
		input.limits.spread_limit_mv = 500; // keep the spread hold out of this test
		const two = decideLot(input);
		expect([two.status, two.nonconforming]).toEqual(['accept', 2]);
		units = with_(2, { self_discharge_mv_per_day: 5 }, units);
		const three = decideLot({ ...input, units });
		expect(three.status).toBe('reject');
		expect(codes(three)).toEqual(
			expect.arrayContaining(['nonconforming_over_limit', 'outside_part_window', 'residual_over_tolerance', 'self_discharge_over_limit'])
		);
		expect(three.nonconforming_serials).toEqual(['RV-001', 'RV-002', 'RV-003']);
	});
	it('sample_incomplete -> pending', () => {
		const d = decideLot(base(goodUnits(12)));
		expect(d.status).toBe('pending');
		expect(codes(d)).toContain('sample_incomplete');
		expect(d.reasons.find((r) => r.code === 'sample_incomplete')?.message).toMatch(/no disposition until the sample is complete/);
	});
	it('a rejection part-way through the sample is not contradicted by "no disposition yet"', () => {
		// ISO 2859-1: once the nonconforming count reaches Re the lot is rejected; the rest need not be measured.
		let units = goodUnits(6);
		for (const i of [0, 1, 2]) units = with_(i, { self_discharge_mv_per_day: 5 }, units);
		const input = base(units);
		input.limits.spread_limit_mv = 500;
		const d = decideLot(input);
		expect(d.status).toBe('reject');
		const note = d.reasons.find((r) => r.code === 'sample_incomplete')?.message ?? '';
		expect(note).toMatch(/^6 of 13 sample units measured; the rejection above already decides the lot/);
		expect(note).not.toMatch(/no disposition/);
	});
	it('dg_soc_over_limit -> hold when a unit interval is wholly above 30 % (air, lithium-ion)', () => {
		const d = decideLot(base(with_(4, { result: result({ soc: 0.4, soc_low: 0.34, soc_high: 0.46 }) })));
		expect(d.status).toBe('hold');
		expect(d.reasons.find((r) => r.code === 'dg_soc_over_limit')?.units).toEqual(['RV-005']);
		const sea = base(with_(4, { result: result({ soc: 0.4, soc_low: 0.34, soc_high: 0.46 }) }));
		sea.lot.transport = 'sea';
		expect(codes(decideLot(sea))).not.toContain('dg_soc_over_limit');
	});
	it('declared_soc_mismatch -> hold only when the interval excludes declared ± tolerance', () => {
		const far = goodUnits().map((u) => ({ ...u, result: result({ soc: 0.6, soc_low: 0.55, soc_high: 0.65 }) }));
		const input = base(far);
		input.lot.transport = 'road';
		expect(codes(decideLot(input))).toEqual(['declared_soc_mismatch']);
		const near = goodUnits().map((u) => ({ ...u, result: result({ soc: 0.3, soc_low: 0.2, soc_high: 0.4 }) }));
		const ok = base(near);
		ok.lot.transport = 'road';
		expect(decideLot(ok).status).toBe('accept');
	});
	it('soc_indeterminate -> hold when most units have no SOC and a rule needs it', () => {
		const flat = goodUnits().map((u) => ({
			...u,
			result: result({ determinate: false, soc_low: 0.1, soc_high: 0.9, flags: ['soc_indeterminate'] })
		}));
		const d = decideLot(base(flat));
		expect(d.status).toBe('hold');
		expect(codes(d)).toEqual(['dg_soc_unverified', 'soc_indeterminate']);
		const noRule = base(flat);
		noRule.lot = { ...noRule.lot, declared_soc: null, transport: 'sea' };
		expect(decideLot(noRule).status).toBe('accept');
	});
	it('spread_over_limit -> hold', () => {
		const input = base();
		input.limits.spread_limit_mv = 5;
		expect(codes(decideLot(input))).toEqual(['spread_over_limit']);
	});
	it('documents_missing -> hold (CoC always, UN 38.3 summary for lithium)', () => {
		const input = base();
		input.lot.documents = ['coc'];
		expect(notes(decideLot(input))[0]).toMatchObject({ code: 'documents_missing', severity: 'hold' });
		input.lot.lithium_ion = false;
		expect(decideLot(input).status).toBe('accept');
	});
	it("documents_missing follows the part's required documents when given", () => {
		const input = base();
		input.lot.documents = ['coc', 'un38_3_summary'];
		input.lot.required_documents = ['coc', 'un38_3_summary', 'sds'];
		const d = decideLot(input);
		expect(d.status).toBe('hold');
		expect(notes(d)[0]).toMatchObject({ code: 'documents_missing', message: 'Missing: safety data sheet.' });
		// A lithium-metal coin cell is not lithium-ion, but its part can still require the UN 38.3 summary.
		input.lot.lithium_ion = false;
		input.lot.documents = ['coc'];
		input.lot.required_documents = ['coc', 'un38_3_summary'];
		expect(notes(decideLot(input))[0]).toMatchObject({ code: 'documents_missing', message: 'Missing: UN 38.3 test summary.' });
	});
	it('temperature_out_of_range -> hold', () => {
		const d = decideLot(base(with_(6, { result: result({ flags: ['temperature_out_of_range'] }) })));
		expect(d.status).toBe('hold');
		expect(d.reasons.find((r) => r.code === 'temperature_out_of_range')?.units).toEqual(['RV-007']);
	});
	it('outliers_present is advisory when the unit is within the part spread limit and SOC tolerance', () => {
		// 20 mV from the median, inside the 30 mV spread limit: the outlier rule is never stricter than the part.
		const d = decideLot(base(with_(8, { result: result({ ocv_cell_v: 3.67, ocv_at_25c_v: 3.67 }) })));
		expect(notes(d)).toEqual([expect.objectContaining({ code: 'outliers_present', severity: 'info', units: ['RV-009'] })]);
		expect(d.units[8].unit_flags).toContain('outlier');
		expect(d.nonconforming).toBe(0);
	});
	it('outliers_present counts when the unit is also beyond the part spread limit (n >= 8)', () => {
		const d = decideLot(base(with_(8, { result: result({ ocv_cell_v: 3.69, ocv_at_25c_v: 3.69 }) })));
		expect(d.nonconforming_serials).toEqual(['RV-009']);
	});
	it('outliers on a sample under 8 units only note', () => {
		const input = base(with_(3, { result: result({ ocv_cell_v: 3.69, ocv_at_25c_v: 3.69 }) }, goodUnits(5)));
		const d = decideLot(input);
		expect(d.units[3].unit_flags).toContain('outlier');
		expect(d.nonconforming).toBe(0);
		expect(notes(d).find((r) => r.code === 'outliers_present')?.message).toMatch(/Noted only/);
	});
	it('self_discharge_over_limit counts as nonconforming (info)', () => {
		const d = decideLot(base(with_(3, { self_discharge_mv_per_day: 4 })));
		expect(codes(d)).toEqual(['self_discharge_over_limit']);
		expect(d.nonconforming_serials).toEqual(['RV-004']);
	});
	it('reduced plan of ISO 2859-1:1999 (Re = Ac + 1): Ac accepts with no note, Re rejects', () => {
		const input = base();
		input.severity = 'reduced';
		input.plan = { code_letter: 'K', plan_code_letter: 'K', sample_size: 13, accept: 1, reject: 2, hundred_percent: false };
		input.units = with_(0, { self_discharge_mv_per_day: 9 });
		const accepted = decideLot(input);
		expect(accepted.status).toBe('accept');
		expect(codes(accepted)).toEqual(['self_discharge_over_limit']);
		input.units = with_(0, { self_discharge_mv_per_day: 9 }, with_(1, { self_discharge_mv_per_day: 9 }));
		const rejected = decideLot(input);
		expect(rejected.status).toBe('reject');
		expect(codes(rejected)).toContain('nonconforming_over_limit');
	});
});

describe('precedence and determinism', () => {
	it('reject beats hold beats accept', () => {
		const units = with_(0, { result: result({ flags: ['deep_discharge'], ocv_cell_v: 3.64, ocv_at_25c_v: 3.64 }) });
		const input = base(units);
		input.lot.documents = [];
		const d = decideLot(input);
		expect(codes(d)).toEqual(expect.arrayContaining(['deep_discharge', 'documents_missing']));
		expect(d.status).toBe('reject');
		const holdOnly = base();
		holdOnly.lot.documents = [];
		expect(decideLot(holdOnly).status).toBe('hold');
	});
	it('a certain reject is reported even while the sample is incomplete', () => {
		const d = decideLot(base(with_(0, { result: result({ flags: ['deep_discharge'] }) }, goodUnits(5))));
		expect(d.status).toBe('reject');
	});
	it('same input, same output', () => {
		expect(decideLot(base())).toEqual(decideLot(base()));
	});
});

describe('evaluateLot', () => {
	it('uses the latest reading per serial and derives self-discharge from readings ≥ 24 h apart', () => {
		const input = base();
		const readings = input.units.flatMap((u, i) => [
			{ serial: u.serial, measured_at: '2025-06-02T09:00:00Z', result: u.result },
			{
				serial: u.serial,
				measured_at: '2025-06-01T09:00:00Z',
				result: { ...u.result, ocv_at_25c_v: u.result.ocv_at_25c_v + (i === 5 ? 0.006 : 0.001) }
			}
		]);
		const { units: _u, ...rest } = input;
		const d = evaluateLot({ ...rest, readings });
		expect(d.units).toHaveLength(13);
		expect(d.units[5].self_discharge_mv_per_day).toBeCloseTo(6, 6);
		expect(d.units[0].self_discharge_mv_per_day).toBeCloseTo(1, 6);
		expect(d.units[0].ocv_at_25c_v).toBe(input.units[0].result.ocv_at_25c_v);
		expect(d.nonconforming_serials).toEqual(['RV-006']);
	});
	it('handles 10,000 units (speed is measured by npm run bench, not here)', () => {
		const units = goodUnits(10_000);
		const input = base(units);
		input.plan = { ...input.plan, sample_size: 10_000, accept: 500, reject: 501 };
		const d = decideLot(input);
		expect(d.units).toHaveLength(10_000);
		expect(d.status).toBe('accept');
	});
});
