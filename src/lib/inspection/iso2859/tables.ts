// Single sampling tables by attributes, ISO 2859-1:1999 (second edition): Table 1 (sample size code
// letters), Tables 2-A (normal), 2-B (tightened) and 2-C (reduced). Identical national adoption:
// IS 2500 (Part 1):2000 (Bureau of Indian Standards, "identical with ISO 2859-1:1999").
// Tables 1, 2-A and 2-B carry the plans of MIL-STD-105E Tables I, II-A, II-B (edge cells aside); Table 2-C of
// 1999 differs from II-C: Re = Ac + 1 everywhere (no gap, so no "accepted but back to normal" lot).
// Honest provenance: typed from memory, not from a printed copy at hand. Table 2-C was rebuilt from
// memory and checked against what was measured against the 1999 edition (K at AQL 1.0 gives 2/3;
// 133 of the 416 cells differ from MIL-STD-105E II-C in n or Ac and 148 more only in Re, which this
// table reproduces). Re-check against the printed edition before relying on a 2-C cell.
// Two encodings are kept and compared cell by cell in tests: Table 2-A row by row (NORMAL_GRID) and
// all three tables from the diagonal structure (along letter index + AQL index every cell holds the
// same pair or arrow). tests/unit/inspection/tables-1999.test.ts holds a third, column-wise copy.
import type { CodeLetter, InspectionLevel } from '../types';

/** The edition every plan comes from; shown beside each plan (API, lot page, PDF). */
export const EDITION = 'ISO 2859-1:1999';

/** Preferred AQL series (percent nonconforming up to 10, nonconformities per 100 units above). */
export const AQL_SERIES = [
	0.01, 0.015, 0.025, 0.04, 0.065, 0.1, 0.15, 0.25, 0.4, 0.65, 1.0, 1.5, 2.5, 4.0, 6.5, 10, 15, 25, 40, 65, 100, 150, 250, 400, 650, 1000
] as const;

/** Code letters in table order; S exists only in the tightened table (2-B), reached by an arrow. */
export const LETTERS: readonly CodeLetter[] = ['A', 'B', 'C', 'D', 'E', 'F', 'G', 'H', 'J', 'K', 'L', 'M', 'N', 'P', 'Q', 'R', 'S'];

/** Sample sizes of normal and tightened plans (Tables 2-A, 2-B). */
export const SAMPLE_SIZE: Readonly<Record<CodeLetter, number>> = {
	A: 2,
	B: 3,
	C: 5,
	D: 8,
	E: 13,
	F: 20,
	G: 32,
	H: 50,
	J: 80,
	K: 125,
	L: 200,
	M: 315,
	N: 500,
	P: 800,
	Q: 1250,
	R: 2000,
	S: 3150
};

/** Sample sizes of reduced plans (Table 2-C): the normal size two letters earlier, never below 2. */
export const REDUCED_SAMPLE_SIZE: Readonly<Record<CodeLetter, number>> = {
	A: 2,
	B: 2,
	C: 2,
	D: 3,
	E: 5,
	F: 8,
	G: 13,
	H: 20,
	J: 32,
	K: 50,
	L: 80,
	M: 125,
	N: 200,
	P: 315,
	Q: 500,
	R: 800,
	S: 800
};

/** Table I: upper bound of each lot-size range and its letter per level (columns S-1..S-4, I, II, III). */
const LEVEL_COLUMNS: readonly InspectionLevel[] = ['S-1', 'S-2', 'S-3', 'S-4', 'I', 'II', 'III'];
const TABLE_I: ReadonlyArray<readonly [number, string]> = [
	[8, 'AAAAAAB'],
	[15, 'AAAAABC'],
	[25, 'AABBBCD'],
	[50, 'ABBCCDE'],
	[90, 'BBCCCEF'],
	[150, 'BBCDDFG'],
	[280, 'BCDEEGH'],
	[500, 'BCDEFHJ'],
	[1200, 'CCEFGJK'],
	[3200, 'CDEGHKL'],
	[10000, 'CDFGJLM'],
	[35000, 'CDFHKMN'],
	[150000, 'DEGJLNP'],
	[500000, 'DEGJMPQ'],
	[Number.POSITIVE_INFINITY, 'DEHKNQR']
];

/** Table I lookup. Lot size must already be validated (integer >= 2; a lot of 1 uses the first row). */
export function tableOneLetter(lotSize: number, level: InspectionLevel): CodeLetter {
	const column = LEVEL_COLUMNS.indexOf(level);
	const row = TABLE_I.find(([upper]) => lotSize <= upper) ?? TABLE_I[TABLE_I.length - 1];
	return row[1][column] as CodeLetter;
}

/** A table cell: an Ac/Re pair, or an arrow to the first plan below ('down') or above ('up'). */
export type Cell = { ac: number; re: number } | 'down' | 'up';

