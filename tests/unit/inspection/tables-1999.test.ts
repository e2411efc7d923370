// Every typed cell of ISO 2859-1:1999 Tables 2-A, 2-B and 2-C checked against a second transcription
// typed separately, column by column (one string per AQL, letters A..R top to bottom), where the
// tables in src/lib/inspection/iso2859/tables.ts are typed row by row and by their diagonals.
// Sources: ISO 2859-1:1999 and its identical national adoption IS 2500 (Part 1):2000. Honestly: both
// transcriptions were typed from memory, without a printed copy at hand; 2-C was checked against what
// was measured against the 1999 edition (K at AQL 1.0 = 2/3; 133 of 416 cells differ from the older
// military II-C in n or Ac, 148 more only in Re). Tokens: "v" arrow down, "^" arrow up, "vN"/"^N" N in a row.
import { describe, expect, it } from 'vitest';
import { samplingPlan, SAMPLE_SIZE, REDUCED_SAMPLE_SIZE, LETTERS, AQL_SERIES } from '../../../src/lib/inspection';
import { tableCell, resolveCell } from '../../../src/lib/inspection/iso2859/plan';
import { EDITION } from '../../../src/lib/inspection/iso2859/tables';

const COLUMNS_2A: ReadonlyArray<[aql: string, letters: string]> = [
	['0.010', 'v14 0/1 ^'],
	['0.015', 'v13 0/1 ^ ^'],
	['0.025', 'v12 0/1 ^ v 1/2'],
	['0.040', 'v11 0/1 ^ v 1/2 2/3'],
	['0.065', 'v10 0/1 ^ v 1/2 2/3 3/4'],
	['0.10', 'v9 0/1 ^ v 1/2 2/3 3/4 5/6'],
	['0.15', 'v8 0/1 ^ v 1/2 2/3 3/4 5/6 7/8'],
	['0.25', 'v7 0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11'],
	['0.40', 'v6 0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11 14/15'],
	['0.65', 'v5 0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22'],
	['1.0', 'v4 0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ^'],
	['1.5', 'v3 0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ^2'],
	['2.5', 'v2 0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ^3'],
	['4.0', 'v 0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ^4'],
	['6.5', '0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ^5'],
	['10', 'v v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ^6'],
	['15', 'v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ^7'],
	['25', '1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ^8'],
	['40', '2/3 3/4 5/6 7/8 10/11 14/15 21/22 ^9'],
	['65', '3/4 5/6 7/8 10/11 14/15 21/22 ^10'],
	['100', '5/6 7/8 10/11 14/15 21/22 ^11'],
	['150', '7/8 10/11 14/15 21/22 30/31 ^11'],
	['250', '10/11 14/15 21/22 30/31 44/45 ^11'],
	['400', '14/15 21/22 30/31 44/45 ^12'],
	['650', '21/22 30/31 44/45 ^13'],
	['1000', '30/31 44/45 ^14']
];

const COLUMNS_2B: ReadonlyArray<[aql: string, letters: string]> = [
	['0.010', 'v15 0/1'],
	['0.015', 'v14 0/1 ^'],
	['0.025', 'v13 0/1 v v'],
	['0.040', 'v12 0/1 v v 1/2'],
	['0.065', 'v11 0/1 v v 1/2 2/3'],
	['0.10', 'v10 0/1 v v 1/2 2/3 3/4'],
	['0.15', 'v9 0/1 v v 1/2 2/3 3/4 5/6'],
	['0.25', 'v8 0/1 v v 1/2 2/3 3/4 5/6 8/9'],
	['0.40', 'v7 0/1 v v 1/2 2/3 3/4 5/6 8/9 12/13'],
	['0.65', 'v6 0/1 v v 1/2 2/3 3/4 5/6 8/9 12/13 18/19'],
	['1.0', 'v5 0/1 v v 1/2 2/3 3/4 5/6 8/9 12/13 18/19 ^'],
	['1.5', 'v4 0/1 v v 1/2 2/3 3/4 5/6 8/9 12/13 18/19 ^2'],
	['2.5', 'v3 0/1 v v 1/2 2/3 3/4 5/6 8/9 12/13 18/19 ^3'],
	['4.0', 'v2 0/1 v v 1/2 2/3 3/4 5/6 8/9 12/13 18/19 ^4'],
	['6.5', 'v 0/1 v v 1/2 2/3 3/4 5/6 8/9 12/13 18/19 ^5'],
	['10', '0/1 v v 1/2 2/3 3/4 5/6 8/9 12/13 18/19 ^6'],
	['15', 'v v 1/2 2/3 3/4 5/6 8/9 12/13 18/19 ^7'],
	['25', 'v 1/2 2/3 3/4 5/6 8/9 12/13 18/19 ^8'],
	['40', '1/2 2/3 3/4 5/6 8/9 12/13 18/19 ^9'],
	['65', '2/3 3/4 5/6 8/9 12/13 18/19 ^10'],
	['100', '3/4 5/6 8/9 12/13 18/19 ^11'],
	['150', '5/6 8/9 12/13 18/19 27/28 ^11'],
	['250', '8/9 12/13 18/19 27/28 41/42 ^11'],
	['400', '12/13 18/19 27/28 41/42 ^12'],
	['650', '18/19 27/28 41/42 ^13'],
	['1000', '27/28 41/42 ^14']
];

