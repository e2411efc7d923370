/**
 * Webhooks: endpoints an administrator registers, and one delivery row per event and endpoint.
 * An event is queued by `queueWebhookEvent(tx, …)` inside the transaction that caused it: the
 * delivery rows and their graphile-worker jobs (`deliver_webhook`, key webhook:{id}) commit or roll
 * back with the lot, decision or notice. The job (webhooks/task.ts) posts the stored body; a failed
 * attempt is retried after exp(attempts) s, as the mail outbox is; after the attempt budget the
 * delivery is 'failed' and the admin's "send again" re-arms it. Nothing is deleted but by deleting
 * its endpoint.
 *
 *   pending ──2xx──► delivered        pending ──other answer / no answer──► pending, attempts+1 (or failed)
 *   pending ──internal target (production)──► refused        failed / refused / delivered ──send again──► pending
 */
import { randomBytes, randomUUID } from 'node:crypto';
import { and, desc, eq, isNull, sql } from 'drizzle-orm';
import type { Database, Tx } from '../db';
import { webhookDeliveries, webhookEndpoints } from '../db/schema';
import { Invalid, NotFound } from '../errors';
import { outboxOptionsFromEnv } from '../mail/outbox';
import { internalTargetsAllowed, RefusedTarget, resolveTarget } from '../webhooks/target';
import { recordAudit } from './audit';
import { openSecret, sealSecret } from './second-factor-seal';
import type { WebhookEvent } from '$lib/schemas/webhook';

export const DELIVER_WEBHOOK_TASK = 'deliver_webhook';

type Actor = { id: string; email: string };
type Endpoint = typeof webhookEndpoints.$inferSelect;

const authSecret = () => process.env.AUTH_SECRET ?? '';
/** The endpoint id is sealed in with its secret, so a secret copied onto another endpoint does not open. */
const sealFor = (endpointId: string) => `webhook:${endpointId}`;
const newSecret = () => `whsec_${randomBytes(32).toString('base64url')}`;

export function endpointSecret(endpoint: Pick<Endpoint, 'id' | 'secretSealed'>): string {
	return openSecret(endpoint.secretSealed, sealFor(endpoint.id), authSecret());
}

/** In production a URL whose host is (or resolves to) an internal address is refused at once (422 naming url). */
async function checkTarget(url: string): Promise<void> {
	if (internalTargetsAllowed()) return;
	try {
		await resolveTarget(new URL(url), false);
	} catch (error) {
		const message = error instanceof RefusedTarget ? error.message : `the host name could not be resolved (${(error as Error).message})`;
		throw new Invalid('The webhook address was refused', [{ path: 'url', message }]);
	}
}

export interface EndpointJson {
	id: string;
	url: string;
	events: string[];
	paused: boolean;
	created_at: string;
	secret_rotated_at: string | null;
}

const endpointJson = (e: Endpoint): EndpointJson => ({
	id: e.id,
	url: e.url,
	events: e.events,
	paused: e.pausedAt !== null,
	created_at: e.createdAt.toISOString(),
	secret_rotated_at: e.secretRotatedAt?.toISOString() ?? null
});

/** Register an endpoint; the secret is returned this once (only its sealed form is stored). */
export async function createEndpoint(db: Database, actor: Actor, input: { url: string; events: WebhookEvent[] }) {
	await checkTarget(input.url);
	const secret = newSecret();
	const id = randomUUID();
	return db.transaction(async (tx) => {
		const [row] = await tx
			.insert(webhookEndpoints)
			.values({
				id,
				url: input.url,
				events: [...new Set(input.events)],
				secretSealed: sealSecret(secret, sealFor(id), authSecret()),
				createdBy: actor.id
			})
			.returning();
		await audit(tx, actor, 'webhook.created', id, { url: input.url, events: row.events });
		return { ...endpointJson(row), secret };
	});
}

