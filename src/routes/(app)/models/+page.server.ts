import { error } from '@sveltejs/kit';
import { listChemistries } from '$lib/electrochem';
import { can } from '$lib/server/policy';
import { listModelVersions } from '$lib/server/services/models';
import { approveAction, emptyApproveForm } from './approve-action';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	if (!can(locals.user, 'electrochem:use')) error(403, 'Your role may not open the OCV models');
	const canReadVersions = can(locals.user, 'model:read');
	return {
		chemistries: listChemistries(),
		versions: canReadVersions ? await listModelVersions() : null,
		canApprove: can(locals.user, 'model:approve'),
		approveForm: await emptyApproveForm()
	};
};

export const actions: Actions = { approve: approveAction };
