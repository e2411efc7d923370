import { describe, expect, it } from 'vitest';
import { lengthNote, tooLongMessage } from '$lib/text/length-limit';
import { overrideSchema, OVERRIDE_REASON_MAX } from '$lib/schemas/decision';

describe('length limits of free text', () => {
	it('shows no count far below the limit, a count near it, and says how much to cut above it', () => {
		expect(lengthNote(100, 500).show).toBe(false);
		expect(lengthNote(400, 500)).toEqual({ show: true, over: false, text: '400 of at most 500 characters.' });
		expect(lengthNote(2345, 2000)).toEqual({
			show: true,
			over: true,
			text: '2,345 of at most 2,000 characters: shorten it by 345 to save.'
		});
	});

	it('refuses in a sentence that names the field and promises nothing was cut', () => {
		expect(tooLongMessage('The reason', 612, 500)).toBe(
			'The reason is limited to 500 characters and this one has 612; shorten it. Nothing was saved or cut.'
		);
	});

	it('an override reason over 2,000 characters gets a sentence, not the validator’s raw text', () => {
		const parsed = overrideSchema.safeParse({ disposition: 'scrap', reason: 'x'.repeat(OVERRIDE_REASON_MAX + 1), password: 'p' });
		expect(parsed.success).toBe(false);
		const message = parsed.error?.issues.find((i) => i.path[0] === 'reason')?.message ?? '';
		expect(message).toMatch(/limited to 2,000 characters/);
		expect(message).not.toMatch(/Too big|expected string/);
		expect(overrideSchema.safeParse({ disposition: 'scrap', reason: 'x'.repeat(OVERRIDE_REASON_MAX), password: 'p' }).success).toBe(true);
	});
});