export async function listEndpoints(db: Database): Promise<EndpointJson[]> {
	const rows = await db.select().from(webhookEndpoints).orderBy(desc(webhookEndpoints.createdAt));
	return rows.map(endpointJson);
}

export async function getEndpoint(db: Database | Tx, id: string): Promise<EndpointJson> {
	const [row] = await db.select().from(webhookEndpoints).where(eq(webhookEndpoints.id, id));
	if (!row) throw new NotFound('webhook');
	return endpointJson(row);
}

export async function setPaused(db: Database, actor: Actor, id: string, paused: boolean): Promise<EndpointJson> {
	return db.transaction(async (tx) => {
		const [row] = await tx
			.update(webhookEndpoints)
			.set({ pausedAt: paused ? sql`coalesce(${webhookEndpoints.pausedAt}, now())` : null })
			.where(eq(webhookEndpoints.id, id))
			.returning();
		if (!row) throw new NotFound('webhook');
		await audit(tx, actor, paused ? 'webhook.paused' : 'webhook.resumed', id, {});
		return endpointJson(row);
	});
}

export async function rotateSecret(db: Database, actor: Actor, id: string): Promise<{ id: string; secret: string }> {
	const secret = newSecret();
	return db.transaction(async (tx) => {
		const [row] = await tx
			.update(webhookEndpoints)
			.set({ secretSealed: sealSecret(secret, sealFor(id), authSecret()), secretRotatedAt: new Date() })
			.where(eq(webhookEndpoints.id, id))
			.returning({ id: webhookEndpoints.id });
		if (!row) throw new NotFound('webhook');
		await audit(tx, actor, 'webhook.secret_rotated', id, {});
		return { id, secret };
	});
}

/** Delete an endpoint with its delivery log; waiting jobs find no row and end. */
export async function deleteEndpoint(db: Database, actor: Actor, id: string): Promise<void> {
	await db.transaction(async (tx) => {
		const [row] = await tx.delete(webhookEndpoints).where(eq(webhookEndpoints.id, id)).returning({ url: webhookEndpoints.url });
		if (!row) throw new NotFound('webhook');
		await audit(tx, actor, 'webhook.deleted', id, { url: row.url });
	});
}

function audit(tx: Tx, actor: Actor, action: string, id: string, details: Record<string, unknown>) {
	return recordAudit(tx, { actorId: actor.id, actorEmail: actor.email, action, entityType: 'webhook', entityId: id, details });
}

// ---------------------------------------------------------------- events and deliveries

async function enqueueDelivery(tx: Database | Tx, deliveryId: string): Promise<void> {
	await tx.execute(
		sql`select graphile_worker.add_job(${DELIVER_WEBHOOK_TASK}, json_build_object('deliveryId', ${deliveryId}::text), job_key => ${`webhook:${deliveryId}`}, max_attempts => ${outboxOptionsFromEnv().maxAttempts}::int)`
	);
}

/**
 * Queue `event` for every active endpoint subscribed to it, in the caller's transaction. The body
 * `{id, event, occurred_at, data}` is written once as text; `id` is the event's (the same for
 * every endpoint), so a receiver can tell a repeat from a new event.
 */
export async function queueWebhookEvent(tx: Tx, event: WebhookEvent, data: Record<string, unknown>): Promise<void> {
	const endpoints = await tx
		.select({ id: webhookEndpoints.id })
		.from(webhookEndpoints)
		.where(and(isNull(webhookEndpoints.pausedAt), sql`${event} = any(${webhookEndpoints.events})`));
	if (endpoints.length === 0) return;
	const eventId = randomUUID();
	const body = JSON.stringify({ id: eventId, event, occurred_at: new Date().toISOString(), data });
	const rows = await tx
		.insert(webhookDeliveries)
		.values(endpoints.map((e) => ({ endpointId: e.id, eventId, event, body })))
		.returning({ id: webhookDeliveries.id });
	for (const row of rows) await enqueueDelivery(tx, row.id);
}

