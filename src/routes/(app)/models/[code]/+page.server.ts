import { error, fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { getLibraryModel, isChemistryCode, type ChemistryCode } from '$lib/electrochem';
import { can } from '$lib/server/policy';
import { validateForm } from '$lib/server/forms';
import { strictNumberFromText } from '$lib/schemas/fields';
import { getModelVersion, listModelVersions, modelHistory, saveFittedModel } from '$lib/server/services/models';
import { saveFitForm } from '$lib/schemas/electrochem';
import { approveAction, emptyApproveForm } from '../approve-action';
import { parseReferenceCsv } from './reference-csv';
import type { Actions, PageServerLoad } from './$types';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

function chemistryOf(param: string): ChemistryCode {
	const code = param.toUpperCase();
	if (!isChemistryCode(code)) error(404, 'No such chemistry');
	return code;
}

async function storedVersion(id: string | null, code: ChemistryCode) {
	if (!id) return null;
	const found = UUID.test(id) ? await getModelVersion(id) : null;
	if (!found) error(404, 'No such model version');
	if (found.version.chemistry !== code) redirect(307, `/models/${found.version.chemistry}?model=${found.version.id}`);
	return found;
}

function initialTemperature(url: URL): number {
	const t = strictNumberFromText(url.searchParams.get('t') ?? '25') ?? 25;
	return t > -60 && t < 100 ? t : 25;
}

export const load: PageServerLoad = async ({ params, url, locals }) => {
	if (!can(locals.user, 'electrochem:use')) error(403, 'Your role may not open the OCV models');
	const code = chemistryOf(params.code);
	if (code !== params.code) redirect(307, `/models/${code}${url.search}`);
	const canRead = can(locals.user, 'model:read');
	const stored = canRead ? await storedVersion(url.searchParams.get('model'), code) : null;
	const storedModel = stored?.model ?? null;
	const temperature = initialTemperature(url);
	return {
		code,
		model: storedModel ?? getLibraryModel(code),
		version: stored?.version ?? null,
		history: stored ? await modelHistory(stored.version.id) : [],
		storedModelInvalid: !!stored && !storedModel,
		versions: canRead ? await listModelVersions({ chemistry: code }) : [],
		temperature,
		canFit: can(locals.user, 'model:fit'),
		canApprove: can(locals.user, 'model:approve'),
		saveForm: await superValidate({ chemistry: code, temperature_c: temperature }, zod4(saveFitForm), { id: 'save-fit', errors: false }),
		approveForm: await emptyApproveForm()
	};
};

export const actions: Actions = {
	save: async (event) => {
		const user = event.locals.user;
		if (!user || !can(user, 'model:fit')) error(403, 'Only a quality manager may save model versions');
		const form = await validateForm(event, zod4(saveFitForm), { id: 'save-fit' });
		if (!form.valid) return fail(400, { form });
		const parsed = parseReferenceCsv(form.data.csv);
		if (parsed.errors.length > 0) return setError(form, 'csv', parsed.errors);
		const chemistry = chemistryOf(event.params.code); // the page's chemistry, not a field one could edit
		const saved = await saveFittedModel(user, { ...form.data, chemistry, points: parsed.points });
		if (!saved.ok) return setError(form, 'csv', `The fit was rejected: ${saved.reason}`, { status: 422 });
		redirect(303, `/models/${saved.version.chemistry}?model=${saved.version.id}&saved=1`);
	},
	approve: approveAction
};
