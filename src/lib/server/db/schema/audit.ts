import { bigserial, index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

/**
 * Append-only audit trail (sign-ins, role changes, tokens, decisions and e-signatures).
 * A trigger in the migrations refuses UPDATE, DELETE and TRUNCATE.
 * No foreign keys, so the trail outlives anything it mentions.
 */
export const auditEvents = pgTable(
	'audit_events',
	{
		id: bigserial('id', { mode: 'number' }).primaryKey(),
		at: timestamp('at', { withTimezone: true }).notNull().defaultNow(),
		actorId: text('actor_id'),
		actorEmail: text('actor_email'),
		action: text('action').notNull(),
		entityType: text('entity_type'),
		entityId: text('entity_id'),
		lotId: uuid('lot_id'),
		details: jsonb('details').notNull().default({}),
		ip: text('ip')
	},
	(t) => [index('audit_events_lot_idx').on(t.lotId, t.at), index('audit_events_action_idx').on(t.action, t.at)]
);
