// The approve form action, shared by the model list and the model page.
import { error, fail, type RequestEvent } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { can } from '$lib/server/policy';
import { approveModel } from '$lib/server/services/models';
import { refuseForm } from '$lib/server/action-errors';
import { approveForm } from '$lib/schemas/electrochem';

export const APPROVE_FORM_ID = 'approve';

export const emptyApproveForm = () => superValidate(zod4(approveForm), { id: APPROVE_FORM_ID });

export async function approveAction(event: RequestEvent) {
	const user = event.locals.user;
	if (!user || !can(user, 'model:approve')) error(403, 'Only a quality manager may approve model versions');
	const form = await superValidate(event, zod4(approveForm));
	if (!form.valid) return fail(400, { form });
	let outcome;
	try {
		outcome = await approveModel(user, form.data.id, form.data, event.getClientAddress());
	} catch (e) {
		form.data.password = '';
		return fail(refuseForm(form, e), { form });
	}
	form.data.password = '';
	if (outcome === 'not_found') return setError(form, 'id', 'This model version no longer exists', { status: 404 });
	if (outcome === 'already_approved') return message(form, 'Already approved.');
	return message(form, 'Approved. Parts may now use this version.');
}
