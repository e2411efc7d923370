// Switching rules per supplier × part, replayed from an ordered lot history (oldest first).
// Edition implemented: ISO 2859-1:1999 clause 9 only (switching score of 9.3.3.2 for normal -> reduced;
// Amd 1:2011 not checked separately). Its reduced plans (Table 2-C) have Re = Ac + 1, so a lot on
// reduced inspection is either accepted or not: the older "accepted between Ac and Re -> back to
// normal" rule does not exist in this edition. Only lots on original inspection count (9.3): a
// resubmitted lot (resubmitted: true) is skipped. Clause numbers cited from memory: 9.3.1
// normal->tightened, 9.3.2 tightened->normal, 9.3.3 normal->reduced, 9.3.4 reduced->normal, 9.4.
import { LETTERS } from './iso2859/tables';
import { aqlIndex, resolveCell, tighterNormalAccept } from './iso2859/plan';
import type { CodeLetter, Severity, SwitchingState } from './types';

export interface LotOutcome {
	kind?: 'lot';
	lot_id: string;
	accepted: boolean;
	severity_used?: Severity;
	nonconforming?: number;
	sample_size?: number;
	decided_at: string;
	/** A lot submitted again after non-acceptance: not an original inspection, so it does not count (9.3). */
	resubmitted?: boolean;
}

/** Explicit approval to restart inspection after discontinuation (ISO 2859-1:1999 9.4). */
export interface ResumeEvent {
	kind: 'resume';
	decided_at: string;
	note?: string;
}

export type SwitchingEntry = LotOutcome | ResumeEvent;

export interface SwitchingOptions {
	aql: number;
	/** Table I letter of the part's usual lot (the plan letter follows from the table's arrows). */
	code_letter: CodeLetter;
	/** Responsible authority allows reduced inspection (9.3.3 c). Default true. */
	reducedAllowed?: boolean;
	/** Production at a steady rate (9.3.3 b). Default true. */
	productionSteady?: boolean;
}

export interface SwitchingStep {
	lot_id: string | null;
	from: SwitchingState;
	to: SwitchingState;
	reason: string;
}

export interface SwitchingResult {
	severity: SwitchingState;
	switching_score: number;
	history: SwitchingStep[];
}

interface Tracker {
	state: SwitchingState;
	score: number;
	recentNormal: boolean[]; // last <= 5 lots on normal, true = not accepted
	tightenedAcceptRun: number;
	tightenedRejections: number;
}

function planNumbers(severity: Severity, letter: CodeLetter, aqlIdx: number) {
	const cell = resolveCell(severity, LETTERS.indexOf(letter), aqlIdx);
	return { planLetter: LETTERS[cell.letterIndex], ac: cell.ac, re: cell.re };
}

/** ISO 2859-1:1999 9.3.3.2 a): update of the switching score after a lot on normal inspection. */
export function nextSwitchingScore(score: number, lot: LotOutcome, normalAccept: number, tighterAccept: number | null): number {
	if (!lot.accepted) return 0;
	if (normalAccept <= 1) return score + 2;
	// Ac >= 2: +3 only if the lot would also pass one AQL step tighter; unknown counts cannot earn it.
	if (tighterAccept === null || lot.nonconforming === undefined) return 0;
	return lot.nonconforming <= tighterAccept ? score + 3 : 0;
}

function enter(t: Tracker, to: SwitchingState): void {
	t.state = to;
	t.score = 0;
	t.recentNormal = [];
	t.tightenedAcceptRun = 0;
	t.tightenedRejections = 0;
}

function onNormal(t: Tracker, lot: LotOutcome, opts: SwitchingOptions, aqlIdx: number): string | null {
	t.recentNormal = [...t.recentNormal, !lot.accepted].slice(-5);
	const rejections = t.recentNormal.filter(Boolean).length;
	if (rejections >= 2) {
		const window = t.recentNormal.length; // read before enter() clears it
		enter(t, 'tightened');
		return `${rejections} of the last ${window} lots on normal inspection were not accepted (ISO 2859-1:1999 9.3.1).`;
	}
	const plan = planNumbers('normal', opts.code_letter, aqlIdx);
	t.score = nextSwitchingScore(t.score, lot, plan.ac, tighterNormalAccept(plan.planLetter, aqlIdx));
	const allowed = (opts.reducedAllowed ?? true) && (opts.productionSteady ?? true);
	if (t.score >= 30 && allowed) {
		const score = t.score;
		enter(t, 'reduced');
		return `Switching score reached ${score} (≥ 30) with steady production and approval (ISO 2859-1:1999 9.3.3).`;
	}
	return null;
}

function onTightened(t: Tracker, lot: LotOutcome): string | null {
	if (lot.accepted) {
		t.tightenedAcceptRun += 1;
		if (t.tightenedAcceptRun >= 5) {
			enter(t, 'normal');
			return '5 consecutive lots accepted on tightened inspection (ISO 2859-1:1999 9.3.2).';
		}
		return null;
	}
	t.tightenedAcceptRun = 0;
	t.tightenedRejections += 1;
	if (t.tightenedRejections >= 5) {
		enter(t, 'discontinued');
		return '5 lots not accepted while on tightened inspection: inspection discontinued until the supplier acts (ISO 2859-1:1999 9.4).';
	}
	return null;
}

function onReduced(t: Tracker, lot: LotOutcome, opts: SwitchingOptions): string | null {
	if (!lot.accepted) {
		enter(t, 'normal');
		return 'A lot was not accepted on reduced inspection (ISO 2859-1:1999 9.3.4 a).';
	}
	if (!(opts.productionSteady ?? true)) {
		enter(t, 'normal');
		return 'Production no longer steady (ISO 2859-1:1999 9.3.4 b).';
	}
	return null;
}

/** Replay the history and return the severity for the next lot with the steps that led to it. */
export function switchingState(entries: readonly SwitchingEntry[], opts: SwitchingOptions): SwitchingResult {
	const aqlIdx = aqlIndex(opts.aql);
	if (aqlIdx < 0) throw new RangeError(`AQL ${opts.aql} is not in the preferred series.`);
	const t: Tracker = { state: 'normal', score: 0, recentNormal: [], tightenedAcceptRun: 0, tightenedRejections: 0 };
	const history: SwitchingStep[] = [];
	for (const entry of entries) {
		const from = t.state;
		if (entry.kind === 'resume') {
			if (from === 'discontinued') {
				enter(t, 'tightened');
				history.push({
					lot_id: null,
					from,
					to: 'tightened',
					reason: 'Inspection resumed on tightened inspection after corrective action was approved (ISO 2859-1:1999 9.4).'
				});
			}
			continue;
		}
		if (from === 'discontinued') {
			history.push({
				lot_id: entry.lot_id,
				from,
				to: from,
				reason: 'Lot ignored for switching: inspection is discontinued until an explicit resume.'
			});
			continue;
		}
		if (entry.resubmitted) {
			history.push({
				lot_id: entry.lot_id,
				from,
				to: from,
				reason: 'Resubmitted lot: not an original inspection, so it does not count for switching (ISO 2859-1:1999 9.3).'
			});
			continue;
		}
		const reason =
			from === 'normal' ? onNormal(t, entry, opts, aqlIdx) : from === 'tightened' ? onTightened(t, entry) : onReduced(t, entry, opts);
		if (reason) history.push({ lot_id: entry.lot_id, from, to: t.state, reason });
	}
	return { severity: t.state, switching_score: t.score, history };
}
