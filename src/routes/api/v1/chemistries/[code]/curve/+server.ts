// A library model's OCV–SOC curve per cell at a temperature (entropic correction from 25 °C).
import { json } from '@sveltejs/kit';
import { curve, getLibraryModel, isChemistryCode } from '$lib/electrochem';
import { api, authorize, notFound, readQuery } from '$lib/server/http';
import { curveQuery } from '$lib/schemas/electrochem';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = api((event) => {
	authorize(event, 'electrochem:use');
	const code = event.params.code.toUpperCase();
	if (!isChemistryCode(code)) throw notFound('chemistry');
	const query = readQuery(event.url, curveQuery);
	return json({ points: curve(getLibraryModel(code), query.temperature_c, query.points) });
});
