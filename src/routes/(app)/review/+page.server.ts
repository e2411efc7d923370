import { error } from '@sveltejs/kit';
import { can } from '$lib/server/policy';
import { reviewQueue } from '$lib/server/services/decisions';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	if (!locals.user || !can(locals.user, 'review:read')) error(403, 'The hold review is for quality managers');
	return { queue: await reviewQueue() };
};
