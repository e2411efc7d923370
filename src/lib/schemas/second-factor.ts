/** Fields of the second-factor forms: the sign-in code step and the security page. */
import { z } from 'zod';

/** Six digits as an authenticator app shows them; spaces typed between the groups are dropped. */
export const totpCode = z
	.string()
	.max(32, 'Enter the 6 digits your authenticator app shows')
	.transform((v) => v.replace(/\s+/g, ''))
	.pipe(z.string().regex(/^\d{6}$/, 'Enter the 6 digits your authenticator app shows'));

/**
 * Confirming enrolment and turning the factor off both take the password and a current code. At
 * enrolment the password keeps someone holding a stolen session cookie from putting the account on
 * their own phone.
 */
export const passwordAndCode = z.object({
	password: z.string().min(1, 'Enter your password').max(1024),
	code: totpCode
});
