import { error, fail } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { can } from '$lib/server/policy';
import { validateForm } from '$lib/server/forms';
import { getDb } from '$lib/server/db';
import {
	approvedModels,
	descriptiveFormValues,
	getPart,
	limitsFormValues,
	updatePartDescriptive,
	updatePartLimits
} from '$lib/server/services/parts';
import { listSuppliers } from '$lib/server/services/suppliers';
import { currentSeverity } from '$lib/server/services/switching';
import { resumeInspection } from '$lib/server/services/sampling-state';
import { refuseForm } from '$lib/server/action-errors';
import { resumeSchema } from '$lib/schemas/resume';
import { partDescriptiveSchema, partLimitsSchema } from '$lib/schemas/part';
import type { Actions, PageServerLoad } from './$types';

const DESCRIPTIVE = 'part-descriptive';
const LIMITS = 'part-limits';
const RESUME = 'part-resume';

export const load: PageServerLoad = async ({ locals, params }) => {
	if (!can(locals.user, 'part:read')) error(403, 'Your role may not read parts');
	const db = getDb();
	const part = await getPart(db, params.id);
	if (!part) error(404, 'No such part');
	const [suppliers, models] = await Promise.all([listSuppliers(db), approvedModels(db, part.chemistry)]);
	// The ISO 2859-1 severity now, with the switches and lots that led to it.
	const severity = await currentSeverity(db, part.supplierId, part.id);
	return {
		severity,
		part: { ...part, createdAt: part.createdAt.toISOString(), updatedAt: part.updatedAt.toISOString() },
		descriptiveForm: await superValidate(descriptiveFormValues(part), zod4(partDescriptiveSchema), { id: DESCRIPTIVE, errors: false }),
		limitsForm: await superValidate(limitsFormValues(part), zod4(partLimitsSchema), { id: LIMITS, errors: false }),
		suppliers: suppliers.map((s) => ({ id: s.id, name: s.name })),
		models: models.map((m) => ({ id: m.id, label: `${m.version} — ${m.name}${m.origin === 'fitted' ? ' (fitted)' : ''}` })),
		resumeForm: await superValidate(zod4(resumeSchema), { id: RESUME }),
		may: { edit: can(locals.user, 'part:edit'), limits: can(locals.user, 'part:limits'), resume: can(locals.user, 'sampling:resume') }
	};
};

export const actions: Actions = {
	descriptive: async (event) => {
		if (!can(event.locals.user, 'part:edit')) error(403, 'Only buyers edit part details');
		const form = await validateForm(event, zod4(partDescriptiveSchema), { id: DESCRIPTIVE });
		if (!form.valid) return fail(400, { descriptiveForm: form });
		try {
			const saved = await updatePartDescriptive(getDb(), event.locals.user!, event.params.id, form.data);
			if (!saved) error(404, 'No such part');
		} catch (e) {
			return fail(refuseForm(form, e), { descriptiveForm: form });
		}
		message(form, 'Part details saved.');
		return { descriptiveForm: form };
	},
	limits: async (event) => {
		if (!can(event.locals.user, 'part:limits')) error(403, 'Only quality edits limits and sampling');
		const form = await validateForm(event, zod4(partLimitsSchema), { id: LIMITS });
		if (!form.valid) return fail(400, { limitsForm: form });
		try {
			const saved = await updatePartLimits(getDb(), event.locals.user!, event.params.id, form.data);
			if (!saved) error(404, 'No such part');
		} catch (e) {
			return fail(refuseForm(form, e), { limitsForm: form });
		}
		message(form, 'Limits and sampling saved.');
		return { limitsForm: form };
	},
	resume: async (event) => {
		if (!can(event.locals.user, 'sampling:resume')) error(403, 'Only quality managers resume inspection');
		const form = await superValidate(event, zod4(resumeSchema), { id: RESUME });
		if (!form.valid) return fail(400, { resumeForm: form });
		try {
			await resumeInspection(getDb(), event.locals.user!, event.params.id, form.data.reason);
		} catch (e) {
			return fail(refuseForm(form, e), { resumeForm: form });
		}
		message(form, 'Inspection resumed on tightened inspection.');
		return { resumeForm: form };
	}
};
