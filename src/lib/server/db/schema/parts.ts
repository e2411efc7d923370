import { sql } from 'drizzle-orm';
import { boolean, check, doublePrecision, index, integer, pgTable, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';
import { organisations } from './organisations';
import { ocvModels } from './models';

/** A supplier's part with its configuration, acceptance limits and sampling settings. */
export const parts = pgTable(
	'parts',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		supplierId: uuid('supplier_id')
			.notNull()
			.references(() => organisations.id),
		partNumber: text('part_number').notNull(),
		description: text('description').notNull(),
		chemistry: text('chemistry').notNull(),
		cellsInSeries: integer('cells_in_series').notNull().default(1),
		cellsInParallel: integer('cells_in_parallel').notNull().default(1),
		nominalCapacityAh: doublePrecision('nominal_capacity_ah').notNull(),
		modelId: uuid('model_id').references(() => ocvModels.id),
		ocvMinCellV: doublePrecision('ocv_min_cell_v').notNull(),
		ocvMaxCellV: doublePrecision('ocv_max_cell_v').notNull(),
		residualToleranceMv: doublePrecision('residual_tolerance_mv').notNull().default(60),
		spreadLimitMv: doublePrecision('spread_limit_mv').notNull().default(50),
		// Largest max − min of a pack's cell-group voltages (common practice for a balanced pack at rest).
		imbalanceLimitMv: doublePrecision('imbalance_limit_mv').notNull().default(50),
		outlierK: doublePrecision('outlier_k').notNull().default(4),
		selfDischargeLimitMvPerDay: doublePrecision('self_discharge_limit_mv_per_day').notNull().default(2),
		declaredSocTolerance: doublePrecision('declared_soc_tolerance').notNull().default(0.1),
		meterAccuracyV: doublePrecision('meter_accuracy_v').notNull().default(0.002),
		aql: doublePrecision('aql').notNull().default(1),
		inspectionLevel: text('inspection_level').notNull().default('II'),
		requiredDocuments: text('required_documents')
			.array()
			.notNull()
			.default(sql`'{coc}'::text[]`),
		// An engine 'accept' releases the lot at once; off: quality confirms every lot of this part.
		autoReleaseAccept: boolean('auto_release_accept').notNull().default(true),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		unique('parts_supplier_part_number_uq').on(t.supplierId, t.partNumber),
		index('parts_supplier_idx').on(t.supplierId),
		check('parts_series_positive', sql`${t.cellsInSeries} >= 1`),
		check('parts_parallel_positive', sql`${t.cellsInParallel} >= 1`),
		check('parts_capacity_positive', sql`${t.nominalCapacityAh} > 0`),
		check('parts_window_order', sql`${t.ocvMinCellV} < ${t.ocvMaxCellV}`),
		check('parts_imbalance_limit_positive', sql`${t.imbalanceLimitMv} > 0`),
		check('parts_soc_tolerance_range', sql`${t.declaredSocTolerance} > 0 and ${t.declaredSocTolerance} <= 1`)
	]
);
