import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { TONE_PILL, TONE_TEXT } from '$lib/components/tone';
import { decisions } from '$lib/server/db/schema/decisions';
import { dispositionEnum, lotStatusEnum, noticeStatusEnum, severityEnum, transportEnum } from '$lib/server/db/schema/enums';
import {
	DECISION_KIND,
	INSPECTION_SEVERITY,
	LOT_STATUS,
	MODEL_STATUS,
	NOTICE_DELIVERY,
	REASON_SEVERITY,
	TRANSPORT,
	VARIABLES_RESULT,
	VERDICT,
	lookOf,
	lotStateInText,
	wordOf,
	type Look
} from '$lib/status';

// Restvolt's own vocabulary checked against the codes the database can hold (the schema's enums), so
// no state a person can meet is left without a word; the rest is the design rule "a word and a shape,
// never colour alone" (DESIGN.md, common practice for accessible status display).
const keysOf = (record: object) => Object.keys(record).sort();

describe('every code the database can hold has its word', () => {
	it('covers lot states, verdicts, severities, deliveries, decision kinds and transport modes', () => {
		expect(keysOf(LOT_STATUS)).toEqual([...lotStatusEnum.enumValues].sort());
		for (const code of dispositionEnum.enumValues) expect(VERDICT[code].word).toBeTruthy();
		expect(keysOf(INSPECTION_SEVERITY)).toEqual([...severityEnum.enumValues].sort());
		expect(keysOf(NOTICE_DELIVERY)).toEqual([...noticeStatusEnum.enumValues].sort());
		expect(keysOf(DECISION_KIND)).toEqual([...decisions.kind.enumValues].sort());
		expect(keysOf(TRANSPORT)).toEqual([...transportEnum.enumValues].sort());
	});
});

describe('states are told apart without colour', () => {
	const sets: Array<[string, Record<string, Look>]> = [
		['lot states', LOT_STATUS],
		['verdicts', VERDICT],
		['reason severities', REASON_SEVERITY],
		['inspection severities', INSPECTION_SEVERITY],
		['notice deliveries', NOTICE_DELIVERY],
		['variables results', VARIABLES_RESULT],
		['model versions', MODEL_STATUS]
	];

	it.each(sets)('gives each of the %s its own word and its own shape', (_name, set) => {
		const looks = Object.values(set);
		expect(new Set(looks.map((l) => l.word)).size).toBe(looks.length);
		expect(new Set(looks.map((l) => l.shape)).size).toBe(looks.length);
	});

	it('has a web colour for every tone', () => {
		for (const [, set] of sets) {
			for (const look of Object.values(set)) {
				expect(TONE_TEXT[look.tone]).toMatch(/^text-/);
				expect(TONE_PILL[look.tone]).toContain(TONE_TEXT[look.tone]);
			}
		}
	});

	it('pairs what the rules propose with the state it leads to by shape and tone', () => {
		expect(VERDICT.accept).toMatchObject({ shape: LOT_STATUS.accepted.shape, tone: LOT_STATUS.accepted.tone });
		expect(VERDICT.hold).toMatchObject({ shape: LOT_STATUS.on_hold.shape, tone: LOT_STATUS.on_hold.tone });
		expect(VERDICT.reject).toMatchObject({ shape: LOT_STATUS.rejected.shape, tone: LOT_STATUS.rejected.tone });
	});

	it('shows an indeterminate reading calmly, never in an error tone', () => {
		expect(VERDICT.indeterminate.tone).toBe('info');
	});
});

describe('codes outside the vocabulary', () => {
	it('are written as words with a calm, neutral look', () => {
		expect(lookOf(LOT_STATUS, 'quarantined_elsewhere')).toEqual({ word: 'Quarantined elsewhere', shape: 'ring', tone: 'muted' });
		expect(wordOf(TRANSPORT, 'pipeline')).toBe('Pipeline');
		expect(wordOf(LOT_STATUS, 'in_inspection')).toBe('On the bench');
		expect(wordOf(TRANSPORT, 'sea')).toBe('Sea');
		expect(lotStateInText('in_inspection')).toBe('on the bench');
	});
});

describe('one vocabulary in the code', () => {
	const root = join(__dirname, '../../src');
	const files = (dir: string): string[] =>
		readdirSync(dir).flatMap((name) => {
			const path = join(dir, name);
			return statSync(path).isDirectory() ? files(path) : /\.(ts|svelte)$/.test(name) ? [path] : [];
		});

	it('spells state words only in src/lib/status.ts', () => {
		const words = [
			...Object.values(LOT_STATUS),
			...Object.values(VERDICT),
			...Object.values(NOTICE_DELIVERY),
			...Object.values(MODEL_STATUS)
		]
			.map((look) => look.word)
			.filter((word) => word.includes(' ')) // single words (Accepted, Hold…) also occur in ordinary sentences
			.concat(['In inspection', 'In progress']); // wordings an earlier version used for the same states
		const offenders = files(root)
			.filter((path) => !path.endsWith(join('lib', 'status.ts')))
			.flatMap((path) => {
				const text = readFileSync(path, 'utf8');
				return words.filter((word) => new RegExp(`['"\`>]${word}['"\`<]`).test(text)).map((word) => `${relative(root, path)}: ${word}`);
			});
		expect(offenders).toEqual([]);
	});

	it('never turns a state code into words by replacing its underscores', () => {
		const offenders = files(root).filter((path) =>
			/(status|severity|disposition)\.replace(All)?\(\s*['"/]_/.test(readFileSync(path, 'utf8'))
		);
		expect(offenders.map((path) => relative(root, path))).toEqual([]);
	});
});
