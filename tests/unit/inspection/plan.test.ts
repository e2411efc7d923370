// Checks of the single sampling tables against published plans.
// Sources, named beside each group:
//  [105E-I]   MIL-STD-105E (1989) Table I, sample size code letters (same as ISO 2859-1 Table 1).
//  [NIBS]     "Table 1-A / 1-B", nibs.org FMOC AC-TABLE: plans for AQL 0.65–15 copied from MIL-STD-105E
//             Tables I, II-A and II-B (Re numbers and arrows); Ac = Re − 1 for these plans.
//  [PLOS]     Jenkins, Peck & Fernando (2023), PLOS figure "Operating characteristic curves from
//             ISO 2859-1:1999 for the lot size range of 35 001–500 000": six normal plans.
//  [memory]   values recalled without a source at hand (marked "from memory").
import { describe, expect, it } from 'vitest';
import { InspectionInputError, codeLetter, samplingPlan, type InspectionLevel } from '../../../src/lib/inspection';
import { EDGE_CELLS, NORMAL_GRID, diagonalCell } from '../../../src/lib/inspection/iso2859/tables';

describe('Table I code letters [105E-I]', () => {
	const cases: Array<[number, InspectionLevel, string]> = [
		[8, 'II', 'A'],
		[8, 'III', 'B'],
		[15, 'II', 'B'],
		[25, 'S-3', 'B'],
		[50, 'S-1', 'A'],
		[90, 'II', 'E'],
		[150, 'S-4', 'D'],
		[280, 'I', 'E'],
		[500, 'III', 'J'],
		[1200, 'II', 'J'],
		[1201, 'II', 'K'],
		[3200, 'II', 'K'],
		[3201, 'II', 'L'],
		[10000, 'I', 'J'],
		[35000, 'S-4', 'H'],
		[150000, 'II', 'N'],
		[500000, 'III', 'Q'],
		[500001, 'III', 'R'],
		[1_000_000, 'S-1', 'D'],
		[2, 'S-2', 'A']
	];
	it.each(cases)('lot %i at level %s -> %s', (lot, level, letter) => {
		expect(codeLetter(lot, level)).toBe(letter);
	});
});

type Row = [lot: number, aql: number, letter: string, planLetter: string, n: number, ac: number, re: number];
const check = (severity: 'normal' | 'tightened' | 'reduced', level: InspectionLevel) => (row: Row) => {
	const [lot, aql, letter, planLetter, n, ac, re] = row;
	const plan = samplingPlan({ lotSize: lot, aql, level, severity });
	expect(plan).toEqual({
		code_letter: letter,
		plan_code_letter: planLetter,
		sample_size: n,
		accept: ac,
		reject: re,
		hundred_percent: false
	});
};

describe('Table 2-A normal (II-A), general level II [NIBS]', () => {
	const rows: Row[] = [
		[2000, 1.0, 'K', 'K', 125, 3, 4], // MIL-STD-105E Table II-A, K at 1.0
		[2000, 0.65, 'K', 'K', 125, 2, 3], // II-A
		[2000, 2.5, 'K', 'K', 125, 7, 8], // II-A
		[2000, 10, 'K', 'K', 125, 21, 22], // II-A
		[2000, 15, 'K', 'J', 80, 21, 22], // II-A arrow up from K at 15
		[60, 1.0, 'E', 'E', 13, 0, 1], // II-A
		[60, 1.5, 'E', 'D', 8, 0, 1], // II-A arrow up
		[60, 2.5, 'E', 'F', 20, 1, 2], // II-A arrow down
		[60, 0.65, 'E', 'F', 20, 0, 1], // II-A arrow down
		[60, 15, 'E', 'E', 13, 5, 6], // II-A
		[400, 0.65, 'H', 'J', 80, 1, 2], // II-A arrow down
		[400, 6.5, 'H', 'H', 50, 7, 8], // II-A
		[200, 0.65, 'G', 'F', 20, 0, 1], // II-A arrow up
		[200, 1.0, 'G', 'H', 50, 1, 2], // II-A arrow down
		[5000, 4.0, 'L', 'L', 200, 14, 15], // II-A
		[5000, 10, 'L', 'K', 125, 21, 22], // II-A arrow up
		[300000, 1.0, 'P', 'P', 800, 14, 15], // II-A
		[300000, 1.5, 'P', 'P', 800, 21, 22], // II-A
		[600000, 0.65, 'Q', 'Q', 1250, 14, 15], // II-A
		[600000, 1.5, 'Q', 'P', 800, 21, 22], // II-A arrow up from Q
		[6, 6.5, 'A', 'A', 2, 0, 1] // II-A
	];
	it.each(rows)('lot %i AQL %f', (...row) => check('normal', 'II')(row));
});

describe('Table 2-A normal, special levels S-3/S-4 [PLOS]', () => {
	const rows: Array<[number, InspectionLevel, number, string, number, number, number]> = [
		[100_000, 'S-4', 0.65, 'J', 80, 1, 2],
		[100_000, 'S-3', 0.65, 'F', 20, 0, 1],
		[400_000, 'S-4', 0.4, 'K', 125, 1, 2],
		[400_000, 'S-3', 0.4, 'G', 32, 0, 1],
		[100_000, 'S-4', 0.25, 'H', 50, 0, 1],
		[100_000, 'S-4', 0.15, 'J', 80, 0, 1]
	];
	it.each(rows)('lot %i %s AQL %f', (lot, level, aql, planLetter, n, ac, re) => {
		const plan = samplingPlan({ lotSize: lot, aql, level, severity: 'normal' });
		expect([plan.plan_code_letter, plan.sample_size, plan.accept, plan.reject]).toEqual([planLetter, n, ac, re]);
	});
});