export interface DeliveryJson {
	id: string;
	endpoint_id: string;
	event_id: string;
	event: string;
	status: 'pending' | 'delivered' | 'failed' | 'refused';
	attempts: number;
	response_status: number | null;
	last_error: string | null;
	created_at: string;
	delivered_at: string | null;
	next_attempt_at: string | null;
}

/** The latest deliveries of one endpoint, newest first, with the waiting job's next run. */
export async function listDeliveries(db: Database, endpointId: string, limit = 100): Promise<DeliveryJson[]> {
	await getEndpoint(db, endpointId);
	const nextAttemptAt = sql<
		string | null
	>`(select j.run_at from graphile_worker.jobs j where j.key = 'webhook:' || ${webhookDeliveries.id} and j.attempts < j.max_attempts and ${webhookDeliveries.status} = 'pending')`;
	const rows = await db
		.select({ d: webhookDeliveries, nextAttemptAt })
		.from(webhookDeliveries)
		.where(eq(webhookDeliveries.endpointId, endpointId))
		.orderBy(desc(webhookDeliveries.createdAt))
		.limit(limit);
	return rows.map(({ d, nextAttemptAt }) => ({
		id: d.id,
		endpoint_id: d.endpointId,
		event_id: d.eventId,
		event: d.event,
		status: d.status,
		attempts: d.attempts,
		response_status: d.responseStatus,
		last_error: d.lastError,
		created_at: d.createdAt.toISOString(),
		delivered_at: d.deliveredAt?.toISOString() ?? null,
		next_attempt_at: nextAttemptAt ? new Date(nextAttemptAt).toISOString() : null
	}));
}

/** "Send again": the same body (same event id) once more, with a fresh attempt budget. */
export async function resendDelivery(db: Database, actor: Actor, endpointId: string, deliveryId: string): Promise<void> {
	await db.transaction(async (tx) => {
		const [row] = await tx
			.update(webhookDeliveries)
			.set({ status: 'pending', attempts: 0, lastError: null })
			.where(and(eq(webhookDeliveries.id, deliveryId), eq(webhookDeliveries.endpointId, endpointId)))
			.returning({ id: webhookDeliveries.id });
		if (!row) throw new NotFound('delivery');
		await enqueueDelivery(tx, deliveryId);
		await audit(tx, actor, 'webhook.resent', endpointId, { deliveryId });
	});
}

/** What the delivery job needs: the pending delivery with its endpoint, or null (done, deleted). */
export async function pendingDelivery(db: Database, deliveryId: string) {
	const [row] = await db
		.select({ delivery: webhookDeliveries, endpoint: webhookEndpoints })
		.from(webhookDeliveries)
		.innerJoin(webhookEndpoints, eq(webhookEndpoints.id, webhookDeliveries.endpointId))
		.where(and(eq(webhookDeliveries.id, deliveryId), eq(webhookDeliveries.status, 'pending')));
	return row ?? null;
}

type Outcome =
	| { kind: 'delivered'; responseStatus: number }
	| { kind: 'attempt_failed'; responseStatus: number | null; error: string; lastAttempt: boolean }
	| { kind: 'refused'; error: string };

/** Record one attempt's outcome on a still-pending delivery. */
export async function recordAttempt(db: Database, deliveryId: string, attempt: number, outcome: Outcome): Promise<void> {
	const common = { attempts: attempt };
	const set =
		outcome.kind === 'delivered'
			? { ...common, status: 'delivered' as const, responseStatus: outcome.responseStatus, lastError: null, deliveredAt: new Date() }
			: outcome.kind === 'refused'
				? { ...common, status: 'refused' as const, responseStatus: null, lastError: outcome.error }
				: {
						...common,
						status: outcome.lastAttempt ? ('failed' as const) : ('pending' as const),
						responseStatus: outcome.responseStatus,
						lastError: outcome.error
					};
	await db
		.update(webhookDeliveries)
		.set(set)
		.where(and(eq(webhookDeliveries.id, deliveryId), eq(webhookDeliveries.status, 'pending')));
}
