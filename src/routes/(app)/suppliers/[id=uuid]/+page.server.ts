import { error, fail } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { can } from '$lib/server/policy';
import { getDb } from '$lib/server/db';
import { ContactNotFoundError, getSupplier, saveContact } from '$lib/server/services/suppliers';
import { listParts } from '$lib/server/services/parts';
import { currentSeverity } from '$lib/server/services/switching';
import { contactSchema } from '$lib/schemas/supplier';
import type { Actions, PageServerLoad } from './$types';

const FORM_ID = 'contact';

export const load: PageServerLoad = async ({ locals, params }) => {
	if (!can(locals.user, 'supplier:read')) error(403, 'Your role may not read suppliers');
	const db = getDb();
	const supplier = await getSupplier(db, params.id);
	if (!supplier) error(404, 'No such supplier');
	const parts = await listParts(db, { supplier_id: supplier.id });
	const severities = await Promise.all(parts.map((p) => currentSeverity(db, supplier.id, p.id)));
	return {
		supplier: { id: supplier.id, name: supplier.name, country: supplier.country, address: supplier.address, contacts: supplier.contacts },
		parts: parts.map((p, i) => ({
			id: p.id,
			partNumber: p.partNumber,
			description: p.description,
			chemistry: p.chemistry,
			aql: p.aql,
			level: p.inspectionLevel,
			severity: severities[i].severity,
			decidedLots: severities[i].lots.length,
			severityView: severities[i]
		})),
		form: await superValidate(zod4(contactSchema), { id: FORM_ID }),
		may: { edit: can(locals.user, 'supplier:edit'), registerLot: can(locals.user, 'lot:create'), addPart: can(locals.user, 'part:edit') }
	};
};

export const actions: Actions = {
	contact: async (event) => {
		if (!can(event.locals.user, 'supplier:edit')) error(403, 'Only buyers edit supplier contacts');
		const form = await superValidate(event, zod4(contactSchema), { id: FORM_ID });
		if (!form.valid) return fail(400, { form });
		const supplier = await getSupplier(getDb(), event.params.id);
		if (!supplier) error(404, 'No such supplier');
		try {
			const saved = await saveContact(getDb(), event.locals.user!, supplier.id, form.data);
			return message(form, `Saved ${saved.name}.`);
		} catch (e) {
			if (e instanceof ContactNotFoundError) return message(form, e.message, { status: 404 });
			throw e;
		}
	}
};
