import { error, fail } from '@sveltejs/kit';
import { superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { z } from 'zod';
import { WEBHOOK_EVENTS, webhookFormSchema } from '$lib/schemas/webhook';
import { refuseForm, refusalOf } from '$lib/server/action-errors';
import { getDb } from '$lib/server/db';
import { can } from '$lib/server/policy';
import {
	createEndpoint,
	deleteEndpoint,
	listDeliveries,
	listEndpoints,
	resendDelivery,
	rotateSecret,
	setPaused
} from '$lib/server/services/webhooks';
import type { Actor } from '$lib/server/services/users';
import type { Actions, PageServerLoad } from './$types';

const FORM_ID = 'new-webhook';

function admin(locals: App.Locals): Actor {
	if (!locals.user || !can(locals.user, 'admin:webhooks')) error(403, 'Only administrators manage webhooks');
	return locals.user;
}

const idOf = (form: FormData, name: string) => {
	const parsed = z.uuid().safeParse(form.get(name));
	return parsed.success ? parsed.data : null;
};

export const load: PageServerLoad = async ({ locals }) => {
	admin(locals);
	const db = getDb();
	const endpoints = await listEndpoints(db);
	const withLog = await Promise.all(endpoints.map(async (e) => ({ ...e, deliveries: await listDeliveries(db, e.id, 20) })));
	return { endpoints: withLog, events: WEBHOOK_EVENTS, form: await superValidate(zod4(webhookFormSchema), { id: FORM_ID }) };
};

/** One button's action on an endpoint (or one of its deliveries); a refusal comes back as `actionError`. */
type ButtonAnswer = { newSecret?: string; actionError?: string };

async function onEndpoint(request: Request, run: (form: FormData, id: string) => Promise<ButtonAnswer | void>) {
	const form = await request.formData();
	const id = idOf(form, 'endpointId');
	if (!id) return fail(400, { actionError: 'That webhook was not understood.' });
	try {
		return (await run(form, id)) ?? {};
	} catch (e) {
		const refusal = refusalOf(e);
		return fail(refusal.status, { actionError: refusal.message });
	}
}

export const actions: Actions = {
	create: async (event) => {
		const actor = admin(event.locals);
		const form = await superValidate(event, zod4(webhookFormSchema), { id: FORM_ID });
		if (!form.valid) return fail(400, { form });
		try {
			const created = await createEndpoint(getDb(), actor, form.data);
			// The secret leaves the server this once; it is stored sealed.
			return { form, newSecret: created.secret };
		} catch (e) {
			return fail(refuseForm(form, e), { form });
		}
	},
	pause: async ({ locals, request }) => onEndpoint(request, async (_f, id) => void (await setPaused(getDb(), admin(locals), id, true))),
	resume: async ({ locals, request }) => onEndpoint(request, async (_f, id) => void (await setPaused(getDb(), admin(locals), id, false))),
	rotate: async ({ locals, request }) =>
		onEndpoint(request, async (_f, id) => {
			const rotated = await rotateSecret(getDb(), admin(locals), id);
			return { newSecret: rotated.secret };
		}),
	remove: async ({ locals, request }) => onEndpoint(request, async (_f, id) => void (await deleteEndpoint(getDb(), admin(locals), id))),
	resend: async ({ locals, request }) =>
		onEndpoint(request, async (form, id) => {
			const deliveryId = idOf(form, 'deliveryId');
			if (!deliveryId) return { actionError: 'That delivery was not understood.' };
			await resendDelivery(getDb(), admin(locals), id, deliveryId);
		})
};
