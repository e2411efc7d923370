import { error, fail } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { can } from '$lib/server/policy';
import { refusalOf } from '$lib/server/action-errors';
import { sendInvitation } from '$lib/server/services/sign-in';
import { peopleWithSecondFactor, removeSecondFactor } from '$lib/server/services/second-factor';
import { clientAddress } from '$lib/server/auth';
import { changeRole, inviteUser, listUsers, organisationChoices, setActive, UserRuleError, type Actor } from '$lib/server/services/users';
import {
	changeRole as changeRoleSchema,
	invite,
	removeSecondFactor as removeSecondFactorSchema,
	setActive as setActiveSchema
} from './schemas';
import type { Actions, PageServerLoad, RequestEvent } from './$types';

function admin(locals: App.Locals): Actor {
	if (!locals.user || !can(locals.user, 'admin:users')) error(403, 'Only administrators manage people');
	return locals.user;
}

export const load: PageServerLoad = async ({ locals }) => {
	const me = admin(locals);
	const [people, organisations, withCode] = await Promise.all([listUsers(), organisationChoices(), peopleWithSecondFactor()]);
	return {
		me: me.id,
		people: people.map((p) => ({ ...p, hasSecondFactor: withCode.has(p.id) })),
		organisations,
		inviteForm: await superValidate(zod4(invite), { id: 'invite' })
	};
};

/** Row actions (role, active, second factor) post plain forms; rule breaks come back as a message. */
async function rowAction<T>(event: RequestEvent, parse: (fd: FormData) => T, run: (actor: Actor, input: T) => Promise<void>) {
	const actor = admin(event.locals);
	let input: T;
	try {
		input = parse(await event.request.formData());
	} catch {
		return fail(400, { rowError: 'That change was not understood.' });
	}
	try {
		await run(actor, input);
	} catch (e) {
		const refusal = refusalOf(e);
		return fail(refusal.status, { rowError: refusal.message });
	}
	return { rowDone: true };
}

export const actions: Actions = {
	invite: async (event) => {
		const actor = admin(event.locals);
		const form = await superValidate(event, zod4(invite), { id: 'invite' });
		if (!form.valid) return fail(400, { form });
		try {
			const person = await inviteUser(actor, form.data);
			try {
				await sendInvitation(person);
			} catch (e) {
				console.error('[admin] invitation mail failed', e);
				return message(form, `Created ${person.email}, but the invitation e-mail could not be sent. Try a password reset later.`, {
					status: 502
				});
			}
			return message(
				form,
				`Invited ${person.email}. ${person.role === 'supplier' ? 'They sign in with an e-mailed link.' : 'They received a link to choose a password.'}`
			);
		} catch (e) {
			const refusal = refusalOf(e);
			return message(form, refusal.message, { status: refusal.status as 400 });
		}
	},
	role: (event) =>
		rowAction(
			event,
			(fd) => changeRoleSchema.parse(Object.fromEntries(fd)),
			(actor, input) => changeRole(actor, input.userId, input.role)
		),
	active: (event) =>
		rowAction(
			event,
			(fd) => setActiveSchema.parse(Object.fromEntries(fd)),
			(actor, input) => setActive(actor, input.userId, input.active === 'true')
		),
	/** A lost phone: the person signs in with the password again and sets up a new second factor. */
	removeSecondFactor: (event) =>
		rowAction(
			event,
			(fd) => removeSecondFactorSchema.parse(Object.fromEntries(fd)),
			async (actor, input) => {
				if (input.userId === actor.id) throw new UserRuleError('Turn your own second factor off on the Sign-in security page.');
				if (!(await removeSecondFactor(actor, input.userId, clientAddress(event)))) {
					throw new UserRuleError('That person has no second factor.');
				}
			}
		)
};
