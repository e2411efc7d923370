/**
 * Restvolt's one vocabulary for the states people see: each code the API and the database keep
 * (lot states, the engine's verdicts, reason severities, inspection severity, notice delivery,
 * decision kinds, transport modes) maps to a word, a shape and a tone. Pages, the supplier portal,
 * PDFs, e-mails and XLSX exports all read their words here; the API keeps its codes.
 *
 * A state is never shown by colour alone: the word always travels with its shape, and the tone
 * only adds colour on top (web: text-status-<tone>; PDF: the palette's status colours).
 */
import type { LastDirection, LotStatus, TransportMode } from '$lib/schemas/lot';

/** Marks that tell states apart without colour; drawn by status-shape.svelte and reports/shapes.ts. */
export type Shape =
	| 'dashed' // an outlined circle with a dashed edge: not started
	| 'clock' // a circle with clock hands: waiting for something to happen
	| 'half' // a half-filled circle: under way
	| 'ring' // an empty circle: not enough to say yet
	| 'diamond' // an outlined diamond: waiting for a person
	| 'check' // a filled circle with a tick: good
	| 'alert' // a filled triangle with an exclamation mark: needs attention
	| 'cross' // a filled square with a cross: refused
	| 'slash' // a circle struck through: stopped or not applicable
	| 'info'; // a circle with an "i": for information

/** Colour families; the web maps them to the @theme colours --color-status-*, the PDF to its palette. */
export type Tone = 'accept' | 'hold' | 'reject' | 'pending' | 'info' | 'muted';

export interface Look {
	word: string;
	shape: Shape;
	tone: Tone;
}

/** Where a lot stands. "On the bench": measured at the receiving bench, the first reading records the arrival. */
export const LOT_STATUS: Record<LotStatus, Look> = {
	draft: { word: 'Draft', shape: 'dashed', tone: 'pending' },
	awaiting_arrival: { word: 'Awaiting arrival', shape: 'clock', tone: 'info' },
	in_inspection: { word: 'On the bench', shape: 'half', tone: 'info' },
	pending_decision: { word: 'Awaiting decision', shape: 'diamond', tone: 'pending' },
	accepted: { word: 'Accepted', shape: 'check', tone: 'accept' },
	on_hold: { word: 'On hold', shape: 'alert', tone: 'hold' },
	rejected: { word: 'Rejected', shape: 'cross', tone: 'reject' },
	cancelled: { word: 'Cancelled', shape: 'slash', tone: 'muted' }
};

export type Verdict = 'pending' | 'accept' | 'hold' | 'reject' | 'indeterminate';

/**
 * What the rules propose for a lot (the evaluation's disposition), and "indeterminate" for a reading
 * whose SOC the model cannot place: a calm, normal result, never an error colour.
 */
export const VERDICT: Record<Verdict, Look> = {
	pending: { word: 'Sample incomplete', shape: 'ring', tone: 'pending' },
	accept: { word: 'Accept', shape: 'check', tone: 'accept' },
	hold: { word: 'Hold', shape: 'alert', tone: 'hold' },
	reject: { word: 'Reject', shape: 'cross', tone: 'reject' },
	indeterminate: { word: 'Indeterminate', shape: 'info', tone: 'info' }
};

/** How much a finding weighs: the same words as the verdicts it leads to, and "Note" for information. */
export const REASON_SEVERITY: Record<'reject' | 'hold' | 'info', Look> = {
	reject: VERDICT.reject,
	hold: VERDICT.hold,
	info: { word: 'Note', shape: 'info', tone: 'info' }
};

/** The s-method variables check, which advises only. */
export const VARIABLES_RESULT: Record<'accept' | 'reject' | 'not_applicable', Look> = {
	accept: VERDICT.accept,
	reject: VERDICT.reject,
	not_applicable: { word: 'Not applicable', shape: 'slash', tone: 'muted' }
};

/** ISO 2859-1 inspection severity per supplier × part (switching rules, clause 9). */
export const INSPECTION_SEVERITY: Record<'normal' | 'tightened' | 'reduced' | 'discontinued', Look> = {
	normal: { word: 'Normal', shape: 'ring', tone: 'pending' },
	tightened: { word: 'Tightened', shape: 'alert', tone: 'hold' },
	reduced: { word: 'Reduced', shape: 'check', tone: 'accept' },
	discontinued: { word: 'Discontinued', shape: 'cross', tone: 'reject' }
};

/** A notice's delivery through the outbox. */
export const NOTICE_DELIVERY: Record<'pending' | 'sent' | 'failed', Look> = {
	pending: { word: 'Queued', shape: 'clock', tone: 'pending' },
	sent: { word: 'Sent', shape: 'check', tone: 'accept' },
	failed: { word: 'Delivery failed', shape: 'alert', tone: 'hold' }
};

/** An OCV model version: library and fitted versions are used only once a quality manager approves them. */
export const MODEL_STATUS: Record<'approved' | 'awaiting_approval', Look> = {
	approved: { word: 'Approved', shape: 'check', tone: 'accept' },
	awaiting_approval: { word: 'Awaiting approval', shape: 'dashed', tone: 'pending' }
};

/** Who decided: the rules, or a quality manager overriding them with an e-signature. */
export const DECISION_KIND: Record<'automatic' | 'override', string> = {
	automatic: 'By the rules',
	override: 'Quality decision'
};

export const TRANSPORT: Record<TransportMode, string> = { air: 'Air', sea: 'Sea', road: 'Road', rail: 'Rail' };

/** How the cells were last moved before shipping (the lot form and lot page). */
export const LAST_DIRECTION: Record<LastDirection, string> = {
	unknown: 'Not known',
	after_charge: 'Last charged',
	after_discharge: 'Last discharged'
};

/** A lot state's word inside a sentence: "The lot is on the bench". */
export const lotStateInText = (code: string) => wordOf(LOT_STATUS, code).toLowerCase();

/** A code's look, or a calm stand-in that still shows the code as words when the vocabulary lacks it. */
export function lookOf<K extends string>(vocabulary: Record<K, Look>, code: string): Look {
	const known = (vocabulary as Record<string, Look>)[code];
	return known ?? { word: wordsOf(code), shape: 'ring', tone: 'muted' };
}

/** A code's word, or the code written as words ("not_listed" → "Not listed") when the vocabulary lacks it. */
export function wordOf<K extends string>(vocabulary: Record<K, Look | string>, code: string): string {
	const known = (vocabulary as Record<string, Look | string>)[code];
	if (known === undefined) return wordsOf(code);
	return typeof known === 'string' ? known : known.word;
}

function wordsOf(code: string): string {
	const words = code.replace(/[_.]+/g, ' ').trim();
	return words.charAt(0).toUpperCase() + words.slice(1);
}
