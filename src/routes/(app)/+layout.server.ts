import { error } from '@sveltejs/kit';
import { can } from '$lib/server/policy';
import { reviewCount } from '$lib/server/services/decisions';
import type { LayoutServerLoad } from './$types';

// hooks.server.ts already redirected anonymous visitors and suppliers; this keeps the type honest.
export const load: LayoutServerLoad = async ({ locals }) => {
	if (!locals.user || locals.user.role === 'supplier') error(403, 'Staff only');
	// Quality sees in the header how many lots wait for its disposition (the in-app side of the hold alert).
	return { user: locals.user, reviewCount: can(locals.user, 'review:read') ? await reviewCount() : null };
};
