import { json } from '@sveltejs/kit';
import { api, authorize } from '$lib/server/http';
import { getDb } from '$lib/server/db';
import { listSuppliers, supplierJson } from '$lib/server/services/suppliers';
import type { RequestHandler } from './$types';

/** GET /api/v1/suppliers: supplier organisations with their notice contacts. */
export const GET: RequestHandler = api(async (event) => {
	authorize(event, 'supplier:read');
	const suppliers = await listSuppliers(getDb());
	return json({ suppliers: suppliers.map(supplierJson) });
});
