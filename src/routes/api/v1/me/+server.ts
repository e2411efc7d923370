import { json } from '@sveltejs/kit';
import { api, authorize } from '$lib/server/http';
import type { RequestHandler } from './$types';

/** Who am I? Lets an integration check its token (and the role it acts with). */
export const GET: RequestHandler = api(async (event) => {
	const user = authorize(event, 'self:read');
	return json({
		id: user.id,
		email: user.email,
		name: user.name,
		role: user.role,
		organisation_id: user.organisationId,
		auth_method: event.locals.authMethod
	});
});
