import { error, fail, redirect } from '@sveltejs/kit';
import { superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { can } from '$lib/server/policy';
import { validateForm } from '$lib/server/forms';
import { getDb } from '$lib/server/db';
import { refuseForm } from '$lib/server/action-errors';
import { createLot } from '$lib/server/services/lots';
import { lotFormSchema, lotInputFromForm, type LotForm } from '$lib/schemas/lot';
import { clientAddress } from '$lib/server/auth';
import { formField, lotFormChoices } from '../lot-form.server';
import type { Actions, PageServerLoad } from './$types';

const FORM_ID = 'register-lot';

export const load: PageServerLoad = async ({ locals, url }) => {
	if (!can(locals.user, 'lot:create')) error(403, 'Only buyers register lots');
	const db = getDb();
	const choices = await lotFormChoices(db);
	const form = await superValidate(zod4(lotFormSchema), { id: FORM_ID });
	// No transport preselected: the buyer states it (the schema's first enum value would otherwise be the default).
	form.data.transport = '' as LotForm['transport'];
	// The quantity starts empty, not at 0: the buyer types the real count, and an empty box is refused by name.
	form.data.quantity = null as unknown as LotForm['quantity'];
	const supplier = url.searchParams.get('supplier_id');
	if (supplier && choices.suppliers.some((s) => s.id === supplier)) form.data.supplier_id = supplier;
	return { form, ...choices };
};

export const actions: Actions = {
	default: async (event) => {
		const user = event.locals.user;
		if (!can(user, 'lot:create')) error(403, 'Only buyers register lots');
		const form = await validateForm(event, zod4(lotFormSchema), { id: FORM_ID });
		if (!form.valid) return fail(400, { form });
		let lotId: string;
		try {
			const lot = await createLot(getDb(), user!, lotInputFromForm(form.data), { status: 'draft', ip: clientAddress(event) });
			lotId = lot.id;
		} catch (e) {
			return fail(refuseForm(form, e, formField), { form });
		}
		redirect(303, `/lots/${lotId}?registered=1`);
	}
};
