/**
 * The lot evaluation as served by GET /api/v1/lots/{id}/evaluation, cached in PostgreSQL by lot
 * revision (lots.revision: bumped by triggers on every write that can change the evaluation; see
 * drizzle/0003_evaluation_revision_triggers.sql). Shared by all app processes; a cached body is
 * served only while its revision is the lot's current one.
 *
 * Race-free by ordering: the revision is read BEFORE the evaluation's inputs, so a body computed
 * from newer data than its revision is at worst labelled older (and then never matches again).
 */
import { and, eq, lt, sql } from 'drizzle-orm';
import type { Database } from '../db';
import { lotEvaluationsCache, lots } from '../db/schema';
import { evaluateLotNow } from './evaluation';
import { servedEvaluation } from './evaluation-body';

export interface LotRevision {
	lotId: string;
	supplierId: string;
	revision: number;
	/** The cached JSON body at this revision (evaluation-body.ts), or null. */
	body: string | null;
}

/** Lot visibility data, revision and cached body in one query; null when there is no such lot. */
export async function lotRevision(db: Database, lotId: string): Promise<LotRevision | null> {
	const [row] = await db
		.select({ supplierId: lots.supplierId, revision: lots.revision, body: lotEvaluationsCache.body })
		.from(lots)
		.leftJoin(lotEvaluationsCache, and(eq(lotEvaluationsCache.lotId, lots.id), eq(lotEvaluationsCache.revision, lots.revision)))
		.where(eq(lots.id, lotId));
	return row ? { lotId, ...row } : null;
}

/** Compute the evaluation now and store its served form (evaluation-body.ts) under the revision read before. */
/** The served evaluation of a lot as JSON text: from the cache at the lot's revision, else computed and cached. */
export async function evaluationBody(db: Database, lotId: string): Promise<string | null> {
	const found = await lotRevision(db, lotId);
	return found ? (found.body ?? (await computeAndCache(db, found))) : null;
}

export async function computeAndCache(db: Database, lot: LotRevision): Promise<string> {
	const body = JSON.stringify(servedEvaluation(await evaluateLotNow(db, lot.lotId)));
	await db
		.insert(lotEvaluationsCache)
		.values({ lotId: lot.lotId, revision: lot.revision, body })
		.onConflictDoUpdate({
			target: lotEvaluationsCache.lotId,
			set: { revision: sql`excluded.revision`, body: sql`excluded.body`, computedAt: sql`excluded.computed_at` },
			// A slower request that read an older revision must not overwrite a newer body.
			setWhere: lt(lotEvaluationsCache.revision, sql`excluded.revision`)
		});
	return body;
}

/** Entity tag of one representation of a lot's evaluation at a revision. */
export const evaluationEtag = (revision: number, variant: 'full' | 'summary') =>
	`"rev-${revision}${variant === 'summary' ? '-summary' : ''}"`;

/** True when an If-None-Match header names this tag (or is `*`). */
export function etagMatches(ifNoneMatch: string | null, etag: string): boolean {
	if (!ifNoneMatch) return false;
	return ifNoneMatch.split(',').some((t) => {
		const tag = t.trim();
		return tag === '*' || tag === etag || tag === `W/${etag}`;
	});
}