// ---- Encoding 1: Table 2-A as an explicit grid -------------------------------------------------
// One string per letter A..R, 26 cells for AQL 0.010..1000. Tokens: "v" = arrow down, "^" = arrow up,
// "vN"/"^N" = N arrows in a row, "a/r" = Ac/Re.
const NORMAL_GRID_ROWS: readonly string[] = [
	/* A    2 */ 'v14 0/1 v v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 30/31',
	/* B    3 */ 'v13 0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 30/31 44/45',
	/* C    5 */ 'v12 0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 30/31 44/45 ^',
	/* D    8 */ 'v11 0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 30/31 44/45 ^2',
	/* E   13 */ 'v10 0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 30/31 44/45 ^3',
	/* F   20 */ 'v9 0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ^6',
	/* G   32 */ 'v8 0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ^7',
	/* H   50 */ 'v7 0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ^8',
	/* J   80 */ 'v6 0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ^9',
	/* K  125 */ 'v5 0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ^10',
	/* L  200 */ 'v4 0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ^11',
	/* M  315 */ 'v3 0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ^12',
	/* N  500 */ 'v2 0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ^13',
	/* P  800 */ 'v 0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ^14',
	/* Q 1250 */ '0/1 ^ v 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ^15',
	/* R 2000 */ '^ ^ 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ^16'
];

function parseGridRow(row: string): Cell[] {
	const cells: Cell[] = [];
	for (const token of row.split(' ')) {
		const arrow = /^([v^])(\d*)$/.exec(token);
		if (arrow) {
			const count = arrow[2] === '' ? 1 : Number(arrow[2]);
			for (let k = 0; k < count; k++) cells.push(arrow[1] === 'v' ? 'down' : 'up');
		} else {
			const [ac, re] = token.split('/').map(Number);
			cells.push({ ac, re });
		}
	}
	return cells;
}

/** Table 2-A, explicit encoding: NORMAL_GRID[letterIndex][aqlIndex]. */
export const NORMAL_GRID: readonly (readonly Cell[])[] = NORMAL_GRID_ROWS.map(parseGridRow);

// ---- Encoding 2: the diagonal structure -------------------------------------------------------
// Diagonal index d = letterIndex + aqlIndex (A = 0, AQL 0.010 = 0). Below FIRST_DIAGONAL every cell is
// an arrow down; after the listed cells every cell is an arrow up. The last `wideOnly` pairs
// (Ac >= 30-ish) exist only in rows A..E (n <= 13 on normal), i.e. for nonconformities per 100 units.
interface DiagonalPattern {
	first: number;
	cells: readonly Cell[];
	wideOnly: number;
}
const p = (ac: number, re: number): Cell => ({ ac, re });

export const DIAGONAL_SEQUENCE: Readonly<Record<'normal' | 'tightened' | 'reduced', DiagonalPattern>> = {
	// Table 2-A: 0/1, up, down, then 1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 (30/31 44/45 in rows A..E).
	normal: {
		first: 14,
		cells: [p(0, 1), 'up', 'down', p(1, 2), p(2, 3), p(3, 4), p(5, 6), p(7, 8), p(10, 11), p(14, 15), p(21, 22), p(30, 31), p(44, 45)],
		wideOnly: 2
	},
	// Table 2-B: the Ac = 0 diagonal one AQL step to the right, then a two-cell arrow down, then
	// 1/2 2/3 3/4 5/6 8/9 12/13 18/19 (27/28 41/42 in rows A..E).
	tightened: {
		first: 15,
		cells: [p(0, 1), 'down', 'down', p(1, 2), p(2, 3), p(3, 4), p(5, 6), p(8, 9), p(12, 13), p(18, 19), p(27, 28), p(41, 42)],
		wideOnly: 2
	},
	// Table 2-C (1999): 0/1, up, then a two-cell arrow down, then 1/2 2/3 3/4 4/5 5/6 7/8 10/11
	// (14/15 in rows A..E); Re = Ac + 1 throughout.
	reduced: {
		first: 14,
		cells: [p(0, 1), 'up', 'down', 'down', p(1, 2), p(2, 3), p(3, 4), p(4, 5), p(5, 6), p(7, 8), p(10, 11), p(14, 15)],
		wideOnly: 1
	}
};

/** Last row index that carries the wide (high-Ac) pairs: letter E. */
const WIDE_LAST_ROW = 4;

/** Cell generated from the diagonal structure; also answers for rows just past the table's edges. */
export function diagonalCell(severity: 'normal' | 'tightened' | 'reduced', letterIndex: number, aqlIndex: number): Cell {
	const pattern = DIAGONAL_SEQUENCE[severity];
	const offset = letterIndex + aqlIndex - pattern.first;
	if (offset < 0) return 'down';
	const usable = letterIndex <= WIDE_LAST_ROW ? pattern.cells.length : pattern.cells.length - pattern.wideOnly;
	return offset < usable ? pattern.cells[offset] : 'up';
}

/** Number of letters in each master table: A..R (16), tightened adds S (17). */
export const TABLE_ROWS: Readonly<Record<'normal' | 'tightened' | 'reduced', number>> = {
	normal: 16,
	tightened: 17,
	reduced: 16
};

/**
 * Cells at the table's edges where the diagonal would point off the table; the printed tables put
 * another arrow or plan there (2-A and 2-C letter A at AQL 10 point down; letter R at AQL 0.015
 * points up; 2-C letter R at AQL 0.025 holds 0/1). Key: "letterIndex:aqlIndex".
 */
export const EDGE_CELLS: Readonly<Record<'normal' | 'tightened' | 'reduced', Readonly<Record<string, Cell>>>> = {
	normal: { '0:15': 'down', '15:1': 'up' },
	tightened: { '15:1': 'up' },
	reduced: { '0:15': 'down', '15:1': 'up', '15:2': p(0, 1) }
};
