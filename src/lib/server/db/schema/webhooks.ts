import { sql } from 'drizzle-orm';
import { check, index, integer, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { users } from './users';

/**
 * An integration's endpoint: where events are POSTed. The signing secret is kept sealed
 * (AES-256-GCM under AUTH_SECRET, the endpoint id as associated data), since signing needs it back.
 */
export const webhookEndpoints = pgTable('webhook_endpoints', {
	id: uuid('id').primaryKey().defaultRandom(),
	url: text('url').notNull(),
	events: text('events').array().notNull(),
	secretSealed: text('secret_sealed').notNull(),
	pausedAt: timestamp('paused_at', { withTimezone: true }),
	createdBy: text('created_by').references(() => users.id),
	createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
	secretRotatedAt: timestamp('secret_rotated_at', { withTimezone: true })
});

/**
 * One event for one endpoint. The body is stored as the exact text that is signed and sent, so a
 * retry or "send again" sends the same bytes. The graphile-worker job `deliver_webhook`
 * (key webhook:{id}) is added in the transaction that wrote this row.
 */
export const webhookDeliveries = pgTable(
	'webhook_deliveries',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		endpointId: uuid('endpoint_id')
			.notNull()
			.references(() => webhookEndpoints.id, { onDelete: 'cascade' }),
		eventId: uuid('event_id').notNull(),
		event: text('event').notNull(),
		body: text('body').notNull(),
		status: text('status', { enum: ['pending', 'delivered', 'failed', 'refused'] })
			.notNull()
			.default('pending'),
		attempts: integer('attempts').notNull().default(0),
		responseStatus: integer('response_status'),
		lastError: text('last_error'),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		deliveredAt: timestamp('delivered_at', { withTimezone: true })
	},
	(t) => [
		index('webhook_deliveries_endpoint_idx').on(t.endpointId, t.createdAt),
		check('webhook_deliveries_attempts', sql`${t.attempts} >= 0`)
	]
);
