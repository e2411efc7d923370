// The per-unit result comes from the electrochem core as it is (one contract, defined there).
export type { FlagCode, UnitResult } from '../electrochem/types';

export type InspectionLevel = 'I' | 'II' | 'III' | 'S-1' | 'S-2' | 'S-3' | 'S-4';
export type Severity = 'normal' | 'tightened' | 'reduced';
export type SwitchingState = Severity | 'discontinued';

export type CodeLetter = 'A' | 'B' | 'C' | 'D' | 'E' | 'F' | 'G' | 'H' | 'J' | 'K' | 'L' | 'M' | 'N' | 'P' | 'Q' | 'R' | 'S';

export interface SamplingPlan {
	/** Letter from Table I for the lot size and level. */
	code_letter: CodeLetter;
	/** Letter whose plan is used after following the table's arrows. */
	plan_code_letter: CodeLetter;
	sample_size: number;
	accept: number;
	reject: number;
	/** True when the plan's sample would be the whole lot or more: inspect every unit. */
	hundred_percent: boolean;
}

export type InspectionErrorCode = 'lot_size_invalid' | 'aql_not_preferred' | 'level_invalid' | 'severity_invalid';

/** Typed validation error so callers can map it to a form message without parsing text. */
export class InspectionInputError extends Error {
	readonly code: InspectionErrorCode;
	constructor(code: InspectionErrorCode, message: string) {
		super(message);
		this.name = 'InspectionInputError';
		this.code = code;
	}
}
