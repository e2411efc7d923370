/**
 * Current inspection severity per supplier × part, replayed from the lot history in the database
 * with the pure switching rules of src/lib/inspection (ISO 2859-1:1999 clause 9).
 *
 * "Not accepted" (ISO 2859-1 9.3: lots "not accepted on original inspection"): a lot counts by the
 * FIRST automatic disposition of the engine — the original inspection. A lot first put on hold and
 * later released by quality counts as not accepted, and a lot first accepted stays accepted even if
 * it is overridden later: resubmissions and reviews do not rewrite the original inspection. When a
 * lot has no decision row (older data), its current status is used (accepted vs on_hold/rejected).
 * Lots are ordered by the time of that original decision. Cancelled lots never count, and a lot marked
 * resubmitted (lots.resubmitted) is listed but skipped by the rules: it is not an original inspection.
 */
import { sql } from 'drizzle-orm';
import {
	codeLetter,
	median,
	switchingState,
	type InspectionLevel,
	type Severity,
	type SwitchingEntry,
	type SwitchingState,
	type SwitchingStep
} from '$lib/inspection';
import type { Database, Tx } from '../db';

export interface SwitchingLot {
	lot_id: string;
	lot_code: string;
	decided_at: string;
	accepted: boolean;
	/** The original disposition (accepted / on_hold / rejected). */
	original_status: string;
	/** Submitted again after non-acceptance: does not count for switching (ISO 2859-1:1999 9.3). */
	resubmitted: boolean;
	nonconforming: number | null;
	severity_used: Severity | null;
}

export interface SwitchingStepView extends SwitchingStep {
	lot_code: string | null;
	at: string;
}

export interface SeverityView {
	severity: SwitchingState;
	switching_score: number;
	/** The switches (steps) that led to the current severity, oldest first. */
	history: SwitchingStepView[];
	/** The decided lots replayed, oldest first. */
	lots: SwitchingLot[];
	resumptions: Array<{ at: string; reason: string }>;
	aql: number;
	code_letter: string;
}

export interface SeverityOptions {
	/** Only lots originally decided before this moment (the severity that applied to a lot). */
	before?: Date | null;
	excludeLotId?: string | null;
}

interface HistoryRow extends Record<string, unknown> {
	lot_id: string;
	lot_code: string;
	quantity: number;
	resubmitted: boolean;
	original_status: string;
	decided_at: Date | string;
	nonconforming: number | null;
	severity_used: string | null;
}

const iso = (d: Date | string) => (d instanceof Date ? d : new Date(d)).toISOString();

/** The lot state an engine result stands for (an accept that waits for quality still counts as accepted). */
const ORIGINAL_OF_EVALUATION = sql`case e.disposition when 'accept' then 'accepted' when 'hold' then 'on_hold' when 'reject' then 'rejected' end`;

async function decidedLots(db: Database | Tx, supplierId: string, partId: string, opts: SeverityOptions): Promise<HistoryRow[]> {
	const before = opts.before ?? null;
	const result = await db.execute<HistoryRow>(sql`
		select l.id as lot_id, l.lot_code, l.quantity, l.resubmitted,
		       -- the engine's result on original inspection (its proposal; quality may decide otherwise later)
		       coalesce(${ORIGINAL_OF_EVALUATION}, d.to_status::text, l.status::text) as original_status,
		       coalesce(d.decided_at, l.decided_at) as decided_at,
		       (e.result->>'nonconforming')::int as nonconforming,
		       e.severity::text as severity_used
		from lots l
		left join lateral (
			select x.to_status, x.decided_at, x.evaluation_id from decisions x
			where x.lot_id = l.id and x.kind = 'automatic' and x.to_status in ('accepted', 'on_hold', 'rejected')
			order by x.decided_at, x.id limit 1
		) d on true
		left join evaluations e on e.id = d.evaluation_id
		where l.supplier_id = ${supplierId} and l.part_id = ${partId}
		  and l.status <> 'cancelled'
		  and (d.to_status is not null or (l.decided_at is not null and l.status in ('accepted', 'on_hold', 'rejected')))
		  and (${opts.excludeLotId ?? null}::uuid is null or l.id <> ${opts.excludeLotId ?? null}::uuid)
		  and (${before}::timestamptz is null or coalesce(d.decided_at, l.decided_at) < ${before}::timestamptz)
		order by coalesce(d.decided_at, l.decided_at), l.id`);
	return result.rows;
}

