import { error, fail, redirect } from '@sveltejs/kit';
import { superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { can } from '$lib/server/policy';
import { validateForm } from '$lib/server/forms';
import { getDb } from '$lib/server/db';
import { createPart } from '$lib/server/services/parts';
import { refuseForm } from '$lib/server/action-errors';
import { listSuppliers } from '$lib/server/services/suppliers';
import { partDescriptiveSchema, type PartDescriptive } from '$lib/schemas/part';
import type { Actions, PageServerLoad } from './$types';

const FORM_ID = 'new-part';

export const load: PageServerLoad = async ({ locals, url }) => {
	if (!can(locals.user, 'part:edit')) error(403, 'Only buyers add parts');
	const suppliers = await listSuppliers(getDb());
	const form = await superValidate(
		{ supplier_id: url.searchParams.get('supplier_id') ?? '', cells_in_series: 1, cells_in_parallel: 1, required_documents: ['coc'] },
		zod4(partDescriptiveSchema),
		{ id: FORM_ID, errors: false }
	);
	// The capacity starts empty, not at 0: the buyer types the datasheet's value, and an empty box is refused by name.
	form.data.nominal_capacity_ah = null as unknown as PartDescriptive['nominal_capacity_ah'];
	return { form, suppliers: suppliers.map((s) => ({ id: s.id, name: s.name })) };
};

export const actions: Actions = {
	default: async (event) => {
		if (!can(event.locals.user, 'part:edit')) error(403, 'Only buyers add parts');
		const form = await validateForm(event, zod4(partDescriptiveSchema), { id: FORM_ID });
		if (!form.valid) return fail(400, { form });
		let id: string;
		try {
			id = (await createPart(getDb(), event.locals.user!, form.data)).id;
		} catch (e) {
			return fail(refuseForm(form, e), { form });
		}
		redirect(303, `/parts/${id}`);
	}
};
