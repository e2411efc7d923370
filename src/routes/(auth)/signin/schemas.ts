import { z } from 'zod';
import { hasControlCharacters } from '$lib/schemas/fields';
import { totpCode } from '$lib/schemas/second-factor';

/** Only same-site paths, so a crafted link cannot send people elsewhere after signing in (no control characters: a Location header refuses them). */
export const redirectTo = z
	.string()
	.default('')
	.transform((v) => (v.startsWith('/') && !v.startsWith('//') && !v.startsWith('/\\') && !hasControlCharacters(v) ? v : ''));

export const passwordSignIn = z.object({
	email: z.email('Enter your work e-mail address').max(320),
	password: z.string().min(1, 'Enter your password').max(1024),
	redirectTo
});

export const linkSignIn = z.object({
	email: z.email('Enter the e-mail address your account uses').max(320),
	redirectTo
});

export const resetRequest = z.object({
	email: z.email('Enter your work e-mail address').max(320)
});

export const MIN_PASSWORD = 12;

export const newPassword = z
	.object({
		password: z.string().min(MIN_PASSWORD, `Use at least ${MIN_PASSWORD} characters`).max(256),
		confirm: z.string()
	})
	.refine((v) => v.password === v.confirm, { message: 'The two passwords differ', path: ['confirm'] });

/** The code step of a sign-in with a second factor (the password was checked in the step before). */
export const codeSignIn = z.object({ code: totpCode, redirectTo });
