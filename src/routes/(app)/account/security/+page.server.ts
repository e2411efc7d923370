import { error, fail, redirect } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import QRCode from 'qrcode';
import { clientAddress } from '$lib/server/auth';
import { THROTTLED_MESSAGE } from '$lib/server/services/throttle';
import {
	beginEnrolment,
	confirmEnrolment,
	secondFactorState,
	siteRequiresSecondFactor,
	turnOffSecondFactor,
	type CodeOutcome
} from '$lib/server/services/second-factor';
import { passwordAndCode } from '$lib/schemas/second-factor';
import type { SessionUser } from '$lib/roles';
import type { Actions, PageServerLoad, RequestEvent } from './$types';

const HERE = '/account/security';

/** Any staff member may protect their own sign-in; suppliers sign in with e-mailed links instead. */
function staff(locals: App.Locals): SessionUser {
	if (!locals.user || locals.user.role === 'supplier' || locals.authMethod !== 'session') error(403, 'Staff only');
	return locals.user;
}

/** The QR code as an SVG data URL (the page's CSP allows data: images); rendered on the server. */
async function qrDataUrl(uri: string): Promise<string> {
	const svg = await QRCode.toString(uri, { type: 'svg', errorCorrectionLevel: 'M', margin: 4 });
	return `data:image/svg+xml;base64,${Buffer.from(svg).toString('base64')}`;
}

export const load: PageServerLoad = async ({ locals, url, setHeaders }) => {
	const user = staff(locals);
	// A pending secret is on this page: keep it out of every cache.
	setHeaders({ 'cache-control': 'no-store' });
	const state = await secondFactorState(user);
	return {
		factor: state.state === 'pending' ? { state: state.state, secretGrouped: state.secretGrouped, qr: await qrDataUrl(state.uri) } : state,
		required: siteRequiresSecondFactor(user.role),
		changed: url.searchParams.get('changed'),
		confirmForm: await superValidate(zod4(passwordAndCode), { id: 'confirm' }),
		turnOffForm: await superValidate(zod4(passwordAndCode), { id: 'turn-off' })
	};
};

const WRONG_CODE = 'That password and code do not match. Enter your password and the code your app shows now; it changes every 30 seconds.';

function refusal(outcome: Exclude<CodeOutcome, 'done'>, wrong: string) {
	return outcome === 'throttled' ? { text: THROTTLED_MESSAGE, status: 429 as const } : { text: wrong, status: 400 as const };
}

type PasswordAndCodeStep = typeof confirmEnrolment;

/** The two password-and-code forms: read the form, run the step, go back to the page or say why not. */
async function withPasswordAndCode(event: RequestEvent, id: string, step: PasswordAndCodeStep, changed: 'on' | 'off', wrong: string) {
	const user = staff(event.locals);
	const form = await superValidate(event, zod4(passwordAndCode), { id });
	const { password, code } = form.data;
	form.data.password = ''; // never echo a password back to the browser
	form.data.code = '';
	if (!form.valid) return fail(400, { form });
	const outcome = await step(user, { password, code }, event.locals.sessionId, clientAddress(event));
	if (outcome === 'done') redirect(303, `${HERE}?changed=${changed}`);
	const { text, status } = refusal(outcome, wrong);
	return message(form, text, { status });
}

export const actions: Actions = {
	/** A new secret to add to the app; the factor is not on until a code confirms it. */
	begin: async (event) => {
		const user = staff(event.locals);
		if (!(await beginEnrolment(user, clientAddress(event)))) {
			return fail(409, { beginError: 'Your second factor is already on. Turn it off first to move it to another app.' });
		}
		redirect(303, HERE);
	},

	confirm: (event) => withPasswordAndCode(event, 'confirm', confirmEnrolment, 'on', WRONG_CODE),
	turnOff: (event) =>
		withPasswordAndCode(
			event,
			'turn-off',
			turnOffSecondFactor,
			'off',
			'That password and code do not match. Both are needed to turn the second factor off.'
		)
};
