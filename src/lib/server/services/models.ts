/**
 * OCV model versions: library versions (seeded, approved) and versions fitted to a reference curve.
 * A fitted version is stored unapproved; a quality manager approves it before parts may use it.
 * The server always refits from the submitted points, so stored parameters are its own work.
 */
import { alias } from 'drizzle-orm/pg-core';
import { and, asc, desc, eq, isNotNull, isNull, like, type SQL } from 'drizzle-orm';
import { fitCombinedModel, getLibraryModel, validateModel, type ChemistryCode, type CurvePoint, type OcvModel } from '../../electrochem';
import { getDb } from '../db';
import { ocvModels, users } from '../db/schema';
import { recordAudit } from './audit';
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
	{ ok: true; version: ModelVersion } | { ok: false; reason: string; rmse_v: number; max_error_v: number; monotonic: boolean };

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

/** Fit the combined model to a reference curve and store it as a new, unapproved version. */
export async function saveFittedModel(
	actor: Actor,
	input: { chemistry: ChemistryCode; temperature_c: number; points: CurvePoint[]; label?: string }
): Promise<SaveFitResult> {
	const fit = fitCombinedModel({ chemistry: input.chemistry, temperature_c: input.temperature_c, points: input.points });
	if (!fit.ok || !fit.model) {
		return { ok: false, reason: fit.error ?? 'fit rejected', rmse_v: fit.rmse_v, max_error_v: fit.max_error_v, monotonic: fit.monotonic };
	}
	const base = getLibraryModel(input.chemistry);
	const label = input.label?.trim();
	for (let attempt = 0; attempt < 3; attempt++) {
		const version = await nextFitVersion(input.chemistry);
		const model: OcvModel = { ...fit.model, version, name: label ? `${base.name} — ${label}` : `${base.name} (fitted)` };
		try {
			const id = await insertFitted(actor, model, fit.rmse_v, fit.max_error_v, input.temperature_c, input.points.length);
			const saved = await getModelVersion(id);
			return { ok: true, version: saved!.version };
		} catch (e) {
			if (!isUniqueViolation(e)) throw e; // someone saved the same version number at once: try the next
		}
	}
	throw new Error('could not choose a free version number');
}

async function insertFitted(actor: Actor, model: OcvModel, rmse: number, maxError: number, temperatureC: number, pointCount: number) {
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
				temperature_c: temperatureC,
				points: pointCount
			}
		});
		return row.id;
	});
}

export type ApproveResult = 'approved' | 'not_found' | 'already_approved';

/** Approve a stored version (once); audited with the approver. */
export async function approveModel(actor: Actor, id: string): Promise<ApproveResult> {
	return getDb().transaction(async (tx) => {
		const [row] = await tx
			.update(ocvModels)
			.set({ approvedBy: actor.id, approvedAt: new Date() })
			.where(and(eq(ocvModels.id, id), isNull(ocvModels.approvedAt)))
			.returning({ id: ocvModels.id, chemistry: ocvModels.chemistry, version: ocvModels.version });
		if (!row) {
			const [exists] = await tx.select({ id: ocvModels.id }).from(ocvModels).where(eq(ocvModels.id, id));
			return exists ? 'already_approved' : 'not_found';
		}
		await recordAudit(tx, {
			actorId: actor.id,
			actorEmail: actor.email,
			action: 'model.approved',
			entityType: 'ocv_model',
			entityId: row.id,
			details: { chemistry: row.chemistry, version: row.version }
		});
		return 'approved';
	});
}
