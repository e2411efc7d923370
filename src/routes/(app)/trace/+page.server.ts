import { error } from '@sveltejs/kit';
import { traceQuerySchema } from '$lib/schemas/trace';
import { getDb } from '$lib/server/db';
import { issuesText } from '$lib/server/http';
import { can, ownOrganisation } from '$lib/server/policy';
import { traceSerial } from '$lib/server/services/serial-trace';
import type { PageServerLoad } from './$types';

/** /trace?serial=… (exact) or ?serial_prefix=… — the same search as GET /api/v1/readings, for people. */
export const load: PageServerLoad = async ({ locals, url }) => {
	const user = locals.user!;
	if (!can(user, 'lot:read', ownOrganisation(user))) error(403, 'Your role may not read lots');
	const serial = url.searchParams.get('serial') ?? '';
	const prefix = url.searchParams.get('serial_prefix') ?? '';
	if (!serial && !prefix) return { serial, prefix, result: null };
	const parsed = traceQuerySchema.safeParse(Object.fromEntries(url.searchParams));
	if (!parsed.success) return { serial, prefix, result: null, problem: issuesText(parsed.error) };
	return { serial, prefix, result: await traceSerial(getDb(), user, parsed.data) };
};
