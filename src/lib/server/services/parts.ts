/**
 * Parts: configuration, acceptance limits and sampling settings. All SQL for parts lives here.
 * Buyers own the descriptive fields; quality owns limits, sampling and the OCV model in use.
 */
import { and, asc, desc, eq, ilike, isNotNull, or, type SQL } from 'drizzle-orm';
import type { Database, Tx } from '../db';
import { ocvModels, organisations, parts } from '../db/schema';
import type { SessionUser } from '$lib/roles';
import type { OcvModel } from '$lib/electrochem';
import type { PartDescriptive, PartLimitsForm, PartListQuery } from '$lib/schemas/part';
import { recordAudit } from './audit';
import { invalidFields } from '../errors';

export type PartRow = typeof parts.$inferSelect;
export interface PartView extends PartRow {
	supplierName: string;
	modelVersion: string | null;
	modelName: string | null;
}

export interface ModelChoice {
	id: string;
	version: string;
	name: string;
	origin: 'library' | 'fitted';
	approvedAt: Date | null;
}

function selectViews(db: Database | Tx) {
	return db
		.select({ part: parts, supplierName: organisations.name, modelVersion: ocvModels.version, modelName: ocvModels.name })
		.from(parts)
		.innerJoin(organisations, eq(organisations.id, parts.supplierId))
		.leftJoin(ocvModels, eq(ocvModels.id, parts.modelId));
}
const flatten = ({
	part,
	...rest
}: {
	part: PartRow;
	supplierName: string;
	modelVersion: string | null;
	modelName: string | null;
}): PartView => ({
	...part,
	...rest
});

export async function listParts(db: Database, filter: PartListQuery = {}): Promise<PartView[]> {
	const where: SQL[] = [];
	if (filter.supplier_id) where.push(eq(parts.supplierId, filter.supplier_id));
	if (filter.chemistry) where.push(eq(parts.chemistry, filter.chemistry.toUpperCase()));
	if (filter.search) {
		const like = `%${filter.search.replace(/[\\%_]/g, (c) => '\\' + c)}%`;
		where.push(or(ilike(parts.partNumber, like), ilike(parts.description, like))!);
	}
	const rows = await selectViews(db)
		.where(and(...where))
		.orderBy(asc(organisations.name), asc(parts.partNumber));
	return rows.map(flatten);
}

export async function getPart(db: Database | Tx, id: string): Promise<PartView | null> {
	const [row] = await selectViews(db).where(eq(parts.id, id));
	return row ? flatten(row) : null;
}

/** Approved model versions of a chemistry, newest approval first: the only ones a part may use. */
export async function approvedModels(db: Database | Tx, chemistry: string): Promise<ModelChoice[]> {
	return db
		.select({
			id: ocvModels.id,
			version: ocvModels.version,
			name: ocvModels.name,
			origin: ocvModels.origin,
			approvedAt: ocvModels.approvedAt
		})
		.from(ocvModels)
		.where(and(eq(ocvModels.chemistry, chemistry), isNotNull(ocvModels.approvedAt)))
		.orderBy(desc(ocvModels.approvedAt), desc(ocvModels.createdAt));
}

/** Default configuration for a new part of a chemistry: the library model and its safe window. */
async function defaultsFor(tx: Tx, chemistry: string) {
	const [model] = await tx
		.select({ id: ocvModels.id, parameters: ocvModels.parameters })
		.from(ocvModels)
		.where(and(eq(ocvModels.chemistry, chemistry), eq(ocvModels.origin, 'library'), isNotNull(ocvModels.approvedAt)))
		.orderBy(desc(ocvModels.approvedAt))
		.limit(1);
	if (!model) throw invalidFields([{ path: 'chemistry', message: 'No approved OCV model exists for this chemistry yet' }]);
	const params = model.parameters as OcvModel;
	return { modelId: model.id, ocvMinCellV: params.min_safe_v, ocvMaxCellV: params.max_v };
}

function descriptiveValues(form: PartDescriptive) {
	return {
		supplierId: form.supplier_id,
		partNumber: form.part_number,
		description: form.description,
		chemistry: form.chemistry,
		cellsInSeries: form.cells_in_series,
		cellsInParallel: form.cells_in_parallel,
		nominalCapacityAh: form.nominal_capacity_ah,
		requiredDocuments: form.required_documents
	};
}

async function checkSupplier(tx: Tx, supplierId: string) {
	const [org] = await tx
		.select({ id: organisations.id })
		.from(organisations)
		.where(and(eq(organisations.id, supplierId), eq(organisations.kind, 'supplier')));
	if (!org) throw invalidFields([{ path: 'supplier_id', message: 'No supplier with this id' }]);
}

async function checkPartNumberFree(tx: Tx, supplierId: string, partNumber: string, exceptId?: string) {
	const [clash] = await tx
		.select({ id: parts.id })
		.from(parts)
		.where(and(eq(parts.supplierId, supplierId), eq(parts.partNumber, partNumber)));
	if (clash && clash.id !== exceptId) {
		throw invalidFields([{ path: 'part_number', message: 'This supplier already has a part with this number' }]);
	}
}

/** Buyer: a new part, with the chemistry's library model and window until quality sets limits. */
export async function createPart(db: Database, actor: SessionUser, form: PartDescriptive): Promise<PartRow> {
	return db.transaction(async (tx) => {
		await checkSupplier(tx, form.supplier_id);
		await checkPartNumberFree(tx, form.supplier_id, form.part_number);
		const defaults = await defaultsFor(tx, form.chemistry);
		const [row] = await tx
			.insert(parts)
			.values({ ...descriptiveValues(form), ...defaults })
			.returning();
		await audit(tx, actor, row.id, 'part.create', { ...form });
		return row;
	});
}

