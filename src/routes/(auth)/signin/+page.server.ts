import { fail, redirect } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { clientAddress, signInWith } from '$lib/server/auth';
import { THROTTLED_MESSAGE } from '$lib/server/services/throttle';
import { linkRequestAllowed, withAnswerFloor } from '$lib/server/services/sign-in';
import { codeStepPerson, endCodeStep } from '$lib/server/services/second-factor';
import { codeSignIn, linkSignIn, passwordSignIn } from './schemas';
import { codeStepToken, dropCodeStep, keepCodeStep } from './code-step';
import type { Actions, PageServerLoad } from './$types';

/** Why Auth.js sent someone back here (`?error=`), in our words. */
const ERRORS: Record<string, string> = {
	Verification: 'That sign-in link has expired or was already used. Ask for a new one below.',
	AccessDenied: 'That sign-in link cannot be used. Ask for a new one below.',
	CredentialsSignin: 'That e-mail address and password do not match.'
};

const CODE_STEP_ENDED = 'That sign-in step has ended (it lasts a few minutes). Enter your password again.';
const WRONG_CODE = 'That code does not match. Enter the code your app shows now; it changes every 30 seconds.';

export const load: PageServerLoad = async ({ locals, url, cookies }) => {
	if (locals.user) redirect(303, '/');
	const redirectTo = url.searchParams.get('redirectTo') ?? '';
	const error = url.searchParams.get('error');
	// After a right password for an account with a second factor, the page asks for the code.
	const step = codeStepToken(cookies);
	const codeFor = step ? await codeStepPerson(step) : null;
	if (step && !codeFor) dropCodeStep(cookies, url);
	return {
		codeFor: codeFor ? { email: codeFor.email } : null,
		codeForm: await superValidate({ redirectTo }, zod4(codeSignIn), { id: 'code', errors: false }),
		passwordForm: await superValidate({ redirectTo }, zod4(passwordSignIn), { id: 'password', errors: false }),
		linkForm: await superValidate({ redirectTo }, zod4(linkSignIn), { id: 'link', errors: false }),
		notice: error ? (ERRORS[error] ?? 'Signing in did not work. Please try again.') : null,
		passwordSet: url.searchParams.has('password-set'),
		signedOut: url.searchParams.has('signed-out')
	};
};

export const actions: Actions = {
	password: async (event) => {
		const form = await superValidate(event, zod4(passwordSignIn), { id: 'password' });
		const password = form.data.password;
		form.data.password = ''; // never echo a password back to the browser
		if (!form.valid) return fail(400, { form });
		// Known or unknown account, right or wrong password: the answer comes after the same time.
		const outcome = await withAnswerFloor(() =>
			signInWith(event, 'credentials', {
				email: form.data.email,
				password,
				redirectTo: form.data.redirectTo || '/'
			})
		);
		if (outcome.ok) redirect(303, outcome.location);
		if (outcome.reason === 'code_needed') {
			keepCodeStep(event.cookies, event.url, outcome.stepToken);
			redirect(303, withRedirectTo('/signin', form.data.redirectTo));
		}
		const throttled = outcome.reason === 'throttled';
		const text = throttled ? THROTTLED_MESSAGE : 'That e-mail address and password do not match.';
		return message(form, text, { status: throttled ? 429 : 400 });
	},

	/** Second step for accounts with a second factor: the code, with the step token from the cookie. */
	code: async (event) => {
		const form = await superValidate(event, zod4(codeSignIn), { id: 'code' });
		const code = form.data.code;
		form.data.code = '';
		if (!form.valid) return fail(400, { form });
		const step = codeStepToken(event.cookies);
		if (!step) return message(form, CODE_STEP_ENDED, { status: 400 });
		const outcome = await signInWith(event, 'credentials', { step, code, redirectTo: form.data.redirectTo || '/' });
		if (outcome.ok) {
			dropCodeStep(event.cookies, event.url);
			redirect(303, outcome.location);
		}
		if (outcome.reason === 'code_step_expired') {
			dropCodeStep(event.cookies, event.url);
			return message(form, CODE_STEP_ENDED, { status: 400 });
		}
		const throttled = outcome.reason === 'throttled';
		return message(form, throttled ? THROTTLED_MESSAGE : WRONG_CODE, { status: throttled ? 429 : 400 });
	},

	/** "Start again": the code step ends, the password form comes back. */
	restart: async ({ cookies, url }) => {
		const step = codeStepToken(cookies);
		if (step) await endCodeStep(step);
		dropCodeStep(cookies, url);
		redirect(303, '/signin');
	},

	link: async (event) => {
		const form = await superValidate(event, zod4(linkSignIn), { id: 'link' });
		if (!form.valid) return fail(400, { form });
		const allowed = await withAnswerFloor(async () => {
			if (!(await linkRequestAllowed(form.data.email, clientAddress(event)))) return false;
			await signInWith(event, 'nodemailer', { email: form.data.email, redirectTo: form.data.redirectTo || '/portal' });
			return true;
		});
		if (!allowed) return message(form, THROTTLED_MESSAGE, { status: 429 });
		// Sent or not (not a supplier account, or inactive): the same page, after the same time.
		redirect(303, '/signin/link-sent');
	}
};

function withRedirectTo(path: string, redirectTo: string): string {
	return redirectTo ? `${path}?redirectTo=${encodeURIComponent(redirectTo)}` : path;
}
