import { error } from '@sveltejs/kit';
import { can } from '$lib/server/policy';
import type { PageServerLoad } from './$types';

// The figures come from GET /api/v1/suppliers/{id}/scorecard in the browser, which checks again;
// the page itself is refused to roles without scorecards, so nobody gets an empty shell.
export const load: PageServerLoad = ({ locals }) => {
	if (!can(locals.user, 'scorecard:read')) error(403, 'Your role may not read supplier scorecards');
	return {};
};