/** Buyer: edit descriptive fields. A chemistry change resets the model and window to the new chemistry's defaults. */
export async function updatePartDescriptive(db: Database, actor: SessionUser, id: string, form: PartDescriptive): Promise<PartRow | null> {
	return db.transaction(async (tx) => {
		const current = await getPart(tx, id);
		if (!current) return null;
		await checkSupplier(tx, form.supplier_id);
		await checkPartNumberFree(tx, form.supplier_id, form.part_number, id);
		const reset = current.chemistry !== form.chemistry ? await defaultsFor(tx, form.chemistry) : {};
		const [row] = await tx
			.update(parts)
			.set({ ...descriptiveValues(form), ...reset, updatedAt: new Date() })
			.where(eq(parts.id, id))
			.returning();
		await audit(tx, actor, id, 'part.update', { ...form, modelReset: 'modelId' in reset });
		return row;
	});
}

/** Quality: acceptance limits, sampling settings and the model in use (approved, same chemistry). */
export async function updatePartLimits(db: Database, actor: SessionUser, id: string, form: PartLimitsForm): Promise<PartRow | null> {
	return db.transaction(async (tx) => {
		const current = await getPart(tx, id);
		if (!current) return null;
		const allowed = await approvedModels(tx, current.chemistry);
		if (!allowed.some((m) => m.id === form.model_id)) {
			throw invalidFields([{ path: 'model_id', message: `Choose an approved ${current.chemistry} model version` }]);
		}
		const values = {
			modelId: form.model_id,
			ocvMinCellV: form.ocv_min_cell_v,
			ocvMaxCellV: form.ocv_max_cell_v,
			residualToleranceMv: form.residual_tolerance_mv,
			spreadLimitMv: form.spread_limit_mv,
			imbalanceLimitMv: form.imbalance_limit_mv,
			outlierK: form.outlier_k,
			selfDischargeLimitMvPerDay: form.self_discharge_limit_mv_per_day,
			declaredSocTolerance: form.declared_soc_tolerance_pct / 100,
			meterAccuracyV: form.meter_accuracy_mv / 1000,
			aql: form.aql,
			inspectionLevel: form.inspection_level
		};
		const [row] = await tx
			.update(parts)
			.set({ ...values, updatedAt: new Date() })
			.where(eq(parts.id, id))
			.returning();
		const before = Object.fromEntries(Object.keys(values).map((k) => [k, current[k as keyof typeof values]]));
		await audit(tx, actor, id, 'part.limits', { before, after: values });
		return row;
	});
}

function audit(tx: Tx, actor: SessionUser, partId: string, action: string, details: Record<string, unknown>) {
	return recordAudit(tx, { actorId: actor.id, actorEmail: actor.email, action, entityType: 'part', entityId: partId, details });
}

/** The voltage limits in the units the form and the API share (V, mV, mV/day, k). */
function voltageLimits(p: PartRow) {
	return {
		ocv_min_cell_v: p.ocvMinCellV,
		ocv_max_cell_v: p.ocvMaxCellV,
		residual_tolerance_mv: p.residualToleranceMv,
		spread_limit_mv: p.spreadLimitMv,
		imbalance_limit_mv: p.imbalanceLimitMv,
		outlier_k: p.outlierK,
		self_discharge_limit_mv_per_day: p.selfDischargeLimitMvPerDay
	};
}

/** The limits form's starting values (V, mV, %) from a stored part. */
export function limitsFormValues(p: PartRow): PartLimitsForm {
	return {
		model_id: p.modelId ?? '',
		...voltageLimits(p),
		declared_soc_tolerance_pct: Math.round(p.declaredSocTolerance * 1e6) / 1e4,
		meter_accuracy_mv: Math.round(p.meterAccuracyV * 1e6) / 1e3,
		aql: p.aql,
		inspection_level: p.inspectionLevel as PartLimitsForm['inspection_level']
	};
}

export function descriptiveFormValues(p: PartRow): PartDescriptive {
	return {
		supplier_id: p.supplierId,
		part_number: p.partNumber,
		description: p.description,
		chemistry: p.chemistry,
		cells_in_series: p.cellsInSeries,
		cells_in_parallel: p.cellsInParallel,
		nominal_capacity_ah: p.nominalCapacityAh,
		required_documents: p.requiredDocuments.filter((d): d is PartDescriptive['required_documents'][number] =>
			['coc', 'un38_3_summary', 'sds'].includes(d)
		)
	};
}

/** snake_case JSON for the API. */
export function partJson(p: PartView) {
	return {
		id: p.id,
		supplier_id: p.supplierId,
		supplier_name: p.supplierName,
		part_number: p.partNumber,
		description: p.description,
		chemistry: p.chemistry,
		cells_in_series: p.cellsInSeries,
		cells_in_parallel: p.cellsInParallel,
		nominal_capacity_ah: p.nominalCapacityAh,
		model: p.modelId ? { id: p.modelId, version: p.modelVersion, name: p.modelName } : null,
		limits: {
			...voltageLimits(p),
			declared_soc_tolerance: p.declaredSocTolerance,
			meter_accuracy_v: p.meterAccuracyV
		},
		sampling: { aql: p.aql, inspection_level: p.inspectionLevel },
		required_documents: p.requiredDocuments,
		updated_at: p.updatedAt.toISOString()
	};
}
