/**
 * Builds the plain ReportData handed to the PDF report, the quarantine tag and the XLSX export,
 * from the latest stored evaluation (or, before any decision, a preliminary evaluation computed now).
 */
import { DISPOSITION, type MaterialDisposition } from '$lib/schemas/disposition';
import { and, desc, eq, lte } from 'drizzle-orm';
import { dateTime, fixed } from '$lib/format';
import { modelErrorSummary, type OcvModel } from '$lib/electrochem';
import { VARIABLES_METHOD } from '$lib/inspection/variables';
import type { Database, Tx } from '../db';
import { decisions, evaluations, lots, organisations, parts, readings, users } from '../db/schema';
import { NotFound } from '../errors';
import type { LotListRow, ReportData, ReportReason, ReportSignature, ReportUnit, TagData } from '../reports';
import type { SignatureManifest } from '../signature-manifest';
import { evaluateLotNow, type EvaluationInputs, type LotEvaluation } from './evaluation';
import { appOrigin } from '../origin';

type Db = Database | Tx;
/** The lot's final disposition (after any quality decision) as the report words it. */
const FINAL: Record<string, 'accept' | 'hold' | 'reject' | undefined> = { accepted: 'accept', on_hold: 'hold', rejected: 'reject' };
type StoredResult = Omit<LotEvaluation, 'inputs' | 'plan'>;
type Engine = { result: StoredResult; plan: LotEvaluation['plan']; inputs: EvaluationInputs; decided: boolean; modelSource: string };

async function loadHeader(db: Db, lotId: string) {
	const [row] = await db
		.select({ lot: lots, part: parts, supplier: organisations.name })
		.from(lots)
		.innerJoin(parts, eq(parts.id, lots.partId))
		.innerJoin(organisations, eq(organisations.id, lots.supplierId))
		.where(eq(lots.id, lotId));
	if (!row) throw new NotFound('lot');
	return row;
}

async function engineFor(db: Db, lotId: string, evaluationId: number | null): Promise<Engine> {
	const which = evaluationId === null ? eq(evaluations.lotId, lotId) : and(eq(evaluations.lotId, lotId), lte(evaluations.id, evaluationId));
	const [stored] = await db.select().from(evaluations).where(which).orderBy(desc(evaluations.id)).limit(1);
	if (stored) {
		const result = stored.result as StoredResult;
		return {
			result,
			plan: stored.plan as LotEvaluation['plan'],
			inputs: stored.inputs as EvaluationInputs,
			decided: true,
			modelSource: result.model?.source ?? 'stored'
		};
	}
	const { inputs, plan, ...result } = await evaluateLotNow(db, lotId);
	return { result, plan, inputs, decided: false, modelSource: result.model.source };
}

/** The raw reading behind each unit's result: the latest per serial, as the engine chose it. */
function rawBySerial(inputs: EvaluationInputs, acById: Map<number, number | null>) {
	const r = inputs.readings;
	const out = new Map<string, { ocv_v: number; temperature_c: number; ac: number | null; at: number }>();
	r.serial.forEach((serial, i) => {
		const at = Date.parse(r.measured_at[i]);
		const seen = out.get(serial);
		if (!seen || at > seen.at)
			out.set(serial, { ocv_v: r.ocv_v[i], temperature_c: r.temperature_c[i], ac: acById.get(r.id[i]) ?? null, at });
	});
	return out;
}

function unitsOf(engine: Engine, acById: Map<number, number | null>): ReportUnit[] {
	const raw = rawBySerial(engine.inputs, acById);
	return engine.result.units.map((u) => {
		const reading = raw.get(u.serial);
		return {
			serial: u.serial,
			ocv_v: reading?.ocv_v ?? u.ocv_cell_v * engine.inputs.part.cells_in_series,
			temperature_c: reading?.temperature_c ?? 25,
			ac_resistance_mohm: reading?.ac ?? null,
			ocv_cell_v: u.ocv_cell_v,
			ocv_at_25c_v: u.ocv_at_25c_v,
			soc: u.soc,
			soc_sigma: u.soc_sigma,
			soc_low: u.soc_low,
			soc_high: u.soc_high,
			determinate: u.determinate,
			expected_ocv_v: u.expected_ocv_v,
			residual_v: u.residual_v,
			flags: [...new Set([...u.flags, ...u.unit_flags])],
			nonconforming: u.nonconforming,
			// Evaluations stored before cell groups existed have no `cell_groups`.
			cell_group_min_v: u.cell_groups?.min_v ?? null,
			cell_group_max_v: u.cell_groups?.max_v ?? null
		};
	});
}

function statsOf(s: StoredResult['stats']): ReportData['stats'] {
	if (!s || s.count === 0 || s.mean === null) return null;
	const n = (x: number | null) => x ?? 0;
	return { count: s.count, mean: s.mean, sd: n(s.sd), median: n(s.median), mad: n(s.mad), min: n(s.min), max: n(s.max), range: n(s.range) };
}

