import { sql } from 'drizzle-orm';
import { boolean, check, date, doublePrecision, index, integer, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { lastDirectionEnum, lotStatusEnum, severityEnum, transportEnum } from './enums';
import { organisations } from './organisations';
import { parts } from './parts';
import { users } from './users';

/** A purchase lot of cells or packs, from registration to disposition. */
export const lots = pgTable(
	'lots',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		lotCode: text('lot_code').notNull().unique(),
		poNumber: text('po_number').notNull(),
		supplierId: uuid('supplier_id')
			.notNull()
			.references(() => organisations.id),
		partId: uuid('part_id')
			.notNull()
			.references(() => parts.id),
		quantity: integer('quantity').notNull(),
		declaredSoc: doublePrecision('declared_soc'),
		transport: transportEnum('transport').notNull(),
		/** How the cells were last moved (OCV hysteresis branch); unknown: the interval covers both branches. */
		lastDirection: lastDirectionEnum('last_direction').notNull().default('unknown'),
		unNumber: text('un_number'),
		/** How the cells travel: alone, with_equipment or in_equipment (selects the DG packing instruction). */
		packing: text('packing').notNull().default('alone'),
		/** Submitted again after it was not accepted: not an original inspection, so it does not count for switching (ISO 2859-1:1999 9.3). */
		resubmitted: boolean('resubmitted').notNull().default(false),
		expectedArrival: date('expected_arrival'),
		receivedAt: timestamp('received_at', { withTimezone: true }),
		status: lotStatusEnum('status').notNull().default('draft'),
		severity: severityEnum('severity'),
		createdBy: text('created_by').references(() => users.id),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
		decidedAt: timestamp('decided_at', { withTimezone: true }),
		/** Bumped by triggers on every write that can change the lot's evaluation (cache key). */
		revision: integer('revision').notNull().default(0)
	},
	(t) => [
		// NULLS FIRST: what `ORDER BY … DESC` means, so the list's ORDER BY can walk these indexes
		// (drizzle's plain .desc() makes them NULLS LAST, and PostgreSQL then sorts every lot).
		index('lots_created_idx').on(t.createdAt.desc().nullsFirst(), t.id.desc().nullsFirst()),
		index('lots_status_created_idx').on(t.status, t.createdAt.desc().nullsFirst(), t.id.desc().nullsFirst()),
		index('lots_supplier_created_idx').on(t.supplierId, t.createdAt.desc().nullsFirst(), t.id.desc().nullsFirst()),
		index('lots_part_decided_idx').on(t.supplierId, t.partId, t.decidedAt),
		check('lots_quantity_positive', sql`${t.quantity} > 0`),
		check('lots_declared_soc_range', sql`${t.declaredSoc} is null or (${t.declaredSoc} >= 0 and ${t.declaredSoc} <= 1)`),
		check('lots_un_number_format', sql`${t.unNumber} is null or ${t.unNumber} ~ '^UN[0-9]{4}$'`),
		check('lots_packing_known', sql`${t.packing} in ('alone', 'with_equipment', 'in_equipment')`)
	]
);

/** Inspection resumed by quality after a discontinuation (ISO 2859-1 9.4): restarts on tightened. */
export const inspectionResumptions = pgTable('inspection_resumptions', {
	id: uuid('id').primaryKey().defaultRandom(),
	supplierId: uuid('supplier_id')
		.notNull()
		.references(() => organisations.id),
	partId: uuid('part_id')
		.notNull()
		.references(() => parts.id),
	reason: text('reason').notNull(),
	resumedBy: text('resumed_by').references(() => users.id),
	resumedAt: timestamp('resumed_at', { withTimezone: true }).notNull().defaultNow()
});
