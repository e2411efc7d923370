/**
 * The lot evaluation computed now from the stored readings: plan and severity, per-unit results
 * from the electrochemistry core, statistics, variables check and the disposition with reasons.
 * A pure read (works inside the caller's transaction); the decisions service stores its result.
 */
import { asc, eq, sql } from 'drizzle-orm';
import {
	evaluateReadings,
	getLibraryModel,
	isChemistryCode,
	modelErrorSummary,
	validateModel,
	type LastDirection,
	type OcvModel
} from '$lib/electrochem';
import {
	evaluateLot,
	samplingPlan,
	type Disposition,
	type InspectionLevel,
	type LotDocument,
	type LotInfo,
	type PartLimits,
	type Reason,
	type SamplingPlan,
	type Severity,
	type SwitchingState,
	type TimedUnitReading
} from '$lib/inspection';
import { dgFamilyOf, type DgSummary, type Packing } from '$lib/inspection/dangerous-goods';
import type { Database, Tx } from '../db';
import { lots, ocvModels, parts, readings } from '../db/schema';
import { nextLotSeverity } from './sampling-state';
import { currentSeverity } from './switching';

/** Added by the service when switching has discontinued inspection (ISO 2859-1 9.4). */
export interface DiscontinuedReason {
	code: 'inspection_discontinued';
	severity: 'hold';
	message: string;
}
export type EvaluationReason = Reason | DiscontinuedReason;

export interface EvaluationInputs {
	/** last_direction: the OCV hysteresis branch the lot declares (absent in snapshots from before it: unknown). */
	lot: LotInfo & { id: string; lot_code: string; status: string; last_direction?: LastDirection };
	part: {
		id: string;
		part_number: string;
		chemistry: string;
		cells_in_series: number;
		cells_in_parallel: number;
		meter_accuracy_v: number;
		aql: number;
		inspection_level: InspectionLevel;
	};
	limits: PartLimits;
	plan_request: { lot_size: number; aql: number; level: InspectionLevel; severity: Severity };
	switching_state: SwitchingState;
	model: OcvModel;
	/** Columnar copy of the readings used, in insertion order. */
	readings: {
		id: number[];
		serial: string[];
		ocv_v: number[];
		temperature_c: number[];
		measured_at: string[];
		/** A pack's cell-group voltages per reading (null: none recorded); absent in snapshots stored before they existed. */
		cell_group_voltages?: Array<number[] | null>;
	};
}

export interface LotEvaluation {
	lot_id: string;
	status: Disposition['status'];
	reasons: EvaluationReason[];
	plan: SamplingPlan;
	severity: SwitchingState;
	stats: Disposition['stats'];
	variables: Disposition['variables'];
	nonconforming: number;
	nonconforming_serials: string[];
	units: Disposition['units'];
	safety: boolean;
	/** The dangerous-goods rule applied, e.g. "IATA DGR 67th ed. PI 966" (null: none applies), and the lot's packing. */
	dg_rule: string | null;
	packing: DgSummary['packing'];
	dg: DgSummary;
	/** Readings stored (a unit measured twice counts twice); units = distinct serials. */
	reading_count: number;
	/** The model used; name, form and σ_model (V; cross-validated for fitted part models) say which and how good. */
	model: {
		id: string | null;
		version: string;
		chemistry: string;
		source: 'part' | 'library';
		name?: string;
		form?: string;
		sigma_model_v?: number;
		/** For a chemistry calibrated in SOC: its largest model σ, SOC fraction (then no sigma_model_v). */
		sigma_model_soc_max?: number;
	};
	inputs: EvaluationInputs;
	evaluated_at: string;
}

export class EvaluationError extends Error {
	constructor(
		readonly code: 'lot_not_found' | 'model_invalid' | 'part_invalid',
		message: string
	) {
		super(message);
	}
}

async function loadLot(db: Database | Tx, lotId: string) {
	const [row] = await db
		.select({ lot: lots, part: parts, modelParameters: ocvModels.parameters, modelId: ocvModels.id })
		.from(lots)
		.innerJoin(parts, eq(parts.id, lots.partId))
		.leftJoin(ocvModels, eq(ocvModels.id, parts.modelId))
		.where(eq(lots.id, lotId));
	return row ?? null;
}

