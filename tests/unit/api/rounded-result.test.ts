// POST /api/v1/ocv/evaluate and GET …/evaluation answer unit numbers rounded to 1e-6 (1 µV,
// 0.0001 % SOC): the answer keeps every field, nulls and flags, and each number moves by at most
// half a millionth.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluateReadings, getLibraryModel, type UnitResult } from '$lib/electrochem';
import { roundedResult } from '../../../src/lib/server/services/evaluation-body';

const NUMBERS = ['soc', 'soc_sigma', 'soc_low', 'soc_high', 'ocv_cell_v', 'ocv_at_25c_v', 'expected_ocv_v', 'residual_v'] as const;

describe('roundedResult', () => {
	it('moves each finite number by at most 5e-7 onto the 1e-6 grid, and keeps the other fields', () => {
		const value = fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e6, max: 1e6 });
		fc.assert(
			fc.property(fc.array(value, { minLength: 8, maxLength: 8 }), fc.boolean(), (numbers, determinate) => {
				const u = Object.fromEntries(NUMBERS.map((k, i) => [k, numbers[i]])) as unknown as UnitResult;
				u.determinate = determinate;
				u.flags = determinate ? [] : ['soc_indeterminate'];
				const r = roundedResult(u);
				for (const k of NUMBERS) {
					const x = u[k] as number;
					const y = r[k] as number;
					expect(Math.abs(y - x)).toBeLessThanOrEqual(5e-7 + Math.abs(x) * 1e-15);
					expect(Math.abs(y * 1e6 - Math.round(y * 1e6))).toBeLessThan(1e-3);
				}
				expect(r.determinate).toBe(determinate);
				expect(r.flags).toEqual(u.flags);
			})
		);
	});

	it('keeps the nulls of a reading without a declared SOC and the flags of a deep-discharged one', () => {
		const model = getLibraryModel('NMC');
		const [mid, deep] = evaluateReadings(model, [
			{ ocv_v: 3.7, temperature_c: 25 },
			{ ocv_v: 2.1, temperature_c: 25 }
		]).map(roundedResult);
		expect(mid.expected_ocv_v).toBeNull(); // no declared SOC: nothing to expect
		expect(mid.residual_v).toBeNull();
		expect(deep.flags).toContain('deep_discharge');
		expect(JSON.parse(JSON.stringify(mid))).toEqual(mid);
	});
});
