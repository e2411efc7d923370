import { error, fail } from '@sveltejs/kit';
import { z } from 'zod';
import { getDb } from '$lib/server/db';
import { orErrorPage, refusalOf } from '$lib/server/action-errors';
import { can } from '$lib/server/policy';
import { replySchema } from '$lib/schemas/decision';
import { getLotForUser } from '$lib/server/services/lots';
import { acknowledgeNotice } from '$lib/server/services/notices';
import { portalNotices, replyToNotice } from '$lib/server/services/portal';
import { incomingFile } from '$lib/server/services/uploads';
import type { Actions, PageServerLoad } from './$types';

function supplier(locals: App.Locals) {
	const user = locals.user;
	if (!user || !can(user, 'notice:read', { supplierId: user.organisationId })) error(403, 'Supplier portal');
	return user;
}

export const load: PageServerLoad = async ({ locals, params }) => {
	const user = supplier(locals);
	const lot = await getLotForUser(getDb(), user, params.id);
	if (!lot) error(404, 'Lot not found');
	return {
		lot: {
			id: lot.id,
			lotCode: lot.lotCode,
			poNumber: lot.poNumber,
			status: lot.status,
			quantity: lot.quantity,
			partNumber: lot.partNumber,
			partDescription: lot.partDescription,
			decidedAt: lot.decidedAt?.toISOString() ?? null
		},
		notices: await orErrorPage(portalNotices(getDb(), user, lot.id))
	};
};

const noticeId = (data: FormData) => {
	const id = String(data.get('noticeId') ?? '');
	return z.uuid().safeParse(id).success ? id : null;
};

async function run<T>(work: () => Promise<T>) {
	try {
		return { ok: true as const, value: await work() };
	} catch (e) {
		return { ok: false as const, ...refusalOf(e) };
	}
}

export const actions: Actions = {
	acknowledge: async ({ locals, request }) => {
		const user = supplier(locals);
		const id = noticeId(await request.formData());
		if (!id) return fail(400, { noticeId: null, error: 'That notice was not understood.' });
		const result = await run(() => acknowledgeNotice(getDb(), user, id));
		return result.ok ? { noticeId: id, acknowledged: true } : fail(result.status, { noticeId: id, error: result.message });
	},
	reply: async ({ locals, request }) => {
		const user = supplier(locals);
		const data = await request.formData();
		const id = noticeId(data);
		if (!id) return fail(400, { noticeId: null, error: 'That notice was not understood.' });
		const parsed = replySchema.safeParse({ comment: data.get('comment') ?? '' });
		if (!parsed.success) return fail(400, { noticeId: id, error: parsed.error.issues[0].message });
		// Every file takes the one upload path (services/uploads.ts); a refusal names the field `file`.
		const file = await incomingFile(data.get('file'));
		const result = await run(() => replyToNotice(getDb(), user, id, { comment: parsed.data.comment, file }));
		return result.ok ? { noticeId: id, replied: true } : fail(result.status, { noticeId: id, error: result.message, field: result.field });
	}
};