const COLUMNS_2C: ReadonlyArray<[aql: string, letters: string]> = [
	['0.010', 'v14 0/1 ^'],
	['0.015', 'v13 0/1 ^ ^'],
	['0.025', 'v12 0/1 ^ v 0/1'],
	['0.040', 'v11 0/1 ^ v v 1/2'],
	['0.065', 'v10 0/1 ^ v v 1/2 2/3'],
	['0.10', 'v9 0/1 ^ v v 1/2 2/3 3/4'],
	['0.15', 'v8 0/1 ^ v v 1/2 2/3 3/4 4/5'],
	['0.25', 'v7 0/1 ^ v v 1/2 2/3 3/4 4/5 5/6'],
	['0.40', 'v6 0/1 ^ v v 1/2 2/3 3/4 4/5 5/6 7/8'],
	['0.65', 'v5 0/1 ^ v v 1/2 2/3 3/4 4/5 5/6 7/8 10/11'],
	['1.0', 'v4 0/1 ^ v v 1/2 2/3 3/4 4/5 5/6 7/8 10/11 ^'],
	['1.5', 'v3 0/1 ^ v v 1/2 2/3 3/4 4/5 5/6 7/8 10/11 ^2'],
	['2.5', 'v2 0/1 ^ v v 1/2 2/3 3/4 4/5 5/6 7/8 10/11 ^3'],
	['4.0', 'v 0/1 ^ v v 1/2 2/3 3/4 4/5 5/6 7/8 10/11 ^4'],
	['6.5', '0/1 ^ v v 1/2 2/3 3/4 4/5 5/6 7/8 10/11 ^5'],
	['10', 'v v v 1/2 2/3 3/4 4/5 5/6 7/8 10/11 ^6'],
	['15', 'v v 1/2 2/3 3/4 4/5 5/6 7/8 10/11 ^7'],
	['25', 'v 1/2 2/3 3/4 4/5 5/6 7/8 10/11 ^8'],
	['40', '1/2 2/3 3/4 4/5 5/6 7/8 10/11 ^9'],
	['65', '2/3 3/4 4/5 5/6 7/8 10/11 ^10'],
	['100', '3/4 4/5 5/6 7/8 10/11 ^11'],
	['150', '4/5 5/6 7/8 10/11 14/15 ^11'],
	['250', '5/6 7/8 10/11 14/15 ^12'],
	['400', '7/8 10/11 14/15 ^13'],
	['650', '10/11 14/15 ^14'],
	['1000', '14/15 ^15']
];

type Cell = { ac: number; re: number } | 'down' | 'up';
function parseColumn(column: string): Cell[] {
	return column.split(' ').flatMap((token): Cell[] => {
		const arrow = /^([v^])(\d*)$/.exec(token);
		if (!arrow) {
			const [ac, re] = token.split('/').map(Number);
			return [{ ac, re }];
		}
		return Array<Cell>(arrow[2] === '' ? 1 : Number(arrow[2])).fill(arrow[1] === 'v' ? 'down' : 'up');
	});
}

