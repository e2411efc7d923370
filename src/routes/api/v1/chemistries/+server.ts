// The chemistry library: codes, names, per-cell voltage limits and the documents a new part of each asks for.
import { json } from '@sveltejs/kit';
import { listChemistries } from '$lib/electrochem';
import { defaultRequiredDocuments } from '$lib/inspection/dangerous-goods';
import { api, authorize } from '$lib/server/http';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = api((event) => {
	authorize(event, 'electrochem:use');
	return json(listChemistries().map((c) => ({ ...c, default_required_documents: defaultRequiredDocuments(c.code) })));
});
