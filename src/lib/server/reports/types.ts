/** Plain data handed to the document generators; callers build it from the DB, the generators never query. */
export interface ReportUnit {
	serial: string;
	ocv_v: number;
	temperature_c: number;
	ac_resistance_mohm: number | null;
	ocv_cell_v: number;
	ocv_at_25c_v: number;
	soc: number;
	soc_sigma: number;
	soc_low: number;
	soc_high: number;
	determinate: boolean;
	expected_ocv_v: number | null;
	residual_v: number | null;
	flags: string[];
	nonconforming: boolean;
	/** A pack's lowest and highest cell-group voltage, V (null: groups not recorded). */
	cell_group_min_v?: number | null;
	cell_group_max_v?: number | null;
}
export interface ReportReason {
	code: string;
	severity: 'reject' | 'hold' | 'info';
	message: string;
	units?: string[];
}
export interface ReportData {
	generated_at: string; // ISO
	company: { name: string };
	lot: {
		id: string;
		lot_code: string;
		po_number: string;
		status: string;
		quantity: number;
		declared_soc: number | null;
		transport: 'air' | 'sea' | 'road' | 'rail';
		un_number: string | null;
		/** alone, with_equipment or in_equipment. */
		packing: string;
		/** The DG rule the evaluation applied, e.g. "IATA DGR 67th ed. PI 965"; null when none applied. */
		dg_rule: string | null;
		received_at: string | null;
		created_at: string;
	};
	supplier: { name: string };
	part: {
		part_number: string;
		description: string;
		chemistry: string;
		cells_in_series: number;
		cells_in_parallel: number;
		nominal_capacity_ah: number;
	};
	plan: {
		code_letter: string;
		plan_code_letter: string;
		sample_size: number;
		accept: number;
		reject: number;
		aql: number;
		level: string;
		hundred_percent: boolean;
	} | null;
	severity: string;
	disposition: { status: 'pending' | 'accept' | 'hold' | 'reject'; safety: boolean; reasons: ReportReason[]; nonconforming: number };
	stats: { count: number; mean: number; sd: number; median: number; mad: number; min: number; max: number; range: number } | null; // per-cell V, temperature corrected
	variables: { method: string; result: string; detail: string } | null;
	limits: { ocv_min_v: number; ocv_max_v: number; expected_ocv_v: number | null };
	units: ReportUnit[];
	/** sigma_model_v: the model's 1σ voltage error (cross-validated for a part's fitted model), V. */
	/** sigma_model_soc_max: for a chemistry calibrated in SOC, its largest 1σ model error (SOC fraction) instead of a σ in V. */
	model: { version: string; chemistry: string; source: string; sigma_model_v?: number | null; sigma_model_soc_max?: number | null };
	decision: { by: string; at: string; kind: 'automatic' | 'override'; reason: string | null; signature?: ReportSignature | null } | null;
}
/** The e-signature manifest of a quality override as printed (21 CFR Part 11, §11.50); hash and challenge are null on older records. */
export interface ReportSignature {
	signer: string;
	meaning: string;
	signed_at: string;
	revision: number | null;
	content_sha256: string | null;
	challenge_id: string | null;
}
export interface TagData {
	lot_code: string;
	po_number: string;
	status: 'on_hold' | 'rejected';
	supplier: string;
	part_number: string;
	chemistry: string;
	quantity: number;
	reason: string;
	safety: boolean;
	date: string;
	url: string; /* encoded in the QR */
}
