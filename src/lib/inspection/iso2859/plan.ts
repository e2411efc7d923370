// Plan lookup: Table I letter -> master table cell -> follow arrows -> sample size and Ac/Re.
import {
	AQL_SERIES,
	LETTERS,
	NORMAL_GRID,
	REDUCED_SAMPLE_SIZE,
	SAMPLE_SIZE,
	TABLE_ROWS,
	EDGE_CELLS,
	diagonalCell,
	tableOneLetter,
	type Cell
} from './tables';
import { InspectionInputError, type CodeLetter, type InspectionLevel, type SamplingPlan, type Severity } from '../types';

const LEVELS: readonly InspectionLevel[] = ['I', 'II', 'III', 'S-1', 'S-2', 'S-3', 'S-4'];
const SEVERITIES: readonly Severity[] = ['normal', 'tightened', 'reduced'];

export interface PlanRequest {
	lotSize: number;
	aql: number;
	level: InspectionLevel;
	severity: Severity;
}

/** Index of an AQL in the preferred series, or -1. Tolerates float noise such as 0.1 + 0.2 style values. */
export function aqlIndex(aql: number): number {
	return AQL_SERIES.findIndex((v) => Math.abs(v - aql) <= v * 1e-9);
}

/** Raw master-table cell (arrows not followed): the edge cells as printed, else the explicit 2-A grid or the structure. */
export function tableCell(severity: Severity, letterIndex: number, aqlIdx: number): Cell {
	const edge = EDGE_CELLS[severity][`${letterIndex}:${aqlIdx}`];
	if (edge) return edge;
	if (severity === 'normal' && letterIndex < NORMAL_GRID.length) return NORMAL_GRID[letterIndex][aqlIdx];
	return diagonalCell(severity, letterIndex, aqlIdx);
}

export interface ResolvedCell {
	letterIndex: number;
	ac: number;
	re: number;
}

/**
 * Follow arrows from a cell to the first plan below ('down') or above ('up'); the sample size is the
 * one of the letter it lands on. With the edge cells as printed no arrow leaves the table.
 */
export function resolveCell(severity: Severity, letterIndex: number, aqlIdx: number): ResolvedCell {
	const lastRow = TABLE_ROWS[severity] - 1;
	let row = letterIndex;
	for (let step = 0; step <= lastRow; step++) {
		const cell = tableCell(severity, row, aqlIdx);
		if (cell !== 'down' && cell !== 'up') return { letterIndex: row, ac: cell.ac, re: cell.re };
		row += cell === 'down' ? 1 : -1;
		if (row < 0 || row > lastRow) break;
	}
	throw new Error(`ISO 2859-1 table ${severity}: an arrow leaves the table at letter ${LETTERS[letterIndex]}`);
}

/** Sample size for a letter under a severity. */
export function sampleSizeFor(severity: Severity, letter: CodeLetter): number {
	return severity === 'reduced' ? REDUCED_SAMPLE_SIZE[letter] : SAMPLE_SIZE[letter];
}

function validate(req: PlanRequest): number {
	if (!Number.isInteger(req.lotSize) || req.lotSize < 1) {
		throw new InspectionInputError('lot_size_invalid', `Lot size must be a positive whole number (got ${req.lotSize}).`);
	}
	if (!LEVELS.includes(req.level)) {
		throw new InspectionInputError('level_invalid', `Inspection level ${String(req.level)} is not one of ${LEVELS.join(', ')}.`);
	}
	if (!SEVERITIES.includes(req.severity)) {
		throw new InspectionInputError('severity_invalid', `Severity ${String(req.severity)} is not normal, tightened or reduced.`);
	}
	const idx = Number.isFinite(req.aql) ? aqlIndex(req.aql) : -1;
	if (idx < 0) {
		throw new InspectionInputError('aql_not_preferred', `AQL ${req.aql} is not in the preferred series (0.010 … 1000).`);
	}
	return idx;
}

/** Code letter from Table I (validated). */
export function codeLetter(lotSize: number, level: InspectionLevel): CodeLetter {
	validate({ lotSize, level, aql: 1, severity: 'normal' });
	return tableOneLetter(lotSize, level);
}

/** Single sampling plan by attributes, ISO 2859-1:1999 (Tables 1, 2-A, 2-B, 2-C). */
export function samplingPlan(req: PlanRequest): SamplingPlan {
	const idx = validate(req);
	const letter = tableOneLetter(req.lotSize, req.level);
	const resolved = resolveCell(req.severity, LETTERS.indexOf(letter), idx);
	const planLetter = LETTERS[resolved.letterIndex];
	const n = sampleSizeFor(req.severity, planLetter);
	const hundredPercent = n >= req.lotSize;
	return {
		code_letter: letter,
		plan_code_letter: planLetter,
		sample_size: hundredPercent ? req.lotSize : n,
		accept: resolved.ac,
		reject: resolved.re,
		hundred_percent: hundredPercent
	};
}

/**
 * Acceptance number of the normal plan one AQL step tighter, for the same plan letter (used by the
 * ISO 2859-1:1999 switching score). Null when there is no tighter AQL or the cell is an arrow.
 */
export function tighterNormalAccept(planLetter: CodeLetter, aqlIdx: number): number | null {
	if (aqlIdx <= 0) return null;
	const cell = tableCell('normal', LETTERS.indexOf(planLetter), aqlIdx - 1);
	return cell === 'up' || cell === 'down' ? null : cell.ac;
}
