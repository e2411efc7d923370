// Derived state: stored only to answer reads fast, always rebuildable from the other tables.
import { doublePrecision, integer, jsonb, pgTable, primaryKey, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { severityEnum } from './enums';
import { lots } from './lots';
import { organisations } from './organisations';
import { parts } from './parts';

/**
 * The switching state (severity for the next lot) per supplier × part, written in the same
 * transaction as every decision and resumption; equals the replay of the decided-lot history
 * (services/switching.ts), which stays the rebuild path when a row is missing.
 */
export const samplingStates = pgTable(
	'sampling_states',
	{
		supplierId: uuid('supplier_id')
			.notNull()
			.references(() => organisations.id),
		partId: uuid('part_id')
			.notNull()
			.references(() => parts.id),
		severity: severityEnum('severity').notNull(),
		switchingScore: doublePrecision('switching_score').notNull(),
		/** The replay's view (SeverityView without the lots list): switches, resumptions, code letter. */
		history: jsonb('history').notNull(),
		lastLotDecidedAt: timestamp('last_lot_decided_at', { withTimezone: true }),
		updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [primaryKey({ columns: [t.supplierId, t.partId] })]
);

/**
 * The serialised evaluation of a lot at a lot revision (lots.revision, bumped by database triggers
 * on every write that can change the evaluation). Shared by all app processes; a row whose
 * revision is not the lot's current one is never served.
 */
export const lotEvaluationsCache = pgTable('lot_evaluations_cache', {
	lotId: uuid('lot_id')
		.primaryKey()
		.references(() => lots.id, { onDelete: 'cascade' }),
	revision: integer('revision').notNull(),
	body: text('body').notNull(),
	computedAt: timestamp('computed_at', { withTimezone: true }).notNull().defaultNow()
});
