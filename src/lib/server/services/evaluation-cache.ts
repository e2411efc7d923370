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
import { servedEvaluation, servedJson } from './evaluation-body';
import { hashToken, LIVE_TOKEN, tokenUserOf, TOKEN_USER_COLUMNS, TOKEN_USER_FROM, type TokenUserRow } from './tokens';
import type { SessionUser } from '../../roles';

export interface LotRevision {
	lotId: string;
	supplierId: string;
	revision: number;
	/** The cached full body at this revision (ASCII-only JSON, see evaluation-body.ts), or null. */
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

/**
 * A bearer token's user and the lot's revision + cached body in ONE round trip (the endpoint's hot
 * path: half its database work). The token is checked exactly as `userForToken` does (hash, not
 * revoked, user active; same last-use note); null when the token is not live. `lot` is null when
 * there is no such lot. The caller still authorises and checks supplier isolation.
 */
export async function tokenUserAndLotRevision(token: string, lotId: string): Promise<{ user: SessionUser; lot: LotRevision | null } | null> {
	const result = await getPool().query<TokenUserRow & { supplier_id: string | null; revision: number | null; body: string | null }>({
		name: 'restvolt_token_lot_evaluation_cache_v1',
		text: `select ${TOKEN_USER_COLUMNS}, l.supplier_id, l.revision, c.body
			from ${TOKEN_USER_FROM}
				left join lots l on l.id = $2
				left join lot_evaluations_cache c on c.lot_id = l.id and c.revision = l.revision
			where ${LIVE_TOKEN}`,
		values: [hashToken(token), lotId]
	});
	const row = result.rows[0];
	if (!row) return null;
	const lot = row.supplier_id === null ? null : { lotId, supplierId: row.supplier_id, revision: Number(row.revision), body: row.body };
	return { user: await tokenUserOf(row), lot };
}

/** Compute the evaluation now and store its served form (evaluation-body.ts: ASCII-only JSON) under the revision read before. */
export async function computeAndCache(db: Database, lot: LotRevision): Promise<string> {
	const body = servedJson(servedEvaluation(await evaluateLotNow(db, lot.lotId)));
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
