/**
 * The entry guard (src/lib/inspection/entry-guard.ts). Windows: an NMC cell part 3.00–4.18 V and a
 * 10-series pack of it (the demo's invented parts); the margins are Restvolt's own choice (see the module).
 */
import { describe, expect, it } from 'vitest';
import { guardOcv, implausibleMessage, plausibleWindow } from '$lib/inspection/entry-guard';

const cell = { ocv_min_cell_v: 3.0, ocv_max_cell_v: 4.18, cells_in_series: 1 };
const pack = { ...cell, cells_in_series: 10 };

describe('entry guard', () => {
	it('widens the window by its margins, per cell × cells in series', () => {
		const w = plausibleWindow(pack);
		expect(w.window_low_v).toBeCloseTo(30, 9);
		expect(w.window_high_v).toBeCloseTo(41.8, 9);
		expect(w.plausible_low_v).toBeCloseTo(15, 9);
		expect(w.plausible_high_v).toBeCloseTo(52.25, 9);
	});

	it('lets in-window values and deeply discharged cells pass without a question', () => {
		expect(guardOcv(3.65, cell)).toEqual({ plausible: true, suggestion: null });
		expect(guardOcv(2.1, cell).plausible).toBe(true); // 0.4 V under NMC's 2.5 V minimum: a real finding
		expect(guardOcv(5.2, cell).plausible).toBe(true);
	});

	it('offers the decimal shift for 36.5 and the mV reading for 3652', () => {
		expect(guardOcv(36.5, cell)).toEqual({ plausible: false, suggestion: { value_v: 3.65, slip: 'decimal_shift' } });
		expect(guardOcv(3652, cell)).toEqual({ plausible: false, suggestion: { value_v: 3.652, slip: 'millivolts' } });
		expect(guardOcv(0.365, cell)).toEqual({ plausible: false, suggestion: { value_v: 3.65, slip: 'decimal_shift' } });
	});

	it('offers cell × series when a cell voltage is typed for a pack', () => {
		expect(guardOcv(3.6, pack)).toEqual({ plausible: false, suggestion: { value_v: 36, slip: 'cell_for_pack' } });
	});

	it('offers nothing when no slip lands in the window', () => {
		expect(guardOcv(0.9, cell)).toEqual({ plausible: false, suggestion: null });
	});

	it('says it in one sentence with the window and the suggestion', () => {
		expect(implausibleMessage(36.5, cell)).toBe(
			'36.5 V is far outside 3.00–4.18 V. Did you mean 3.65 V (the decimal point may be in the wrong place)?'
		);
		expect(implausibleMessage(0.9, cell)).toBe('0.9 V is far outside 3.00–4.18 V. Check the value; if it is right, confirm it.');
	});
});