function variablesOf(v: StoredResult['variables']): ReportData['variables'] {
	if (!v || v.status === 'not_applicable') return null;
	// Form 2 (two limits): older stored evaluations have no p̂, so the line is left out for them.
	const { p_upper: pU, p_lower: pL, max_p: maxP } = v;
	const pSum =
		pU != null && pL != null && maxP != null ? `p̂U + p̂L = ${fixed(100 * (pU + pL), 2)} % against M = ${fixed(100 * maxP, 2)} %` : null;
	const detail = [v.reason, v.k !== null ? `k = ${fixed(v.k, 3)}` : null, pSum, v.normality_warning ? 'normality doubtful' : null]
		.filter(Boolean)
		.join('; ');
	return { method: `${VARIABLES_METHOD}; advisory`, result: v.status, detail };
}

/** The stored e-signature manifest as the report prints it (older manifests have no hash or challenge). */
function signatureOf(stored: unknown): ReportSignature | null {
	const m = stored as Partial<SignatureManifest> | null;
	if (!m?.signer_email || !m.signed_at) return null;
	return {
		signer: m.signer_name ? `${m.signer_name} <${m.signer_email}>` : m.signer_email,
		meaning: m.meaning ?? 'quality decision',
		signed_at: m.signed_at,
		revision: m.signed?.revision ?? null,
		content_sha256: m.content_sha256 ?? null,
		challenge_id: m.challenge_id ?? null
	};
}

/** Quality's material disposition and what it asks of the supplier, by when: one line of the report. */
function dispositionReason(disposition: MaterialDisposition, dueDate: string | null): ReportReason {
	const info = DISPOSITION[disposition];
	const asks = info.asks.length
		? ` Asked of the supplier${dueDate ? ` by ${dueDate}` : ''}: ${info.asks.join(' ')}`
		: ' Nothing is asked of the supplier.';
	return { code: 'quality_disposition', severity: 'info', message: `Disposition: ${info.label}.${asks}` };
}

/** The given decision, or the lot's latest one. */
async function decisionFor(db: Db, lotId: string, decisionId: string | null) {
	const [d] = await db
		.select({ d: decisions, name: users.name, email: users.email })
		.from(decisions)
		.leftJoin(users, eq(users.id, decisions.decidedBy))
		.where(decisionId ? and(eq(decisions.lotId, lotId), eq(decisions.id, decisionId)) : eq(decisions.lotId, lotId))
		.orderBy(desc(decisions.decidedAt))
		.limit(1);
	if (!d) return null;
	const by =
		d.d.kind === 'automatic' ? `Disposition engine (submitted by ${d.name ?? d.email ?? 'unknown'})` : (d.name ?? d.email ?? 'unknown');
	const signature = d.d.kind === 'override' ? signatureOf(d.d.signature) : null;
	return {
		view: { by, at: d.d.decidedAt.toISOString(), kind: d.d.kind, reason: d.d.reason, signature },
		toStatus: d.d.toStatus,
		evaluationId: d.d.evaluationId,
		disposition: d.d.disposition,
		dueDate: d.d.supplierDueDate
	};
}

/**
 * The report as of one decision (`decisionId`: what a notice reports, even when it is sent later)
 * or as the lot stands now.
 */
