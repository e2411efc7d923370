// Structural copies of the electrochem contract (src/lib/electrochem). Kept identical in shape so the
// inspection core compiles on its own; the glue code passes electrochem's results straight in.
export type FlagCode =
	| 'deep_discharge'
	| 'over_voltage'
	| 'soc_indeterminate'
	| 'temperature_out_of_range'
	| 'below_window'
	| 'above_window';

export interface UnitResult {
	soc: number;
	soc_sigma: number;
	soc_low: number;
	soc_high: number;
	determinate: boolean;
	ocv_cell_v: number;
	ocv_at_25c_v: number;
	expected_ocv_v: number | null;
	residual_v: number | null;
	flags: FlagCode[];
}

export type InspectionLevel = 'I' | 'II' | 'III' | 'S-1' | 'S-2' | 'S-3' | 'S-4';
export type Severity = 'normal' | 'tightened' | 'reduced';
export type SwitchingState = Severity | 'discontinued';

export type CodeLetter =
	| 'A' | 'B' | 'C' | 'D' | 'E' | 'F' | 'G' | 'H' | 'J' | 'K' | 'L' | 'M' | 'N' | 'P' | 'Q' | 'R' | 'S';

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

export type InspectionErrorCode =
	| 'lot_size_invalid'
	| 'aql_not_preferred'
	| 'level_invalid'
	| 'severity_invalid';

/** Typed validation error so callers can map it to a form message without parsing text. */
export class InspectionInputError extends Error {
	readonly code: InspectionErrorCode;
	constructor(code: InspectionErrorCode, message: string) {
		super(message);
		this.name = 'InspectionInputError';
		this.code = code;
	}
}