async function resumptions(db: Database | Tx, supplierId: string, partId: string, before: Date | null) {
	const result = await db.execute<{ resumed_at: Date | string; reason: string }>(sql`
		select resumed_at, reason from inspection_resumptions
		where supplier_id = ${supplierId} and part_id = ${partId}
		  and (${before}::timestamptz is null or resumed_at < ${before}::timestamptz)
		order by resumed_at`);
	return result.rows.map((r) => ({ at: iso(r.resumed_at), reason: r.reason }));
}

async function partSampling(db: Database | Tx, partId: string) {
	const result = await db.execute<{ aql: number; inspection_level: string }>(
		sql`select aql, inspection_level from parts where id = ${partId}`
	);
	return result.rows[0] ?? null;
}

const asSeverity = (s: string | null): Severity | null => (s === 'normal' || s === 'tightened' || s === 'reduced' ? s : null);

function toLots(rows: HistoryRow[]): SwitchingLot[] {
	return rows.map((r) => ({
		lot_id: r.lot_id,
		lot_code: r.lot_code,
		decided_at: iso(r.decided_at),
		accepted: r.original_status === 'accepted',
		original_status: r.original_status,
		resubmitted: r.resubmitted === true,
		nonconforming: r.nonconforming === null ? null : Number(r.nonconforming),
		severity_used: asSeverity(r.severity_used)
	}));
}

/** Merge lots and resumptions into one time-ordered list for the replay. */
function entriesOf(lots: SwitchingLot[], resumes: Array<{ at: string; reason: string }>): SwitchingEntry[] {
	const entries: SwitchingEntry[] = [
		...lots.map((l) => ({
			kind: 'lot' as const,
			lot_id: l.lot_id,
			accepted: l.accepted,
			decided_at: l.decided_at,
			...(l.resubmitted ? { resubmitted: true } : {}),
			...(l.nonconforming === null ? {} : { nonconforming: l.nonconforming }),
			...(l.severity_used ? { severity_used: l.severity_used } : {})
		})),
		...resumes.map((r) => ({ kind: 'resume' as const, decided_at: r.at, note: r.reason }))
	];
	return entries.sort((a, b) => Date.parse(a.decided_at) - Date.parse(b.decided_at));
}

/**
 * The severity for the next lot of this supplier × part, with the switches that led to it.
 * The code letter for the switching score is the one of the median lot size in the history.
 */
export async function currentSeverity(
	db: Database | Tx,
	supplierId: string,
	partId: string,
	opts: SeverityOptions = {}
): Promise<SeverityView> {
	const part = await partSampling(db, partId);
	if (!part) throw new Error(`part ${partId} not found`);
	const rows = await decidedLots(db, supplierId, partId, opts);
	const resumes = await resumptions(db, supplierId, partId, opts.before ?? null);
	const lots = toLots(rows);
	const level = part.inspection_level as InspectionLevel;
	const typicalSize = rows.length > 0 ? Math.max(1, Math.round(median(rows.map((r) => Number(r.quantity))))) : 2;
	const letter = codeLetter(typicalSize, level);
	const result = switchingState(entriesOf(lots, resumes), { aql: Number(part.aql), code_letter: letter });
	const byId = new Map(lots.map((l) => [l.lot_id, l]));
	const history = result.history.map((step) => {
		const lot = step.lot_id ? byId.get(step.lot_id) : undefined;
		return { ...step, lot_code: lot?.lot_code ?? null, at: lot?.decided_at ?? '' };
	});
	fillResumeTimes(history, resumes);
	return {
		severity: result.severity,
		switching_score: result.switching_score,
		history,
		lots,
		resumptions: resumes,
		aql: Number(part.aql),
		code_letter: letter
	};
}

/** Resume steps carry no lot: give each the first resumption after the step before it. */
function fillResumeTimes(history: SwitchingStepView[], resumes: Array<{ at: string }>): void {
	let previous = '';
	for (const step of history) {
		if (step.lot_id === null) step.at = resumes.find((r) => r.at > previous)?.at ?? previous;
		previous = step.at;
	}
}