export async function buildReportData(db: Db, lotId: string, opts: { decisionId?: string | null } = {}): Promise<ReportData> {
	const { lot, part, supplier } = await loadHeader(db, lotId);
	const chosen = await decisionFor(db, lotId, opts.decisionId ?? null);
	const [engine, own, acRows] = await Promise.all([
		engineFor(db, lotId, opts.decisionId ? (chosen?.evaluationId ?? null) : null),
		db.select({ name: organisations.name }).from(organisations).where(eq(organisations.kind, 'own')).limit(1),
		db.select({ id: readings.id, ac: readings.acResistanceMohm }).from(readings).where(eq(readings.lotId, lotId))
	]);
	const decision = chosen?.view ?? null;
	const status = opts.decisionId && chosen ? chosen.toStatus : lot.status;
	const result = engine.result;
	const reasons: ReportReason[] = result.reasons.map((r) => ({
		code: r.code,
		severity: r.severity,
		message: r.message,
		...('units' in r && r.units ? { units: r.units } : {})
	}));
	if (!engine.decided)
		reasons.unshift({ code: 'preliminary', severity: 'info', message: 'Preliminary: the lot has not been submitted for decision yet.' });
	const final = FINAL[status];
	if (decision?.kind === 'override' && final) {
		const engineWord = result.status.toUpperCase();
		const said = (decision.reason ?? '').trim();
		const stop = /[.!?]$/.test(said) ? '' : '.'; // the reason's own full stop ends the sentence
		reasons.unshift({
			code: 'quality_decision',
			severity: 'info',
			message: `Quality decision by ${decision.by} (e-signed): “${said}”${stop} The engine's evaluation was ${engineWord}.`
		});
		if (chosen?.disposition) reasons.splice(1, 0, dispositionReason(chosen.disposition, chosen.dueDate));
	}
	const units = unitsOf(engine, new Map(acRows.map((r) => [r.id, r.ac])));
	return {
		generated_at: new Date().toISOString(),
		company: { name: own[0]?.name ?? 'Receiving inspection' },
		lot: {
			id: lot.id,
			lot_code: lot.lotCode,
			po_number: lot.poNumber,
			status,
			quantity: lot.quantity,
			declared_soc: lot.declaredSoc,
			transport: lot.transport,
			un_number: lot.unNumber,
			packing: lot.packing,
			// Evaluations stored before the DG rules table have no dg_rule.
			dg_rule: (engine.result.dg_rule as string | null | undefined) ?? null,
			received_at: lot.receivedAt?.toISOString() ?? null,
			created_at: lot.createdAt.toISOString()
		},
		supplier: { name: supplier },
		part: {
			part_number: part.partNumber,
			description: part.description,
			chemistry: part.chemistry,
			cells_in_series: part.cellsInSeries,
			cells_in_parallel: part.cellsInParallel,
			nominal_capacity_ah: part.nominalCapacityAh
		},
		plan: {
			...engine.plan,
			aql: engine.inputs.plan_request.aql,
			level: engine.inputs.plan_request.level
		},
		severity: result.severity,
		disposition: {
			status: engine.decided ? (final ?? result.status) : 'pending',
			safety: result.safety,
			reasons,
			nonconforming: result.nonconforming
		},
		stats: statsOf(result.stats),
		variables: variablesOf(result.variables),
		limits: {
			ocv_min_v: part.ocvMinCellV,
			ocv_max_v: part.ocvMaxCellV,
			expected_ocv_v: units.find((u) => u.expected_ocv_v !== null)?.expected_ocv_v ?? null
		},
		units,
		model: {
			version: result.model.version,
			chemistry: result.model.chemistry,
			source: engine.modelSource,
			...reportModelError(engine.inputs.model)
		},
		decision
	};
}

/** The quarantine tag's data; null when the lot is neither on hold nor rejected. */
export function tagDataFrom(report: ReportData): TagData | null {
	const status = report.lot.status;
	if (status !== 'on_hold' && status !== 'rejected') return null;
	const main = report.disposition.reasons.find((r) => r.severity !== 'info');
	const reason =
		report.decision?.kind === 'override' && report.decision.reason
			? report.decision.reason
			: (main?.message ?? 'See the inspection report');
	return {
		lot_code: report.lot.lot_code,
		po_number: report.lot.po_number,
		status,
		supplier: report.supplier.name,
		part_number: report.part.part_number,
		chemistry: report.part.chemistry,
		quantity: report.lot.quantity,
		reason,
		safety: report.disposition.safety,
		date: dateTime(report.decision?.at ?? report.generated_at),
		url: `${appOrigin()}/lots/${report.lot.id}`
	};
}

export const XLSX_MIME = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

/** Download headers; `?inline=1` lets the browser show a PDF in place (the portal's "view"). */
export function fileHeaders(fileName: string, mime: string, url: URL): Record<string, string> {
	const disposition = url.searchParams.get('inline') === '1' && mime === 'application/pdf' ? 'inline' : 'attachment';
	return {
		'Content-Type': mime,
		'Content-Disposition': `${disposition}; filename="${fileName.replace(/[^\w.-]/g, '_')}"`,
		'Cache-Control': 'private, no-store'
	};
}

/** Rows of the lot-list export, newest first; suppliers only ever get their own organisation's lots. */
export async function lotListRows(db: Db, filter: { status?: string; supplierId?: string }): Promise<LotListRow[]> {
	const where = [];
	if (filter.status) where.push(eq(lots.status, filter.status as (typeof lots.$inferSelect)['status']));
	if (filter.supplierId) where.push(eq(lots.supplierId, filter.supplierId));
	const rows = await db
		.select({ lot: lots, supplier: organisations.name, partNumber: parts.partNumber, chemistry: parts.chemistry })
		.from(lots)
		.innerJoin(parts, eq(parts.id, lots.partId))
		.innerJoin(organisations, eq(organisations.id, lots.supplierId))
		.where(where.length ? and(...where) : undefined)
		.orderBy(desc(lots.createdAt))
		.limit(10_000);
	return rows.map(({ lot, supplier, partNumber, chemistry }) => ({
		lot_code: lot.lotCode,
		po_number: lot.poNumber,
		supplier,
		part_number: partNumber,
		chemistry,
		quantity: lot.quantity,
		status: lot.status,
		declared_soc: lot.declaredSoc,
		transport: lot.transport,
		created_at: lot.createdAt
	}));
}

/** The model's own error as the report prints it (older stored evaluations may carry no model). */
function reportModelError(model: OcvModel | undefined): { sigma_model_v: number | null; sigma_model_soc_max: number | null } {
	const summary = model ? modelErrorSummary(model) : {};
	return { sigma_model_v: summary.sigma_model_v ?? null, sigma_model_soc_max: summary.sigma_model_soc_max ?? null };
}
