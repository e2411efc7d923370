import { error } from '@sveltejs/kit';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = ({ locals }) => {
	if (!locals.user || locals.user.role !== 'supplier') error(403, 'Supplier portal');
	return { user: locals.user };
};
