/**
 * OCV model versions: library versions (seeded, approved) and versions fitted to a reference curve.
 * A fitted version is stored unapproved; a quality manager approves it before parts may use it.
 * The server always refits from the submitted points, so stored parameters are its own work.
 */
import { alias } from 'drizzle-orm/pg-core';
import { and, asc, desc, eq, isNotNull, isNull, like, sql, type SQL } from 'drizzle-orm';
import { createHash } from 'node:crypto';
import type { SessionUser } from '$lib/roles';
import {
	fitPartModel,
	getLibraryModel,
	validateModel,
	type ChemistryCode,
	type CurvePoint,
	type FitFormChoice,
	type OcvModel
} from '../../electrochem';
import { getDb } from '../db';
import { auditEvents, ocvModels, users } from '../db/schema';
import { Forbidden, Invalid } from '../errors';
import { canonicalJson } from '../signature-manifest';
import { recordAudit } from './audit';
import { verifySignature } from './decisions';
import type { Actor } from './users';
import type { ModelStatus, ModelVersion } from '../../schemas/electrochem';

export type { ModelStatus, ModelVersion };

const creator = alias(users, 'creator');
const approver = alias(users, 'approver');

const versionColumns = {
	id: ocvModels.id,
	chemistry: ocvModels.chemistry,
	version: ocvModels.version,
	name: ocvModels.name,
	origin: ocvModels.origin,
	source: ocvModels.source,
	fitTemperatureC: ocvModels.fitTemperatureC,
	fitRmseV: ocvModels.fitRmseV,
	fitMaxErrorV: ocvModels.fitMaxErrorV,
	fitSigmaV: ocvModels.fitSigmaV,
	dataSource: ocvModels.dataSource,
	approvalSignature: ocvModels.approvalSignature,
	form: sql<string>`${ocvModels.parameters}->>'form'`,
	pointCount: sql<number | null>`jsonb_array_length(${ocvModels.referencePoints})`,
	createdAt: ocvModels.createdAt,
	createdBy: creator.email,
	approvedAt: ocvModels.approvedAt,
	approvedBy: approver.email
};

type VersionRow = Awaited<ReturnType<typeof versionQuery>>[number];

function toVersion(r: VersionRow): ModelVersion {
	return {
		id: r.id,
		chemistry: r.chemistry,
		version: r.version,
		name: r.name,
		origin: r.origin,
		status: r.approvedAt ? 'approved' : 'awaiting_approval',
		source: r.source,
		fit_temperature_c: r.fitTemperatureC,
		fit_rmse_v: r.fitRmseV,
		fit_max_error_v: r.fitMaxErrorV,
		fit_sigma_v: r.fitSigmaV,
		form: r.form,
		point_count: r.pointCount,
		data_source: r.dataSource,
		approval_reason: (r.approvalSignature as { reason?: string } | null)?.reason ?? null,
		created_at: r.createdAt.toISOString(),
		created_by: r.createdBy,
		approved_at: r.approvedAt?.toISOString() ?? null,
		approved_by: r.approvedBy
	};
}

function versionQuery() {
	return getDb()
		.select(versionColumns)
		.from(ocvModels)
		.leftJoin(creator, eq(creator.id, ocvModels.createdBy))
		.leftJoin(approver, eq(approver.id, ocvModels.approvedBy));
}

/** Versions, library first, then fitted ones newest first. */
export async function listModelVersions(filter: { chemistry?: ChemistryCode; status?: ModelStatus } = {}): Promise<ModelVersion[]> {
	const where: SQL[] = [];
	if (filter.chemistry) where.push(eq(ocvModels.chemistry, filter.chemistry));
	if (filter.status === 'approved') where.push(isNotNull(ocvModels.approvedAt));
	if (filter.status === 'awaiting_approval') where.push(isNull(ocvModels.approvedAt));
	const rows = await versionQuery()
		.where(and(...where))
		.orderBy(asc(ocvModels.chemistry), asc(ocvModels.origin), desc(ocvModels.createdAt));
	return rows.map(toVersion);
}

