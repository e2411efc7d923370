import { error, fail } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { z } from 'zod';
import { text } from '$lib/schemas/fields';
import { can } from '$lib/server/policy';
import { createToken, listTokens, revokeToken } from '$lib/server/services/tokens';
import { getUser, listUsers, type Actor } from '$lib/server/services/users';
import type { Actions, PageServerLoad } from './$types';

const newToken = z.object({
	userId: text().min(1, 'Choose the person the token acts as'),
	label: text().trim().min(2, 'Say what the token is for (e.g. "bench meter bridge")').max(120)
});

function admin(locals: App.Locals): Actor {
	if (!locals.user || !can(locals.user, 'admin:tokens')) error(403, 'Only administrators manage API tokens');
	return locals.user;
}

export const load: PageServerLoad = async ({ locals }) => {
	admin(locals);
	const [tokens, people] = await Promise.all([listTokens(), listUsers()]);
	return {
		tokens,
		people: people.filter((p) => p.active).map((p) => ({ id: p.id, email: p.email, role: p.role })),
		form: await superValidate(zod4(newToken), { id: 'new-token' })
	};
};

export const actions: Actions = {
	create: async (event) => {
		const actor = admin(event.locals);
		const form = await superValidate(event, zod4(newToken), { id: 'new-token' });
		if (!form.valid) return fail(400, { form });
		const person = await getUser(form.data.userId);
		if (!person || !person.active) return message(form, 'That person does not exist or is deactivated.', { status: 400 });
		const created = await createToken({ userId: person.id, label: form.data.label, actor });
		// The plaintext leaves the server this once; only its hash is stored.
		return { form, created: { token: created.token, email: person.email, label: form.data.label } };
	},
	revoke: async (event) => {
		const actor = admin(event.locals);
		const id = String((await event.request.formData()).get('tokenId') ?? '');
		if (!z.uuid().safeParse(id).success) return fail(400, { revokeError: 'That token was not understood.' });
		const revoked = await revokeToken(actor, id);
		return revoked ? { revoked: true } : fail(404, { revokeError: 'That token does not exist or was already revoked.' });
	}
};