function resolveModel(chemistry: string, modelId: string | null, parameters: unknown): LotEvaluation['model'] & { ocv: OcvModel } {
	const stored = parameters === null || parameters === undefined ? null : validateModel(parameters);
	if (stored) {
		const about = { name: stored.name, form: stored.form, ...modelErrorSummary(stored) };
		return { id: modelId, version: stored.version, chemistry: stored.chemistry, source: 'part', ...about, ocv: stored };
	}
	if (!isChemistryCode(chemistry)) throw new EvaluationError('model_invalid', `No OCV model for chemistry ${chemistry}`);
	const library = getLibraryModel(chemistry);
	const about = { name: library.name, form: library.form, ...modelErrorSummary(library) };
	return { id: null, version: library.version, chemistry: library.chemistry, source: 'library', ...about, ocv: library };
}

async function documentKinds(db: Database | Tx, lotId: string): Promise<LotDocument[]> {
	const result = await db.execute<{ kind: string }>(sql`select distinct kind::text as kind from documents where lot_id = ${lotId}`);
	return result.rows.map((r) => r.kind).filter((k): k is LotDocument => ['coc', 'un38_3_summary', 'sds', 'other'].includes(k));
}

async function loadReadings(db: Database | Tx, lotId: string): Promise<EvaluationInputs['readings']> {
	const rows = await db
		.select({
			id: readings.id,
			serial: readings.serial,
			ocv: readings.ocvV,
			t: readings.temperatureC,
			at: readings.measuredAt,
			groups: readings.cellGroupVoltages
		})
		.from(readings)
		.where(eq(readings.lotId, lotId))
		.orderBy(asc(readings.id));
	const out: Required<EvaluationInputs['readings']> = {
		id: [],
		serial: [],
		ocv_v: [],
		temperature_c: [],
		measured_at: [],
		cell_group_voltages: []
	};
	for (const r of rows) {
		out.id.push(r.id);
		out.serial.push(r.serial);
		out.ocv_v.push(r.ocv);
		out.temperature_c.push(r.t);
		out.measured_at.push(r.at.toISOString());
		out.cell_group_voltages.push(r.groups);
	}
	return out;
}

type LoadedLot = NonNullable<Awaited<ReturnType<typeof loadLot>>>;

function limitsOf(part: LoadedLot['part']): PartLimits {
	return {
		ocv_min_v: part.ocvMinCellV,
		ocv_max_v: part.ocvMaxCellV,
		residual_tolerance_v: part.residualToleranceMv / 1000,
		spread_limit_mv: part.spreadLimitMv,
		outlier_k: part.outlierK,
		self_discharge_limit_mv_per_day: part.selfDischargeLimitMvPerDay,
		declared_soc_tolerance: part.declaredSocTolerance,
		imbalance_limit_mv: part.imbalanceLimitMv
	};
}

/**
 * The severity that applies to this lot: for an undecided lot the stored state for the next lot
 * (equal to the replay of the whole history); for a decided one the replay of the history before
 * its own original decision.
 */
async function severityFor(db: Database | Tx, lot: LoadedLot['lot']): Promise<SwitchingState> {
	if (lot.decidedAt === null) return nextLotSeverity(db, lot.supplierId, lot.partId);
	const view = await currentSeverity(db, lot.supplierId, lot.partId, { excludeLotId: lot.id, before: lot.decidedAt ?? null });
	return view.severity;
}

/** The lot's sampling plan now: part AQL and level, lot size and the switching state. */
async function planForLot(db: Database | Tx, { lot, part }: LoadedLot) {
	const state = await severityFor(db, lot);
	const level = part.inspectionLevel as InspectionLevel;
	// Discontinued inspection has no plan of its own: the next plan on resumption is tightened (9.4).
	const severity: Severity = state === 'discontinued' ? 'tightened' : state;
	const planRequest = { lot_size: lot.quantity, aql: part.aql, level, severity };
	const plan = samplingPlan({ lotSize: lot.quantity, aql: part.aql, level, severity });
	return { state, level, planRequest, plan };
}

/** The sample size the lot's plan asks for now. */
export async function requiredSampleSize(db: Database | Tx, lotId: string): Promise<number> {
	const row = await loadLot(db, lotId);
	if (!row) throw new EvaluationError('lot_not_found', 'lot not found');
	return (await planForLot(db, row)).plan.sample_size;
}

/**
 * Everything computed from the stored readings, reproducible from `inputs`. With LOG_EVALUATIONS=on
 * each computation prints one line (`[evaluation] computed lot=…`): the bench counts them per save.
 */
