import { fail } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { clientAddress } from '$lib/server/auth';
import { linkRequestAllowed, requestPasswordReset, withAnswerFloor } from '$lib/server/services/sign-in';
import { THROTTLED_MESSAGE } from '$lib/server/services/throttle';
import { resetRequest } from '../schemas';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => ({
	form: await superValidate(zod4(resetRequest), { id: 'reset-request' })
});

export const actions: Actions = {
	default: async (event) => {
		const form = await superValidate(event, zod4(resetRequest), { id: 'reset-request' });
		if (!form.valid) return fail(400, { form });
		// The same answer, after the same time, whether or not the address has an account.
		return withAnswerFloor(async () => {
			if (!(await linkRequestAllowed(form.data.email, clientAddress(event)))) {
				return message(form, THROTTLED_MESSAGE, { status: 429 });
			}
			await requestPasswordReset(form.data.email, clientAddress(event));
			return message(form, 'If this address belongs to a staff account, a reset link is on its way. It works once, for 1 hour.');
		});
	}
};
