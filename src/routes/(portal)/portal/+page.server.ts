import { error } from '@sveltejs/kit';
import { getDb } from '$lib/server/db';
import { can } from '$lib/server/policy';
import { listNotices } from '$lib/server/services/notices';
import { portalLots } from '$lib/server/services/portal';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	const user = locals.user;
	if (!user || !can(user, 'notice:read', { supplierId: user.organisationId })) error(403, 'Supplier portal');
	const [lots, notices] = await Promise.all([portalLots(getDb(), user), listNotices(getDb(), user, {})]);
	return { lots, notices: notices.slice(0, 20) };
};
