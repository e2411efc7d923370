// What is wrong with the entry row, said about the value in a sentence. Computed from the text as it
// is typed, so a message changes with the value and is gone once the value is right. The limits are
// the reading schema's own (src/lib/schemas/readings.ts), which the server applies again.
import { MAX_AC_RESISTANCE_MOHM } from '$lib/schemas/readings';
import { numberFromField } from './entry-draft.svelte';

export interface EntryText {
	serial: string;
	ocv: string;
	temperature: string;
	resistance: string;
}

export type EntryField = keyof EntryText;

function serialProblem(text: string): string | null {
	const serial = text.trim();
	if (serial === '') return 'Serial is missing: scan or type the unit’s serial.';
	if (serial.length > 64) return `Serial is ${serial.length} characters long; at most 64 fit.`;
	return null;
}

export function ocvProblem(text: string): string | null {
	if (text.trim() === '') return 'OCV is missing: type the voltage the meter shows, in volts.';
	const v = numberFromField(text);
	if (!Number.isFinite(v)) return `OCV must be a number in volts, like 3.652; “${text.trim()}” is not.`;
	if (v < 0) return 'OCV is below 0 V: check the probe polarity and measure again.';
	if (v >= 1000) return 'OCV must be below 1000 V.';
	return null;
}

export function temperatureProblem(text: string): string | null {
	if (text.trim() === '') return 'Temperature is missing: type the cell or bench temperature in °C.';
	const t = numberFromField(text);
	if (!Number.isFinite(t)) return `Temperature must be a number in °C, like 23.5; “${text.trim()}” is not.`;
	if (t <= -60 || t >= 120) return 'Temperature must lie between −60 °C and 120 °C.';
	return null;
}

function resistanceProblem(text: string): string | null {
	if (text.trim() === '') return null; // optional: left empty when no AC resistance was measured
	const r = numberFromField(text);
	if (!Number.isFinite(r)) return `AC resistance must be a number in mΩ, or left empty; “${text.trim()}” is not.`;
	if (r <= 0) return 'AC resistance must be above 0 mΩ, or left empty.';
	if (r > MAX_AC_RESISTANCE_MOHM) return 'AC resistance must be at most 100,000 mΩ (100 Ω): check the unit.';
	return null;
}

/** Each field's problem as a sentence; a field that is fine has no entry. */
export function entryProblems(entry: EntryText): Partial<Record<EntryField, string>> {
	const found: Array<[EntryField, string | null]> = [
		['serial', serialProblem(entry.serial)],
		['ocv', ocvProblem(entry.ocv)],
		['temperature', temperatureProblem(entry.temperature)],
		['resistance', resistanceProblem(entry.resistance)]
	];
	return Object.fromEntries(found.filter((f): f is [EntryField, string] => f[1] !== null));
}

/** A correction's field: blank keeps the stored value; anything typed must be a value the entry row would take. */
export function correctionProblem(field: 'ocv_v' | 'temperature_c', text: string): string | null {
	if (text.trim() === '') return null;
	return field === 'ocv_v' ? ocvProblem(text) : temperatureProblem(text);
}

/** The correction form's refusals as sentences (the schema's codes stay for the API). */
export function correctionMessages(issues: Record<string, string>, form: { ocv_v: string; temperature_c: string }): Record<string, string> {
	const out: Record<string, string> = {};
	for (const [field, message] of Object.entries(issues)) {
		if (field === 'ocv_v' || field === 'temperature_c') out[field] = correctionProblem(field, form[field]) ?? message;
		else if (field === 'reason') out.reason = 'The reason is missing or too short: say why the value was wrong (at least 3 characters).';
		else if (field === 'form') out.form = 'Nothing changed: type the right OCV or temperature, or press Cancel.';
		else out[field] = message;
	}
	return out;
}
