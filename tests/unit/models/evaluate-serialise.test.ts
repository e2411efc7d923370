// The hand-written byte serialiser of POST /api/v1/ocv/evaluate must say exactly what JSON.stringify
// would, up to the documented rounding to 1e-6, and repeated readings must map back to their results.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluateReadings, getLibraryModel, type UnitResult } from '$lib/electrochem';
import { distinctReadings } from '../../../src/routes/api/v1/ocv/evaluate/distinct';
import { serialiseResults } from '../../../src/routes/api/v1/ocv/evaluate/serialise';

const decode = (bytes: Uint8Array) => JSON.parse(new TextDecoder().decode(bytes));
const r6 = (x: number | null) => (x === null ? null : Math.round(x * 1e6) / 1e6);

function rounded(u: UnitResult) {
	return {
		soc: r6(u.soc),
		soc_sigma: r6(u.soc_sigma),
		soc_low: r6(u.soc_low),
		soc_high: r6(u.soc_high),
		determinate: u.determinate,
		ocv_cell_v: r6(u.ocv_cell_v),
		ocv_at_25c_v: r6(u.ocv_at_25c_v),
		expected_ocv_v: r6(u.expected_ocv_v),
		residual_v: r6(u.residual_v),
		flags: u.flags
	};
}

describe('serialiseResults', () => {
	it('writes what JSON.stringify would, rounded to 1e-6, for any finite value', () => {
		const anyNumber = fc.oneof(fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e12, max: 1e12 }), fc.constant(-0), fc.integer());
		fc.assert(
			fc.property(fc.array(anyNumber, { minLength: 8, maxLength: 8 }), fc.boolean(), ([a, b, c, d, e, f, g, h], determinate) => {
				const u: UnitResult = {
					soc: a, soc_sigma: b, soc_low: c, soc_high: d, determinate,
					ocv_cell_v: e, ocv_at_25c_v: f, expected_ocv_v: g, residual_v: h,
					flags: determinate ? [] : ['soc_indeterminate', 'deep_discharge']
				};
				const parsed = decode(serialiseResults([u], [0])).results[0];
				const want = rounded(u);
				for (const key of Object.keys(want) as Array<keyof typeof want>) {
					const v = want[key];
					if (typeof v === 'number' && Math.abs(v) >= 1e9) expect(parsed[key]).toBe((u as unknown as Record<string, number>)[key]);
					else expect(parsed[key]).toEqual(v === 0 ? 0 : v);
				}
			}),
			{ numRuns: 500 }
		);
	});

	it('writes null for absent expected values and repeats identical readings in order', () => {
		const model = getLibraryModel('NMC');
		const readings = [
			{ ocv_v: 3.7, temperature_c: 25 },
			{ ocv_v: 2.1, temperature_c: 25 },
			{ ocv_v: 3.7, temperature_c: 25 },
			{ ocv_v: 3.7, temperature_c: 26 }
		];
		const { unique, order } = distinctReadings(readings);
		expect(unique).toHaveLength(3);
		expect([...order]).toEqual([0, 1, 0, 2]);
		const body = decode(serialiseResults(evaluateReadings(model, unique), order));
		const direct = evaluateReadings(model, readings).map(rounded);
		expect(body.results).toEqual(direct);
		expect(body.results[0].expected_ocv_v).toBeNull();
		expect(body.results[1].flags).toContain('deep_discharge');
	});
});

describe('distinctReadings', () => {
	/** Reference: the first index of each (voltage, temperature) pair, by exact value (0 and -0 alike). */
	function reference(readings: Array<{ ocv_v: number; temperature_c: number }>) {
		const first = new Map<string, number>();
		const unique: Array<{ ocv_v: number; temperature_c: number }> = [];
		const order = readings.map((r) => {
			const key = `${r.ocv_v + 0}|${r.temperature_c + 0}`;
			if (!first.has(key)) {
				first.set(key, unique.length);
				unique.push({ ocv_v: r.ocv_v + 0, temperature_c: r.temperature_c + 0 });
			}
			return first.get(key)!;
		});
		return { unique, order };
	}

	it('keeps each distinct pair once, in first-seen order, and maps every reading to it', () => {
		// Few distinct values so that repeats, hash collisions and table wrap-around all occur.
		const value = fc.oneof(fc.constantFrom(3.6, 3.6001, -0, 0, 25, 25.1, 1e-300, 5e-324), fc.double({ noNaN: true, noDefaultInfinity: true }));
		const reading = fc.record({ ocv_v: value, temperature_c: value });
		fc.assert(
			fc.property(fc.array(reading, { maxLength: 300 }), (readings) => {
				const { unique, order } = distinctReadings(readings);
				const expected = reference(readings);
				expect(unique).toEqual(expected.unique);
				expect([...order]).toEqual(expected.order);
			})
		);
	});
});
