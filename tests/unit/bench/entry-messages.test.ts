/** The bench's entry messages (inspect/entry-messages.ts): sentences about the value that follow the text. */
import { describe, expect, it } from 'vitest';
import { correctionMessages, correctionProblem, entryProblems } from '../../../src/routes/(app)/lots/[id=uuid]/inspect/entry-messages';

const fine = { serial: 'DEMO-001', ocv: '3,652', temperature: '23.5', resistance: '' };

describe('entry messages', () => {
	it('has nothing to say about a complete row (decimal comma accepted, resistance optional)', () => {
		expect(entryProblems(fine)).toEqual({});
	});

	it('names the value in a sentence, not the field name', () => {
		const p = entryProblems({ serial: ' ', ocv: '3.6V', temperature: 'warm', resistance: '-2' });
		expect(p.serial).toBe('Serial is missing: scan or type the unit’s serial.');
		expect(p.ocv).toBe('OCV must be a number in volts, like 3.652; “3.6V” is not.');
		expect(p.temperature).toBe('Temperature must be a number in °C, like 23.5; “warm” is not.');
		expect(p.resistance).toBe('AC resistance must be above 0 mΩ, or left empty.');
		for (const text of Object.values(p)) expect(text).not.toMatch(/ocv_v|temperature_c|ac_resistance_mohm|is required/);
	});

	it('changes with the value and is gone once it is right', () => {
		expect(entryProblems({ ...fine, temperature: '' }).temperature).toMatch(/^Temperature is missing/);
		expect(entryProblems({ ...fine, temperature: '130' }).temperature).toBe('Temperature must lie between −60 °C and 120 °C.');
		expect(entryProblems({ ...fine, temperature: '30' }).temperature).toBeUndefined();
		expect(entryProblems({ ...fine, ocv: '-0.2' }).ocv).toMatch(/probe polarity/);
		expect(entryProblems({ ...fine, resistance: '200000' }).resistance).toMatch(/100,000 mΩ \(100 Ω\)/);
	});
});

describe('correction messages', () => {
	it('say what is wrong with the typed value; a blank field keeps the stored one', () => {
		const issues = {
			ocv_v: 'ocv_v must be a number',
			temperature_c: 'temperature_c must be below 120 °C',
			reason: 'say why the value was wrong'
		};
		const m = correctionMessages(issues, { ocv_v: 'three', temperature_c: '130' });
		expect(m.ocv_v).toBe('OCV must be a number in volts, like 3.652; “three” is not.');
		expect(m.temperature_c).toBe('Temperature must lie between −60 °C and 120 °C.');
		expect(m.reason).toMatch(/^The reason is missing or too short: say why the value was wrong/);
		expect(correctionProblem('ocv_v', '  ')).toBeNull();
		expect(correctionProblem('temperature_c', '22,5')).toBeNull();
		expect(correctionMessages({ form: 'change at least one value' }, { ocv_v: '', temperature_c: '' }).form).toBe(
			'Nothing changed: type the right OCV or temperature, or press Cancel.'
		);
	});
});
