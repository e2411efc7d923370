import { sql } from 'drizzle-orm';
import { bigint, check, customType, index, pgTable, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';
import { documentKindEnum } from './enums';
import { lots } from './lots';
import { users } from './users';

const bytea = customType<{ data: Buffer }>({ dataType: () => 'bytea' });

/**
 * Lot documents (CoC, UN 38.3 summary, SDS, supplier responses) stored in PG, so several app
 * processes share them and a backup holds everything. The file name is kept only for display.
 */
export const documents = pgTable(
	'documents',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		lotId: uuid('lot_id')
			.notNull()
			.references(() => lots.id, { onDelete: 'cascade' }),
		kind: documentKindEnum('kind').notNull(),
		fileName: text('file_name').notNull(),
		mime: text('mime').notNull(),
		sizeBytes: bigint('size_bytes', { mode: 'number' }).notNull(),
		sha256: text('sha256').notNull(),
		bytes: bytea('bytes').notNull(),
		uploadedBy: text('uploaded_by').references(() => users.id),
		uploadedAt: timestamp('uploaded_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		unique('documents_lot_sha_uq').on(t.lotId, t.sha256),
		index('documents_lot_idx').on(t.lotId),
		check('documents_size_positive', sql`${t.sizeBytes} > 0`)
	]
);
