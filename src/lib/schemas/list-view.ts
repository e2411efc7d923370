/**
 * A person's saved view of a list: which columns are hidden and how it is sorted. Stored per
 * person (services/preferences.ts) and read back through the same schema, so a value saved by an
 * older version with a column that no longer exists is refused rather than half-applied.
 */
import { z } from 'zod';

/** The lots list's columns, as lots-table.svelte names them. */
export const LOT_LIST_COLUMNS = [
	'lotCode',
	'status',
	'poNumber',
	'supplierName',
	'partNumber',
	'chemistry',
	'quantity',
	'declaredSocPct',
	'transport',
	'expectedArrival',
	'createdAt'
] as const;

export type LotListColumn = (typeof LOT_LIST_COLUMNS)[number];

const column = z.enum(LOT_LIST_COLUMNS, { error: 'Unknown column' });

export const lotListViewSchema = z.object({
	// The lot code is the row's link, so it cannot be hidden.
	hidden: z.array(column.exclude(['lotCode'])).max(LOT_LIST_COLUMNS.length),
	sort: z.array(z.object({ id: column, desc: z.boolean() })).max(3)
});

export type LotListView = z.infer<typeof lotListViewSchema>;

/** Chemistry and the registration date are details most people look up on the lot itself. */
export const DEFAULT_LOT_LIST_VIEW: LotListView = { hidden: ['chemistry', 'createdAt'], sort: [] };

export const LOT_LIST_VIEW_KEY = 'lots-list';
