import { error, fail } from '@sveltejs/kit';
import { z } from 'zod';
import { getDb } from '$lib/server/db';
import { can } from '$lib/server/policy';
import { listOutbox, retryFailedNotice } from '$lib/server/mail/outbox';
import type { Actions, PageServerLoad } from './$types';

function admin(locals: App.Locals) {
	if (!locals.user || !can(locals.user, 'admin:outbox')) error(403, 'Only administrators see the mail outbox');
	return locals.user;
}

export const load: PageServerLoad = async ({ locals, depends }) => {
	admin(locals);
	depends('app:outbox');
	return { outbox: await listOutbox(getDb()) };
};

export const actions: Actions = {
	retry: async ({ locals, request }) => {
		const actor = admin(locals);
		const id = String((await request.formData()).get('noticeId') ?? '');
		if (!z.uuid().safeParse(id).success) return fail(400, { retryError: 'That notice was not understood.' });
		const ok = await retryFailedNotice(getDb(), id, actor);
		return ok ? { retried: id } : fail(409, { retryError: 'That notice is no longer failed (it was sent or retried already).' });
	}
};
