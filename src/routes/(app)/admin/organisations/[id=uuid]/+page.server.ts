import { error, fail } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { getDb } from '$lib/server/db';
import { can } from '$lib/server/policy';
import { orErrorPage, refuseForm } from '$lib/server/action-errors';
import { getOrganisation, organisationHistory, updateOrganisation } from '$lib/server/services/organisations';
import { ContactNotFoundError, saveContact } from '$lib/server/services/suppliers';
import { organisationDetailsSchema } from '$lib/schemas/organisation';
import { contactSchema } from '$lib/schemas/supplier';
import { personLabel } from '$lib/people';
import type { Actions, PageServerLoad } from './$types';

const DETAILS_ID = 'organisation-details';
const CONTACT_ID = 'contact';

function admin(locals: App.Locals) {
	if (!locals.user || !can(locals.user, 'admin:orgs')) error(403, 'Only administrators manage organisations');
	return locals.user;
}

/** One organisation: its details (name, country, address), notice contacts and history. */
export const load: PageServerLoad = async ({ locals, params }) => {
	admin(locals);
	const db = getDb();
	const org = await orErrorPage(getOrganisation(db, params.id));
	const history = await organisationHistory(db, org.id);
	return {
		org,
		details: await superValidate(
			{ name: org.name, country: org.country ?? '', address: org.address ?? '' },
			zod4(organisationDetailsSchema),
			{
				id: DETAILS_ID,
				errors: false
			}
		),
		contactForm: await superValidate(zod4(contactSchema), { id: CONTACT_ID }),
		history: history.map((h) => ({
			id: h.id,
			at: h.at.toISOString(),
			action: h.action,
			by: h.actor ? personLabel(h.actor) : 'the system',
			details: h.details
		}))
	};
};

export const actions: Actions = {
	details: async (event) => {
		const actor = admin(event.locals);
		const form = await superValidate(event, zod4(organisationDetailsSchema), { id: DETAILS_ID });
		if (!form.valid) return fail(400, { form });
		try {
			const changes = await updateOrganisation(getDb(), actor, event.params.id, form.data);
			return message(form, changes.length ? `Saved: ${changes.map((c) => c.field).join(', ')} changed.` : 'Nothing changed.');
		} catch (e) {
			return fail(refuseForm(form, e), { form });
		}
	},
	contact: async (event) => {
		const actor = admin(event.locals);
		const form = await superValidate(event, zod4(contactSchema), { id: CONTACT_ID });
		if (!form.valid) return fail(400, { form });
		const org = await orErrorPage(getOrganisation(getDb(), event.params.id));
		if (org.kind !== 'supplier') return message(form, 'Notice contacts belong to suppliers', { status: 400 });
		try {
			const saved = await saveContact(getDb(), actor, org.id, form.data);
			return message(form, `Saved ${saved.name}.`);
		} catch (e) {
			if (e instanceof ContactNotFoundError) return message(form, e.message, { status: 404 });
			throw e;
		}
	}
};
