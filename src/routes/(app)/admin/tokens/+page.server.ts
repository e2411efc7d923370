import { error, fail } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { validateForm } from '$lib/server/forms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { z } from 'zod';
import { text } from '$lib/schemas/fields';
import { can } from '$lib/server/policy';
import { createToken, listTokens, revokeToken } from '$lib/server/services/tokens';
import { scopeFitsRole, TOKEN_SCOPE_LABEL, TOKEN_SCOPES } from '$lib/server/token-scopes';
import { getUser, listUsers, type Actor } from '$lib/server/services/users';
import type { Actions, PageServerLoad } from './$types';

const newToken = z.object({
	userId: text().min(1, 'Choose the person the token acts as'),
	label: text().trim().min(2, 'Say what the token is for (e.g. "bench meter bridge")').max(120),
	scope: z.enum(TOKEN_SCOPES, { error: 'Choose what the token may do' }).default('read'),
	// Days until the token stops working: a forgotten token should not work for ever.
	expiresInDays: z
		.number({ error: 'Enter the days until it expires' })
		.int('Whole days')
		.min(1, 'At least 1 day')
		.max(366, 'At most 366 days')
		.default(90)
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
		now: Date.now(),
		scopes: TOKEN_SCOPES.map((value) => ({ value, label: TOKEN_SCOPE_LABEL[value] })),
		people: people.filter((p) => p.active).map((p) => ({ id: p.id, email: p.email, role: p.role })),
		form: await superValidate(zod4(newToken), { id: 'new-token' })
	};
};

export const actions: Actions = {
	create: async (event) => {
		const actor = admin(event.locals);
		const form = await validateForm(event, zod4(newToken), { id: 'new-token' });
		if (!form.valid) return fail(400, { form });
		const person = await getUser(form.data.userId);
		if (!person || !person.active) return message(form, 'That person does not exist or is deactivated.', { status: 400 });
		// A token never has more rights than its person: a scope needs the role to have what it names.
		if (!scopeFitsRole(form.data.scope, person.role))
			return setError(form, 'scope', `A ${person.role} cannot hold a "${TOKEN_SCOPE_LABEL[form.data.scope]}" token.`);
		const expiresAt = new Date(Date.now() + form.data.expiresInDays * 24 * 60 * 60 * 1000);
		const created = await createToken({ userId: person.id, label: form.data.label, actor, scope: form.data.scope, expiresAt });
		// The plaintext leaves the server this once; only its hash is stored.
		return { form, created: { token: created.token, email: person.email, label: form.data.label, expiresAt: expiresAt.toISOString() } };
	},
	revoke: async (event) => {
		const actor = admin(event.locals);
		const id = String((await event.request.formData()).get('tokenId') ?? '');
		if (!z.uuid().safeParse(id).success) return fail(400, { revokeError: 'That token was not understood.' });
		const revoked = await revokeToken(actor, id);
		return revoked ? { revoked: true } : fail(404, { revokeError: 'That token does not exist or was already revoked.' });
	}
};
