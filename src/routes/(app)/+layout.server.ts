import { error } from '@sveltejs/kit';
import type { LayoutServerLoad } from './$types';

// hooks.server.ts already redirected anonymous visitors and suppliers; this keeps the type honest.
export const load: LayoutServerLoad = ({ locals }) => {
	if (!locals.user || locals.user.role === 'supplier') error(403, 'Staff only');
	return { user: locals.user };
};
