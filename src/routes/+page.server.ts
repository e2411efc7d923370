import { redirect } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';

/** The front door sends each role to where its work is. */
const HOME: Record<string, string> = {
	buyer: '/lots',
	inspector: '/inspect',
	quality: '/review',
	supplier: '/portal',
	admin: '/admin/users'
};

export const load: PageServerLoad = ({ locals }) => {
	redirect(303, locals.user ? HOME[locals.user.role] : '/signin');
};
