// Switching-rule sequences, each citing the ISO 2859-1:1999 clause it exercises (clause numbers from
// memory; the rules themselves also appear in MIL-STD-105E 4.7).
import { describe, expect, it } from 'vitest';
import { switchingState, nextSwitchingScore, type LotOutcome, type SwitchingEntry } from '../../../src/lib/inspection';

let seq = 0;
const lot = (accepted: boolean, nonconforming?: number): SwitchingEntry => {
	seq += 1;
	return { lot_id: `LOT-${seq}`, accepted, nonconforming, decided_at: new Date(Date.UTC(2025, 0, seq)).toISOString() };
};
const many = (count: number, accepted: boolean, nonconforming?: number) =>
	Array.from({ length: count }, () => lot(accepted, nonconforming));
// K at AQL 0.10 -> Ac 0 (score +2 per accepted lot); K at AQL 1.0 -> Ac 3, one step tighter (0.65) Ac 2.
const ACZERO = { aql: 0.1, code_letter: 'K' as const };
const ACTHREE = { aql: 1.0, code_letter: 'K' as const };

describe('normal -> tightened (ISO 2859-1:1999 9.3.1: 2 of 5 or fewer consecutive lots not accepted)', () => {
	it('switches on the second rejection within five lots', () => {
		const r = switchingState([lot(true), lot(false), lot(true), lot(false)], ACZERO);
		expect(r.severity).toBe('tightened');
		expect(r.history).toHaveLength(1);
		expect(r.history[0]).toMatchObject({ from: 'normal', to: 'tightened' });
		// The reason names the window it counted: 2 not accepted among the last 4 lots.
		expect(r.history[0].reason).toMatch(/^2 of the last 4 lots on normal inspection were not accepted/);
	});
	it('does not switch when the two rejections are six lots apart', () => {
		const r = switchingState([lot(false), ...many(4, true), lot(false)], ACZERO);
		expect(r.severity).toBe('normal');
	});
});

describe('tightened -> normal (9.3.2: 5 consecutive lots accepted)', () => {
	it('returns to normal after exactly five accepted lots, not four', () => {
		const start = [lot(false), lot(false)];
		expect(switchingState([...start, ...many(4, true)], ACZERO).severity).toBe('tightened');
		expect(switchingState([...start, ...many(5, true)], ACZERO).severity).toBe('normal');
	});
});

describe('discontinuation (9.4: 5 lots not accepted on tightened)', () => {
	// Two rejections on normal start tightened; the next five rejections (with accepted lots between) count.
	const four = [lot(false), lot(false), lot(false), lot(true), lot(false), lot(true), lot(false), lot(false)];
	it('four rejections on tightened are not enough', () => {
		expect(switchingState(four, ACZERO).severity).toBe('tightened');
	});
	const history = [...four, lot(false)];
	it('discontinues at the fifth cumulative rejection on tightened', () => {
		const r = switchingState(history, ACZERO);
		expect(r.severity).toBe('discontinued');
		expect(r.history.map((h) => h.to)).toEqual(['tightened', 'discontinued']);
	});
	it('stays discontinued until an explicit resume, then restarts on tightened', () => {
		const after = [...history, lot(true), lot(true)];
		expect(switchingState(after, ACZERO).severity).toBe('discontinued');
		const resumed = switchingState([...after, { kind: 'resume', decided_at: '2025-03-01T00:00:00Z' }], ACZERO);
		expect(resumed.severity).toBe('tightened');
	});
});

describe('normal -> reduced (9.3.3, switching score of 9.3.3.2)', () => {
	it('Ac 0 or 1: +2 per accepted lot, reduced once the score reaches 30 (15 lots)', () => {
		const fourteen = switchingState(many(14, true, 0), ACZERO);
		expect([fourteen.severity, fourteen.switching_score]).toEqual(['normal', 28]);
		expect(switchingState(many(15, true, 0), ACZERO).severity).toBe('reduced');
	});
	it('Ac ≥ 2: +3 only when the lot passes one AQL step tighter, otherwise reset', () => {
		expect(switchingState(many(10, true, 2), ACTHREE).severity).toBe('reduced');
		// 3 nonconforming is accepted at Ac 3 but not at the tighter Ac 2: the score resets.
		const r = switchingState([...many(9, true, 2), lot(true, 3)], ACTHREE);
		expect([r.severity, r.switching_score]).toEqual(['normal', 0]);
	});
	it('a rejected lot resets the score (9.3.3.2)', () => {
		expect(nextSwitchingScore(27, { lot_id: 'x', accepted: false, decided_at: '' }, 0, null)).toBe(0);
	});
	it('needs the responsible authority (reducedAllowed) and steady production (9.3.3 b, c)', () => {
		const r = switchingState(many(20, true, 0), { ...ACZERO, reducedAllowed: false });
		expect(r.severity).toBe('normal');
		expect(r.switching_score).toBeGreaterThanOrEqual(30);
		expect(switchingState(many(20, true, 0), { ...ACZERO, productionSteady: false }).severity).toBe('normal');
	});
});

describe('reduced -> normal (ISO 2859-1:1999 9.3.4 a; no Ac/Re gap in Table 2-C)', () => {
	it('a lot not accepted on reduced reinstates normal', () => {
		const r = switchingState([...many(15, true, 0), lot(false)], ACZERO);
		expect(r.severity).toBe('normal');
		expect(r.history.at(-1)).toMatchObject({ from: 'reduced', to: 'normal' });
	});
	it('an accepted lot keeps reduced inspection whatever its count (the 1999 edition dropped the gap rule)', () => {
		// Reduced K at AQL 1.0 is n 50, Ac 2, Re 3 in Table 2-C of 1999: 2 nonconforming is simply accepted.
		const reduced = many(10, true, 0);
		expect(switchingState([...reduced, lot(true, 2)], ACTHREE).severity).toBe('reduced');
		expect(switchingState([...reduced, lot(true, 2)], ACTHREE).history.some((h) => /between Ac/.test(h.reason))).toBe(false);
	});
});

describe('original inspection only (ISO 2859-1:1999 9.3)', () => {
	it('a resubmitted lot does not count toward tightening', () => {
		const resubmitted: LotOutcome = { ...(lot(false) as LotOutcome), resubmitted: true };
		const r = switchingState([lot(false), resubmitted, lot(true)], ACZERO);
		expect(r.severity).toBe('normal');
		expect(r.history.at(-1)?.reason).toMatch(/Resubmitted lot/);
	});
	it('the same lot on original inspection does count', () => {
		const r = switchingState([lot(false), lot(false), lot(true)], ACZERO);
		expect(r.severity).toBe('tightened');
	});
});
