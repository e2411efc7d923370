import { doublePrecision, jsonb, pgTable, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';
import { users } from './users';

/**
 * OCV model versions. `parameters` holds the whole electrochem OcvModel as JSON, so a stored
 * evaluation can name the exact model it used. Library versions are seeded; fitted ones come
 * from reference curves and need a quality manager's approval before parts may use them.
 */
export const ocvModels = pgTable(
	'ocv_models',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		chemistry: text('chemistry').notNull(),
		version: text('version').notNull(),
		name: text('name').notNull(),
		origin: text('origin', { enum: ['library', 'fitted'] }).notNull(),
		parameters: jsonb('parameters').notNull(),
		source: text('source').notNull(),
		fitTemperatureC: doublePrecision('fit_temperature_c'),
		fitRmseV: doublePrecision('fit_rmse_v'),
		fitMaxErrorV: doublePrecision('fit_max_error_v'),
		/** Fitted versions: the points as submitted ({soc, ocv_v}[] at fit_temperature_c), kept so the fit can be redone. */
		referencePoints: jsonb('reference_points'),
		/** Leave-one-out cross-validated σ of the fit, V (also parameters.sigma_model_v). */
		fitSigmaV: doublePrecision('fit_sigma_v'),
		/** Where the points came from, in the author's words (datasheet, own measurement). */
		dataSource: text('data_source'),
		createdBy: text('created_by').references(() => users.id),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		approvedBy: text('approved_by').references(() => users.id),
		approvedAt: timestamp('approved_at', { withTimezone: true }),
		/** The approver's e-signature manifest (signature-manifest.ts style: who, meaning, reason, hash of what was signed). */
		approvalSignature: jsonb('approval_signature')
	},
	(t) => [unique('ocv_models_chemistry_version_uq').on(t.chemistry, t.version)]
);
