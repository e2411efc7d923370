/**
 * The meter import's OCV unit (inspect/ocv-unit.ts): a header saying mV, or values that fit the part
 * only as millivolts, make the column mV. 1 mV = 10⁻³ V (SI prefix milli). Parts invented: an NMC cell
 * 3.00–4.18 V and a 10-series pack of it; the plausible margins are the entry guard's own.
 */
import { describe, expect, it } from 'vitest';
import { guessOcvUnit } from '../../../src/routes/(app)/lots/[id=uuid]/inspect/ocv-unit';

const cell = { ocv_min_cell_v: 3.0, ocv_max_cell_v: 4.18, cells_in_series: 1 };
const pack = { ...cell, cells_in_series: 10 };

describe('OCV unit of a meter column', () => {
	it('reads an unlabeled column of 3652-like values as mV, and says why', () => {
		const g = guessOcvUnit('Voltage', ['3652', '3648,5', '3660'], cell);
		expect(g.unit).toBe('mV');
		expect(g.why).toBe(
			'The OCV column holds values like 3652, which fit this part (3.00–4.18 V) only as millivolts, so they are read as mV.'
		);
	});

	it('follows a header that says millivolts', () => {
		expect(guessOcvUnit('OCV [mV]', ['3.65'], cell)).toEqual({ unit: 'mV', why: 'The OCV column’s header “OCV [mV]” says millivolts.' });
		expect(guessOcvUnit('Spannung (millivolt)', [], cell).unit).toBe('mV');
	});

	it('keeps volts for values that fit as volts: a cell at 3.65 V, a pack at 36.5 V', () => {
		expect(guessOcvUnit('OCV', ['3.652', '3.648', 'n/a'], cell)).toEqual({ unit: 'V', why: null });
		expect(guessOcvUnit('OCV', ['36.52', '36.48'], pack)).toEqual({ unit: 'V', why: null });
		// 36 520 mV fits the pack only as millivolts.
		expect(guessOcvUnit('OCV', ['36520', '36480'], pack).unit).toBe('mV');
	});

	it('says nothing when the column is empty or fits neither way', () => {
		expect(guessOcvUnit('OCV', ['', ' '], cell)).toEqual({ unit: 'V', why: null });
		expect(guessOcvUnit('OCV', ['250'], cell)).toEqual({ unit: 'V', why: null });
	});
});
