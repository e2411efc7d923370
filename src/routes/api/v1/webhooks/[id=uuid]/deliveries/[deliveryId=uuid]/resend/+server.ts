import { json } from '@sveltejs/kit';
import { api, authorize } from '$lib/server/http';
import { getDb } from '$lib/server/db';
import { resendDelivery } from '$lib/server/services/webhooks';
import type { RequestHandler } from './$types';

/** POST /api/v1/webhooks/{id}/deliveries/{deliveryId}/resend — send the same body again (202: queued). */
export const POST: RequestHandler = api(async (event) => {
	const user = authorize(event, 'admin:webhooks');
	await resendDelivery(getDb(), user, event.params.id, event.params.deliveryId);
	return json({ id: event.params.deliveryId, status: 'pending' }, { status: 202 });
});
