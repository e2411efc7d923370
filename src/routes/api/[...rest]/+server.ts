// Any /api/ path no route matches (an unknown path, or an id that fails its [id=uuid] matcher)
// answers in the API's error shape instead of SvelteKit's HTML 404 page.
import { errorResponse, notFound } from '$lib/server/http';
import type { RequestHandler } from './$types';

export const fallback: RequestHandler = () => errorResponse(notFound('API route'));
