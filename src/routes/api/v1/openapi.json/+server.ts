import { json } from '@sveltejs/kit';
import { buildOpenApiDocument } from '$lib/server/openapi';
import type { RequestHandler } from './$types';

/** GET /api/v1/openapi.json — the OpenAPI 3.1 document; public, as an API's description is. */
export const GET: RequestHandler = () => json(buildOpenApiDocument());
