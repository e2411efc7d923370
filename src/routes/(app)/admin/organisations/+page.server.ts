import { error, fail } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { z } from 'zod';
import { text } from '$lib/schemas/fields';
import { can } from '$lib/server/policy';
import { createSupplierOrganisation, listOrganisations, type Actor } from '$lib/server/services/users';
import { refusalOf } from '$lib/server/action-errors';
import type { Actions, PageServerLoad } from './$types';

const newSupplier = z.object({
	name: text().trim().min(2, 'Enter the company name').max(160),
	country: text().trim().max(80).default('')
});

function admin(locals: App.Locals): Actor {
	if (!locals.user || !can(locals.user, 'admin:orgs')) error(403, 'Only administrators manage organisations');
	return locals.user;
}

export const load: PageServerLoad = async ({ locals }) => {
	admin(locals);
	return { organisations: await listOrganisations(), form: await superValidate(zod4(newSupplier), { id: 'new-supplier' }) };
};

export const actions: Actions = {
	default: async (event) => {
		const actor = admin(event.locals);
		const form = await superValidate(event, zod4(newSupplier), { id: 'new-supplier' });
		if (!form.valid) return fail(400, { form });
		try {
			const org = await createSupplierOrganisation(actor, form.data);
			return message(form, `Added ${org.name}. Invite its people on the People page.`);
		} catch (e) {
			const refusal = refusalOf(e);
			return message(form, refusal.message, { status: refusal.status as 400 });
		}
	}
};
