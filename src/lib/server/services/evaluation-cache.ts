/**
 * The lot evaluation as served by GET /api/v1/lots/{id}/evaluation, cached in PostgreSQL by lot
 * revision (lots.revision: bumped by triggers on every write that can change the evaluation; see
 * drizzle/0003_evaluation_revision_triggers.sql). Shared by all app processes; a cached body is
 * served only while its revision is the lot's current one.
 *
 * Race-free by ordering: the revision is read BEFORE the evaluation's inputs, so a body computed
 * from newer data than its revision is at worst labelled older (and then never matches again).
 */
import { sql } from 'drizzle-orm';
import { getPool, type Database } from '../db';
import { evaluateLotNow } from './evaluation';

export interface LotRevision {
	lotId: string;
	supplierId: string;
	revision: number;
	/** The cached full body at this revision, or null. */
	body: string | null;
}

/**
 * Lot visibility data, revision and cached body in one round trip; null when there is no such lot.
 * A named statement on the pool: parsed and planned once per connection.
 */
export async function lotRevision(lotId: string): Promise<LotRevision | null> {
	const result = await getPool().query<{ supplier_id: string; revision: number; body: string | null }>({
		name: 'restvolt_lot_evaluation_cache_v1',
		text: `select l.supplier_id, l.revision, c.body
			from lots l left join lot_evaluations_cache c on c.lot_id = l.id and c.revision = l.revision
			where l.id = $1`,
		values: [lotId]
	});
	const row = result.rows[0];
	return row ? { lotId, supplierId: row.supplier_id, revision: Number(row.revision), body: row.body } : null;
}

/** Compute the evaluation now and store its serialised form under the revision read before. */
export async function computeAndCache(db: Database, lot: LotRevision): Promise<string> {
	const body = JSON.stringify(await evaluateLotNow(db, lot.lotId));
	await db.execute(sql`
		insert into lot_evaluations_cache (lot_id, revision, body, computed_at)
		values (${lot.lotId}, ${lot.revision}, ${body}, now())
		on conflict (lot_id) do update set revision = excluded.revision, body = excluded.body, computed_at = excluded.computed_at
		where lot_evaluations_cache.revision < excluded.revision`);
	return body;
}

/** Entity tag of one representation of a lot's evaluation at a revision. */
export const evaluationEtag = (revision: number, variant: 'full' | 'summary') => `"rev-${revision}${variant === 'summary' ? '-summary' : ''}"`;

/** True when an If-None-Match header names this tag (or is `*`). */
export function etagMatches(ifNoneMatch: string | null, etag: string): boolean {
	if (!ifNoneMatch) return false;
	return ifNoneMatch.split(',').some((t) => {
		const tag = t.trim();
		return tag === '*' || tag === etag || tag === `W/${etag}`;
	});
}