/** One version with its model; the model is null when the stored JSON no longer validates. */
export async function getModelVersion(id: string): Promise<{ version: ModelVersion; model: OcvModel | null } | null> {
	const [row] = await versionQuery().where(eq(ocvModels.id, id));
	if (!row) return null;
	const [stored] = await getDb().select({ parameters: ocvModels.parameters }).from(ocvModels).where(eq(ocvModels.id, id));
	return { version: toVersion(row), model: validateModel(stored.parameters) };
}

export type SaveFitResult =
	| { ok: true; version: ModelVersion }
	| {
			ok: false;
			reason: string;
			rmse_v: number;
			max_error_v: number;
			monotonic: boolean;
			issues: Array<{ path: string; message: string }>;
	  };

export interface SaveFitInput {
	chemistry: ChemistryCode;
	temperature_c: number;
	points: CurvePoint[];
	label?: string;
	form?: FitFormChoice;
	smooth?: boolean;
	data_source?: string;
}

const FIT_PREFIX = 'fit-';

async function nextFitVersion(chemistry: ChemistryCode): Promise<string> {
	const rows = await getDb()
		.select({ version: ocvModels.version })
		.from(ocvModels)
		.where(and(eq(ocvModels.chemistry, chemistry), like(ocvModels.version, `${FIT_PREFIX}%`)));
	const used = rows.map((r) => Number(r.version.slice(FIT_PREFIX.length))).filter(Number.isInteger);
	return `${FIT_PREFIX}${Math.max(0, ...used) + 1}`;
}

const isUniqueViolation = (e: unknown): boolean =>
	typeof e === 'object' && e !== null && ((e as { code?: string }).code === '23505' || isUniqueViolation((e as { cause?: unknown }).cause));

/** Fit a part model (form auto/nernst/tabulated) to the points and store it as a new, unapproved version with its points. */
export async function saveFittedModel(actor: Actor, input: SaveFitInput): Promise<SaveFitResult> {
	const fit = fitPartModel({
		chemistry: input.chemistry,
		temperature_c: input.temperature_c,
		points: input.points,
		form: input.form,
		smooth: input.smooth
	});
	if (!fit.ok)
		return { ok: false, reason: fit.message, rmse_v: NaN, max_error_v: NaN, monotonic: fit.code !== 'non_monotonic', issues: fit.issues };
	const base = getLibraryModel(input.chemistry);
	const label = input.label?.trim();
	for (let attempt = 0; attempt < 3; attempt++) {
		const version = await nextFitVersion(input.chemistry);
		const model: OcvModel = { ...fit.model, version, name: label ? `${base.name} — ${label}` : `${base.name} (fitted)` };
		try {
			const id = await insertFitted(actor, model, input);
			const saved = await getModelVersion(id);
			return { ok: true, version: saved!.version };
		} catch (e) {
			if (!isUniqueViolation(e)) throw e; // someone saved the same version number at once: try the next
		}
	}
	throw new Error('could not choose a free version number');
}

async function insertFitted(actor: Actor, model: OcvModel, input: SaveFitInput) {
	const rmse = model.fit!.rmse_v;
	const maxError = model.fit!.max_error_v;
	const temperatureC = input.temperature_c;
	const pointCount = input.points.length;
	return getDb().transaction(async (tx) => {
		const [row] = await tx
			.insert(ocvModels)
			.values({
				chemistry: model.chemistry,
				version: model.version,
				name: model.name,
				origin: 'fitted',
				parameters: model,
				source: model.source,
				fitTemperatureC: temperatureC,
				fitRmseV: rmse,
				fitMaxErrorV: maxError,
				fitSigmaV: model.sigma_model_v,
				referencePoints: input.points.map((p) => ({ soc: p.soc, ocv_v: p.ocv_v })),
				dataSource: input.data_source?.trim() || null,
				createdBy: actor.id
			})
			.returning({ id: ocvModels.id });
		await recordAudit(tx, {
			actorId: actor.id,
			actorEmail: actor.email,
			action: 'model.fitted',
			entityType: 'ocv_model',
			entityId: row.id,
			details: {
				chemistry: model.chemistry,
				version: model.version,
				rmse_v: rmse,
				max_error_v: maxError,
				form: model.form,
				sigma_model_v: model.sigma_model_v,
				temperature_c: temperatureC,
				points: pointCount
			}
		});
		return row.id;
	});
}

