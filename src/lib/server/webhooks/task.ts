/**
 * The graphile-worker task `deliver_webhook` (registered in mail/worker.ts beside `send_notice`):
 * post the stored body and record the attempt. A thrown error makes graphile-worker retry the job
 * after exp(attempts) s; a 2xx answer ends it; an internal target in production ends it as refused
 * (trying again would be refused again). Delivery is at-least-once: a receiver deduplicates by the
 * body's event id (or the x-restvolt-delivery header).
 */
import type { Task } from 'graphile-worker';
import { getDb } from '../db';
import { endpointSecret, pendingDelivery, recordAttempt } from '../services/webhooks';
import { postWebhook } from './send';
import { RefusedTarget } from './target';

const short = (error: unknown) => (error instanceof Error ? error.message : String(error)).slice(0, 500);

export const deliverWebhookTask: Task = async (payload, helpers) => {
	const { deliveryId } = payload as { deliveryId: string };
	const db = getDb();
	const found = await pendingDelivery(db, deliveryId);
	if (!found) return; // delivered already, or its endpoint was deleted
	const { delivery, endpoint } = found;
	const { attempts, max_attempts } = helpers.job; // attempts counts this one
	const lastAttempt = attempts >= max_attempts;
	let status: number;
	try {
		status = await postWebhook({
			url: endpoint.url,
			event: delivery.event,
			deliveryId,
			body: delivery.body,
			secret: endpointSecret(endpoint)
		});
	} catch (error) {
		if (error instanceof RefusedTarget) {
			await recordAttempt(db, deliveryId, attempts, { kind: 'refused', error: short(error) });
			return;
		}
		await recordAttempt(db, deliveryId, attempts, { kind: 'attempt_failed', responseStatus: null, error: short(error), lastAttempt });
		throw error;
	}
	if (status >= 200 && status < 300) {
		await recordAttempt(db, deliveryId, attempts, { kind: 'delivered', responseStatus: status });
		return;
	}
	await recordAttempt(db, deliveryId, attempts, {
		kind: 'attempt_failed',
		responseStatus: status,
		error: `the receiver answered ${status}`,
		lastAttempt
	});
	throw new Error(`webhook ${deliveryId}: the receiver answered ${status}`);
};
