// The chemistry library: codes, names and per-cell voltage limits.
import { json } from '@sveltejs/kit';
import { listChemistries } from '$lib/electrochem';
import { api, authorize } from '$lib/server/http';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = api((event) => {
	authorize(event, 'electrochem:use');
	return json(listChemistries());
});
