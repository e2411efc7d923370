import { sql } from 'drizzle-orm';
import { bigserial, boolean, check, doublePrecision, index, integer, pgTable, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';
import { readingSourceEnum } from './enums';
import { lots } from './lots';
import { users } from './users';

/** One imported meter file; (lot, sha256) is unique so the same file is never imported twice. */
export const readingImports = pgTable(
	'reading_imports',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		lotId: uuid('lot_id')
			.notNull()
			.references(() => lots.id, { onDelete: 'cascade' }),
		fileName: text('file_name').notNull(),
		fileSha256: text('file_sha256').notNull(),
		rowCount: integer('row_count').notNull(),
		importedBy: text('imported_by').references(() => users.id),
		importedAt: timestamp('imported_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [unique('reading_imports_lot_sha_uq').on(t.lotId, t.fileSha256)]
);

/** A measured unit reading. A unit (serial) may have several readings over days (self-discharge). */
export const readings = pgTable(
	'readings',
	{
		id: bigserial('id', { mode: 'number' }).primaryKey(),
		lotId: uuid('lot_id')
			.notNull()
			.references(() => lots.id, { onDelete: 'cascade' }),
		serial: text('serial').notNull(),
		ocvV: doublePrecision('ocv_v').notNull(),
		temperatureC: doublePrecision('temperature_c').notNull(),
		acResistanceMohm: doublePrecision('ac_resistance_mohm'),
		// A pack's cell-group voltages, one per cell in series (the service checks the count against the part).
		cellGroupVoltages: doublePrecision('cell_group_voltages').array(),
		measuredAt: timestamp('measured_at', { withTimezone: true }).notNull().defaultNow(),
		source: readingSourceEnum('source').notNull(),
		importId: uuid('import_id').references(() => readingImports.id, { onDelete: 'cascade' }),
		// Set by the browser grid so a retried save after a network error is not stored twice.
		clientKey: text('client_key'),
		// The inspector confirmed an OCV outside the part's plausible window (the entry guard asked first).
		confirmedOutOfWindow: boolean('confirmed_out_of_window').notNull().default(false),
		enteredBy: text('entered_by').references(() => users.id),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		index('readings_lot_serial_idx').on(t.lotId, t.serial, t.measuredAt),
		// A serial trace (lot list `serial` filter): every lot that holds a reading of this unit.
		index('readings_serial_idx').on(t.serial, t.lotId),
		unique('readings_lot_client_key_uq').on(t.lotId, t.clientKey),
		check('readings_ocv_range', sql`${t.ocvV} >= 0 and ${t.ocvV} < 1000`),
		check('readings_temperature_range', sql`${t.temperatureC} > -60 and ${t.temperatureC} < 120`),
		check('readings_resistance_positive', sql`${t.acResistanceMohm} is null or ${t.acResistanceMohm} > 0`),
		check(
			'readings_cell_groups_plausible',
			sql`${t.cellGroupVoltages} is null or (cardinality(${t.cellGroupVoltages}) between 2 and 1000 and array_position(${t.cellGroupVoltages}, null) is null and 0 <= all(${t.cellGroupVoltages}) and 6 >= all(${t.cellGroupVoltages}))`
		)
	]
);