describe('Table 2-B tightened (II-B) [NIBS]', () => {
	const rows: Row[] = [
		[2000, 0.65, 'K', 'K', 125, 1, 2], // MIL-STD-105E Table II-B
		[2000, 1.0, 'K', 'K', 125, 2, 3], // II-B
		[2000, 4.0, 'K', 'K', 125, 8, 9], // II-B
		[2000, 6.5, 'K', 'K', 125, 12, 13], // II-B
		[2000, 10, 'K', 'K', 125, 18, 19], // II-B
		[2000, 15, 'K', 'J', 80, 18, 19], // II-B arrow up
		[200, 0.65, 'G', 'G', 32, 0, 1], // II-B
		[200, 15, 'G', 'G', 32, 8, 9], // II-B
		[200, 1.5, 'G', 'H', 50, 1, 2], // II-B arrow down
		[200, 1.0, 'G', 'J', 80, 1, 2], // II-B arrow down over two cells (G and H)
		[5000, 6.5, 'L', 'L', 200, 18, 19] // II-B
	];
	it.each(rows)('lot %i AQL %f', (...row) => check('tightened', 'II')(row));
});

describe('Table 2-C reduced, ISO 2859-1:1999 (from memory; Re = Ac + 1)', () => {
	// K at AQL 1.0 gives 2/3 in the 1999 edition (the older military table gave 1/4); reduced sample
	// sizes are the normal size two letters earlier.
	it('K at AQL 1.0: n 50, Ac 2, Re 3', () => check('reduced', 'II')([2000, 1.0, 'K', 'K', 50, 2, 3]));
	it('K at AQL 0.65: n 50, Ac 1, Re 2', () => check('reduced', 'II')([2000, 0.65, 'K', 'K', 50, 1, 2]));
	it('no reduced plan has a gap between Ac and Re', () => {
		for (const aql of [0.4, 1.0, 1.5, 2.5, 4.0, 6.5, 10]) {
			const plan = samplingPlan({ lotSize: 2000, aql, level: 'II', severity: 'reduced' });
			expect(plan.reject).toBe(plan.accept + 1);
		}
	});
});

describe('arrows, 100 % inspection and validation', () => {
	it('letter A at AQL 0.65 follows the arrow down to F (n 20) and inspects all 5 units (MIL-STD-105E II-A note)', () => {
		expect(samplingPlan({ lotSize: 5, aql: 0.65, level: 'II', severity: 'normal' })).toEqual({
			code_letter: 'A',
			plan_code_letter: 'F',
			sample_size: 5,
			accept: 0,
			reject: 1,
			hundred_percent: true
		});
	});
	it('sample equal to the lot is 100 % inspection', () => {
		const plan = samplingPlan({ lotSize: 13, aql: 1.0, level: 'III', severity: 'normal' });
		expect([plan.code_letter, plan.plan_code_letter, plan.hundred_percent, plan.sample_size]).toEqual(['C', 'E', true, 13]);
	});
	it('rejects a lot size that is not a positive integer', () => {
		for (const lotSize of [0, -3, 2.5, Number.NaN]) {
			expect(() => samplingPlan({ lotSize, aql: 1, level: 'II', severity: 'normal' })).toThrow(InspectionInputError);
		}
		try {
			samplingPlan({ lotSize: 0, aql: 1, level: 'II', severity: 'normal' });
		} catch (e) {
			expect((e as InspectionInputError).code).toBe('lot_size_invalid');
		}
	});
	it('rejects an AQL outside the preferred series', () => {
		expect.assertions(2);
		try {
			samplingPlan({ lotSize: 100, aql: 0.5, level: 'II', severity: 'normal' });
		} catch (e) {
			expect(e).toBeInstanceOf(InspectionInputError);
			expect((e as InspectionInputError).code).toBe('aql_not_preferred');
		}
	});
});

describe('two encodings of Table 2-A agree (edge cells as printed)', () => {
	it('explicit grid equals the diagonal-structure table in all 16 × 26 cells', () => {
		expect(NORMAL_GRID).toHaveLength(16);
		let compared = 0;
		NORMAL_GRID.forEach((row, i) => {
			expect(row).toHaveLength(26);
			row.forEach((cell, j) => {
				const edge = EDGE_CELLS.normal[`${i}:${j}`];
				expect(cell, `letter index ${i}, AQL index ${j}`).toEqual(edge ?? diagonalCell('normal', i, j));
				compared++;
			});
		});
		expect(compared).toBe(416);
	});
	it('every resolved normal plan satisfies Re = Ac + 1 and is no larger than letter R or smaller than A', () => {
		for (const lot of [2, 20, 100, 1000, 20000, 1_000_000]) {
			for (const aql of [0.01, 0.065, 0.65, 6.5, 65, 1000]) {
				const plan = samplingPlan({ lotSize: lot, aql, level: 'II', severity: 'normal' });
				expect(plan.reject).toBe(plan.accept + 1);
				expect(plan.sample_size).toBeLessThanOrEqual(Math.min(lot, 2000));
			}
		}
	});
});
