import { fail, redirect } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { clientAddress } from '$lib/server/auth';
import { usePasswordLink, userForPasswordLink } from '$lib/server/services/sign-in';
import { newPassword } from '../../schemas';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const person = await userForPasswordLink(params.token);
	return {
		person: person ? { email: person.email, name: person.name } : null,
		form: await superValidate(zod4(newPassword), { id: 'new-password' })
	};
};

export const actions: Actions = {
	default: async (event) => {
		const form = await superValidate(event, zod4(newPassword), { id: 'new-password' });
		const password = form.data.password;
		form.data.password = '';
		form.data.confirm = '';
		if (!form.valid) return fail(400, { form });
		const done = await usePasswordLink(event.params.token, password, clientAddress(event));
		if (!done) return message(form, 'This link has expired or was already used. Ask for a new one.', { status: 410 });
		redirect(303, '/signin?password-set');
	}
};