export async function evaluateLotNow(db: Database | Tx, lotId: string): Promise<LotEvaluation> {
	if (process.env.LOG_EVALUATIONS === 'on') console.log(`[evaluation] computed lot=${lotId}`);
	const row = await loadLot(db, lotId);
	if (!row) throw new EvaluationError('lot_not_found', 'lot not found');
	const { lot, part } = row;
	const model = resolveModel(part.chemistry, row.modelId, row.modelParameters);
	// One after another: inside a transaction these share a single connection.
	const documents = await documentKinds(db, lotId);
	const stored = await loadReadings(db, lotId);
	const { state, level, planRequest, plan } = await planForLot(db, row);
	const lotInfo: LotInfo = {
		quantity: lot.quantity,
		declared_soc: lot.declaredSoc,
		transport: lot.transport,
		lithium_ion: model.ocv.lithium_ion,
		documents,
		required_documents: part.requiredDocuments as LotInfo['documents'],
		un_number: lot.unNumber,
		packing: lot.packing as Packing,
		dg_family: dgFamilyOf(part.chemistry),
		// One cell or battery of the part: nominal voltage × capacity (the PI 966 2.7 Wh threshold reads it).
		// No dg_date: the latest rules apply, since the goods move on (or go back) under today's rules.
		energy_wh: model.ocv.nominal_v * part.cellsInSeries * part.nominalCapacityAh
	};
	const limits = limitsOf(part);
	const inputs: EvaluationInputs = {
		lot: { ...lotInfo, id: lot.id, lot_code: lot.lotCode, status: lot.status, last_direction: lot.lastDirection },
		part: {
			id: part.id,
			part_number: part.partNumber,
			chemistry: part.chemistry,
			cells_in_series: part.cellsInSeries,
			cells_in_parallel: part.cellsInParallel,
			meter_accuracy_v: part.meterAccuracyV,
			aql: part.aql,
			inspection_level: level
		},
		limits,
		plan_request: planRequest,
		switching_state: state,
		model: model.ocv,
		readings: stored
	};
	return {
		...computeEvaluation(inputs, plan),
		lot_id: lot.id,
		model: { id: model.id, version: model.version, chemistry: model.chemistry, source: model.source }
	};
}

/** The pure part: inputs snapshot → evaluation. Re-running it on a stored snapshot reproduces the result. */
export function computeEvaluation(inputs: EvaluationInputs, plan = planOf(inputs)): Omit<LotEvaluation, 'lot_id' | 'model'> {
	const r = inputs.readings;
	const results = evaluateReadings(
		inputs.model,
		r.ocv_v.map((ocv_v, i) => ({ ocv_v, temperature_c: r.temperature_c[i] })),
		{
			cells_in_series: inputs.part.cells_in_series,
			declared_soc: inputs.lot.declared_soc,
			meter_accuracy_v: inputs.part.meter_accuracy_v,
			last_direction: inputs.lot.last_direction ?? 'unknown'
		}
	);
	const timed: TimedUnitReading[] = results.map((result, i) => ({
		serial: r.serial[i],
		measured_at: r.measured_at[i],
		result,
		cell_group_voltages: r.cell_group_voltages?.[i] ?? null
	}));
	const { id: _id, lot_code: _code, status: _status, last_direction: _direction, ...lot } = inputs.lot;
	const disposition = evaluateLot({
		lot,
		plan,
		severity: inputs.plan_request.severity,
		limits: inputs.limits,
		readings: timed,
		aql: inputs.part.aql,
		cells_in_series: inputs.part.cells_in_series,
		cell_limits: { min_safe_v: inputs.model.min_safe_v, max_v: inputs.model.max_v }
	});
	// With no readings at all the core still reports the SOC rules as "indeterminate"; nothing was
	// measured yet, so only "sample incomplete" applies (reported to the inspection core's owner).
	const reasons: EvaluationReason[] = disposition.reasons.filter((x) => r.serial.length > 0 || x.code !== 'soc_indeterminate');
	let status = disposition.status;
	if (inputs.switching_state === 'discontinued') {
		reasons.unshift({
			code: 'inspection_discontinued',
			severity: 'hold',
			message:
				'Inspection of this supplier and part is discontinued (5 lots not accepted on tightened inspection). Quality must approve the supplier’s corrective action and resume inspection.'
		});
		if (status === 'accept') status = 'hold';
	}
	return {
		status,
		reasons,
		plan,
		severity: inputs.switching_state,
		stats: disposition.stats,
		variables: disposition.variables,
		nonconforming: disposition.nonconforming,
		nonconforming_serials: disposition.nonconforming_serials,
		units: disposition.units,
		safety: disposition.safety,
		dg_rule: disposition.dg.rule,
		packing: disposition.dg.packing,
		dg: disposition.dg,
		reading_count: r.serial.length,
		inputs,
		evaluated_at: new Date().toISOString()
	};
}

function planOf(inputs: EvaluationInputs): SamplingPlan {
	const p = inputs.plan_request;
	return samplingPlan({ lotSize: p.lot_size, aql: p.aql, level: p.level, severity: p.severity });
}
