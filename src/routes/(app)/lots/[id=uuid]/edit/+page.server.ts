import { error, fail, redirect } from '@sveltejs/kit';
import { setMessage, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { can } from '$lib/server/policy';
import { validateForm } from '$lib/server/forms';
import { getDb } from '$lib/server/db';
import { refuseForm } from '$lib/server/action-errors';
import { BEFORE_INSPECTION, getLotForUser, LotConflictError, updateLot } from '$lib/server/services/lots';
import { lotFormSchema, lotInputFromForm, type LotForm, type Packing } from '$lib/schemas/lot';
import { lotStateInText } from '$lib/status';
import { formField, lotFormChoices } from '../../lot-form.server';
import type { Actions, PageServerLoad } from './$types';

const FORM_ID = 'edit-lot';

/** The lot, when this user may edit it now: buyers, before the lot reaches the bench. */
async function editableLot(user: App.Locals['user'], lotId: string) {
	if (!can(user, 'lot:edit')) error(403, 'Only buyers edit lots');
	const lot = await getLotForUser(getDb(), user!, lotId);
	if (!lot) error(404, 'No such lot');
	if (!BEFORE_INSPECTION.includes(lot.status))
		error(409, {
			message: `This lot is ${lotStateInText(lot.status)}: its purchase facts can no longer change.`,
			back: { href: `/lots/${lot.id}`, label: `Back to lot ${lot.lotCode}` }
		});
	return lot;
}

export const load: PageServerLoad = async ({ locals, params }) => {
	const lot = await editableLot(locals.user, params.id);
	const current: LotForm = {
		po_number: lot.poNumber,
		supplier_id: lot.supplierId,
		part_id: lot.partId,
		quantity: lot.quantity,
		declared_soc_pct: lot.declaredSoc === null ? null : Math.round(lot.declaredSoc * 1e6) / 1e4,
		transport: lot.transport,
		last_direction: lot.lastDirection,
		packing: lot.packing as Packing,
		un_number: lot.unNumber ?? '',
		expected_arrival: lot.expectedArrival ?? '',
		resubmitted: lot.resubmitted
	} as LotForm;
	return {
		lot: { id: lot.id, lotCode: lot.lotCode, status: lot.status },
		form: await superValidate(current, zod4(lotFormSchema), { id: FORM_ID }),
		...(await lotFormChoices(getDb()))
	};
};

export const actions: Actions = {
	default: async ({ locals, params, request }) => {
		const lot = await editableLot(locals.user, params.id);
		const form = await validateForm({ request }, zod4(lotFormSchema), { id: FORM_ID });
		if (!form.valid) return fail(400, { form });
		try {
			await updateLot(getDb(), locals.user!, lot.id, lotInputFromForm(form.data));
		} catch (e) {
			if (e instanceof LotConflictError)
				return setMessage(form, 'The lot reached the bench meanwhile; its purchase facts can no longer change.', { status: 409 });
			return fail(refuseForm(form, e, formField), { form });
		}
		redirect(303, `/lots/${lot.id}?edited=1`);
	}
};