export type ApproveResult = 'approved' | 'not_found' | 'already_approved';

export const MODEL_APPROVAL_MEANING = 'approval of an OCV model version for use on parts';

/** What the approver signs: the version and a SHA-256 of its exact stored model, so the signature cannot move to other parameters. */
function signedModel(row: { id: string; chemistry: string; version: string; parameters: unknown }, reason: string) {
	const parametersSha256 = createHash('sha256').update(canonicalJson(row.parameters), 'utf8').digest('hex');
	return { model_id: row.id, chemistry: row.chemistry, version: row.version, parameters_sha256: parametersSha256, reason };
}

/**
 * Approve a stored version (once), e-signed: the approver re-enters the password (the same check
 * and throttle as a lot decision) and gives a reason, and must not be the person who fitted it
 * (four eyes). The manifest names signer, meaning, time, reason and the hash of what was signed.
 */
export async function approveModel(
	actor: SessionUser,
	id: string,
	signature: { password: string; reason: string },
	ip: string | null = null
): Promise<ApproveResult> {
	const reason = signature.reason.trim();
	if (reason.length < 5)
		throw new Invalid('Give a reason for the approval (at least 5 characters)', [{ path: 'reason', message: 'Required' }]);
	const [row] = await getDb().select().from(ocvModels).where(eq(ocvModels.id, id));
	if (!row) return 'not_found';
	if (row.approvedAt) return 'already_approved';
	if (row.createdBy === actor.id)
		throw new Forbidden('You fitted this model version; another quality manager must approve it. Nothing was approved.', 'same_person');
	await verifySignature(actor, signature.password, ip);
	const signedAt = new Date();
	const signed = signedModel(row, reason);
	const manifest = {
		signer_id: actor.id,
		signer_name: actor.name,
		signer_email: actor.email,
		meaning: MODEL_APPROVAL_MEANING,
		signed_at: signedAt.toISOString(),
		method: 'password re-entered',
		signed,
		hash_algorithm: 'SHA-256',
		content_sha256: createHash('sha256').update(canonicalJson(signed), 'utf8').digest('hex'),
		reason
	};
	return getDb().transaction(async (tx) => {
		const [won] = await tx
			.update(ocvModels)
			.set({ approvedBy: actor.id, approvedAt: signedAt, approvalSignature: manifest })
			.where(and(eq(ocvModels.id, id), isNull(ocvModels.approvedAt)))
			.returning({ id: ocvModels.id });
		if (!won) return 'already_approved';
		await recordAudit(tx, {
			actorId: actor.id,
			actorEmail: actor.email,
			action: 'model.approved',
			entityType: 'ocv_model',
			entityId: id,
			ip,
			details: { chemistry: row.chemistry, version: row.version, reason, content_sha256: manifest.content_sha256 }
		});
		return 'approved';
	});
}

export interface ModelHistoryEntry {
	at: string;
	action: string;
	by: string | null;
	details: Record<string, unknown>;
}

/** The audit trail of one version, oldest first (fitted, approved). */
export async function modelHistory(id: string): Promise<ModelHistoryEntry[]> {
	const rows = await getDb()
		.select({ at: auditEvents.at, action: auditEvents.action, by: auditEvents.actorEmail, details: auditEvents.details })
		.from(auditEvents)
		.where(and(eq(auditEvents.entityType, 'ocv_model'), eq(auditEvents.entityId, id)))
		.orderBy(asc(auditEvents.at), asc(auditEvents.id));
	return rows.map((r) => ({ at: r.at.toISOString(), action: r.action, by: r.by, details: r.details as Record<string, unknown> }));
}
