/**
 * The bench's browser evaluation (src/routes/(app)/lots/[id=uuid]/inspect/live-evaluation.ts) gives
 * each unit the flags the server's evaluation gives it, and the grid never shows such a unit "in
 * window". The lot is invented: twelve NMC cells on the generic library curve, one far below the rest.
 */
import { describe, expect, it } from 'vitest';
import { getLibraryModel } from '$lib/electrochem';
import { samplingPlan, type PartLimits } from '$lib/inspection';
import { computeEvaluation, type EvaluationInputs } from '$lib/server/services/evaluation';
import { benchDisposition, benchReadings, type BenchInputs } from '../../../src/routes/(app)/lots/[id=uuid]/inspect/live-evaluation';
import { unitFeedback } from '../../../src/routes/(app)/lots/[id=uuid]/inspect/row-feedback';

const model = getLibraryModel('NMC');
const limits: PartLimits = {
	ocv_min_v: 3.0,
	ocv_max_v: 4.2,
	residual_tolerance_v: 0.05,
	spread_limit_mv: 40,
	outlier_k: 3.5,
	self_discharge_limit_mv_per_day: 2,
	declared_soc_tolerance: 0.1
};
const lot = {
	quantity: 500,
	declared_soc: 0.5,
	transport: 'road' as const,
	lithium_ion: true,
	documents: ['coc' as const, 'un38_3_summary' as const],
	packing: 'alone' as const,
	un_number: 'UN3480',
	dg_family: 'lithium_ion' as const,
	energy_wh: 18
};
const part = { cells_in_series: 1, meter_accuracy_v: 0.001, aql: 1 };
const planRequest = { lot_size: 500, aql: 1, level: 'II' as const, severity: 'normal' as const };
const plan = samplingPlan({ lotSize: 500, aql: 1, level: 'II', severity: 'normal' });

// Twelve cells near 3.72 V, one 150 mV below: a robust outlier farther from the median than the 40 mV spread limit.
const ocvs = [3.721, 3.718, 3.724, 3.72, 3.719, 3.723, 3.722, 3.717, 3.725, 3.72, 3.721, 3.57];
const readings = ocvs.map((ocv_v, i) => ({
	serial: `DEMO-${String(i + 1).padStart(3, '0')}`,
	ocv_v,
	temperature_c: 23,
	measured_at: new Date(Date.UTC(2031, 4, 15, 10, i)).toISOString()
}));

function serverInputs(): EvaluationInputs {
	return {
		lot: { ...lot, id: 'lot', lot_code: 'DEMO-LOT', status: 'in_inspection', last_direction: 'unknown' },
		part: { id: 'p', part_number: 'DEMO-P', chemistry: 'NMC', cells_in_parallel: 1, inspection_level: 'II', ...part },
		limits,
		plan_request: planRequest,
		switching_state: 'normal',
		model,
		readings: {
			id: readings.map((_, i) => i + 1),
			serial: readings.map((r) => r.serial),
			ocv_v: readings.map((r) => r.ocv_v),
			temperature_c: readings.map((r) => r.temperature_c),
			measured_at: readings.map((r) => r.measured_at)
		}
	};
}

const benchInputs: BenchInputs = { lot: { ...lot, last_direction: 'unknown' }, part, limits, model, plan, severity: 'normal' };

describe('bench evaluation in the browser', () => {
	it('gives every unit the flags, SOC and nonconformity of the server evaluation', () => {
		const server = computeEvaluation(serverInputs(), plan);
		const live = benchDisposition(benchInputs, readings);
		expect(live.units.map((u) => [u.serial, u.unit_flags, u.nonconforming, u.soc_low, u.soc_high])).toEqual(
			server.units.map((u) => [u.serial, u.unit_flags, u.nonconforming, u.soc_low, u.soc_high])
		);
		expect(live.status).toBe(server.status);
		expect(live.nonconforming_serials).toEqual(['DEMO-012']);
	});

	it('never shows a unit the server counts nonconforming as "in window"', () => {
		const server = computeEvaluation(serverInputs(), plan);
		const odd = server.units.find((u) => u.serial === 'DEMO-012')!;
		expect(odd.nonconforming).toBe(true);
		const codes = unitFeedback({ cellsInSeries: 1, limits, airSocLimit: null }, odd).findings.map((f) => f.code);
		expect(codes).toContain('nonconforming');
		expect(codes).toContain('outlier');
		expect(codes).not.toContain('in_window');
		for (const unit of server.units.filter((u) => u.nonconforming)) {
			expect(unitFeedback({ cellsInSeries: 1, limits }, unit).findings.map((f) => f.code)).not.toContain('in_window');
		}
	});

	it('calls a conforming unit "in window"', () => {
		const live = benchDisposition(benchInputs, readings);
		const fine = live.units.find((u) => u.serial === 'DEMO-001')!;
		expect(fine.nonconforming).toBe(false);
		expect(unitFeedback({ cellsInSeries: 1, limits }, fine).findings.map((f) => f.code)).toEqual(['in_window']);
	});
});

describe('the readings the bench evaluates', () => {
	const stored = [{ ...readings[0], id: 1, client_key: 'key-aaaaaaaa' }];
	const session = [
		{ ...readings[0], client_key: 'key-aaaaaaaa' },
		{ ...readings[1], client_key: 'key-bbbbbbbb' }
	];

	it('counts a row saved in this visit once, whether or not the page data has it yet', () => {
		expect(benchReadings(stored, session, null, null).map((r) => r.serial)).toEqual(['DEMO-001', 'DEMO-002']);
	});

	it('adds the row being typed, in place of a reading brought back to be fixed', () => {
		const typed = { ...readings[2], serial: 'DEMO-001', ocv_v: 3.7 };
		expect(benchReadings(stored, session, typed, null)).toHaveLength(3);
		const fixed = benchReadings(stored, session, typed, { id: 1, client_key: 'key-aaaaaaaa' });
		expect(fixed.map((r) => [r.serial, r.ocv_v])).toEqual([
			['DEMO-002', 3.718],
			['DEMO-001', 3.7]
		]);
	});
});