const TABLES = { normal: COLUMNS_2A, tightened: COLUMNS_2B, reduced: COLUMNS_2C } as const;

describe.each(Object.entries(TABLES))('ISO 2859-1:1999 %s table: every cell against the column-wise copy', (severity, columns) => {
	const sev = severity as keyof typeof TABLES;
	it('has 26 AQL columns in the preferred series, each with letters A..R', () => {
		expect(columns.map(([aql]) => Number(aql))).toEqual([...AQL_SERIES]);
		for (const [, column] of columns) expect(parseColumn(column)).toHaveLength(16);
	});
	it('agrees in all 416 cells', () => {
		let compared = 0;
		columns.forEach(([, column], aqlIdx) => {
			parseColumn(column).forEach((cell, letterIdx) => {
				expect(tableCell(sev, letterIdx, aqlIdx), `${LETTERS[letterIdx]} at AQL ${AQL_SERIES[aqlIdx]}`).toEqual(cell);
				compared++;
			});
		});
		expect(compared).toBe(416);
	});
	it('every arrow resolves inside the table to a single plan with Re = Ac + 1', () => {
		for (let letter = 0; letter < 16; letter++) {
			for (let aql = 0; aql < 26; aql++) {
				const cell = resolveCell(sev, letter, aql);
				expect(cell.re, `${LETTERS[letter]} at ${AQL_SERIES[aql]}`).toBe(cell.ac + 1);
			}
		}
	});
});

describe('edge cells, as listed for the 1999 edition', () => {
	it('2-A letter A at AQL 10 follows the arrow down to n 5, 1/2', () => {
		const plan = samplingPlan({ lotSize: 8, aql: 10, level: 'II', severity: 'normal' });
		expect([plan.code_letter, plan.plan_code_letter, plan.sample_size, plan.accept, plan.reject]).toEqual(['A', 'C', 5, 1, 2]);
	});
	it('2-A letter R at AQL 0.015 points up to the 0/1 plan of letter P (n 800)', () => {
		const plan = samplingPlan({ lotSize: 600_000, aql: 0.015, level: 'III', severity: 'normal' });
		expect([plan.code_letter, plan.plan_code_letter, plan.sample_size, plan.accept, plan.reject]).toEqual(['R', 'P', 800, 0, 1]);
	});
	it('2-B letter R at AQL 0.015 points up to the 0/1 plan of letter Q (n 1250); letter S is reached from R at 0.025', () => {
		const up = samplingPlan({ lotSize: 600_000, aql: 0.015, level: 'III', severity: 'tightened' });
		expect([up.plan_code_letter, up.sample_size, up.accept]).toEqual(['Q', 1250, 0]);
		const down = samplingPlan({ lotSize: 600_000, aql: 0.025, level: 'III', severity: 'tightened' });
		expect([down.plan_code_letter, down.sample_size, down.accept, down.reject]).toEqual(['S', 3150, 1, 2]);
	});
});

describe('structural invariants over every lot size band, level and severity', () => {
	const lots = [2, 8, 9, 15, 25, 50, 90, 150, 280, 500, 1200, 3200, 10_000, 35_000, 150_000, 500_000, 500_001];
	const levels = ['S-1', 'S-2', 'S-3', 'S-4', 'I', 'II', 'III'] as const;
	it('Re = Ac + 1, n never above the lot, 100 % inspection exactly when the table n reaches N', () => {
		for (const severity of ['normal', 'tightened', 'reduced'] as const) {
			const sizes = severity === 'reduced' ? REDUCED_SAMPLE_SIZE : SAMPLE_SIZE;
			for (const lotSize of lots)
				for (const level of levels)
					for (const aql of AQL_SERIES) {
						const plan = samplingPlan({ lotSize, aql, level, severity });
						expect(plan.reject).toBe(plan.accept + 1);
						expect(plan.sample_size).toBeLessThanOrEqual(lotSize);
						const tableN = sizes[plan.plan_code_letter];
						expect(plan.hundred_percent).toBe(tableN >= lotSize);
						expect(plan.sample_size).toBe(Math.min(tableN, lotSize));
					}
		}
	});
	it('names its edition', () => expect(EDITION).toBe('ISO 2859-1:1999'));
});
