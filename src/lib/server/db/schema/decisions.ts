import { sql } from 'drizzle-orm';
import { bigint, bigserial, boolean, check, date, index, integer, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { MATERIAL_DISPOSITIONS } from '../../../schemas/disposition';
import { dispositionEnum, lotStatusEnum, severityEnum } from './enums';
import { lots } from './lots';
import { ocvModels } from './models';
import { users } from './users';

/**
 * Every run of the disposition engine, kept forever: inputs snapshot, model, plan and result,
 * so a decision can be reproduced later. Re-evaluation adds a row; nothing is overwritten.
 */
export const evaluations = pgTable(
	'evaluations',
	{
		id: bigserial('id', { mode: 'number' }).primaryKey(),
		lotId: uuid('lot_id')
			.notNull()
			.references(() => lots.id, { onDelete: 'cascade' }),
		modelId: uuid('model_id').references(() => ocvModels.id),
		modelVersion: text('model_version').notNull(),
		severity: severityEnum('severity').notNull(),
		plan: jsonb('plan').notNull(),
		inputs: jsonb('inputs').notNull(),
		result: jsonb('result').notNull(),
		disposition: dispositionEnum('disposition').notNull(),
		safety: boolean('safety').notNull().default(false),
		createdBy: text('created_by').references(() => users.id),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('evaluations_lot_idx').on(t.lotId, t.createdAt)]
);

/** Status changes by the engine ('automatic') or by a quality manager ('override', e-signed). */
export const decisions = pgTable(
	'decisions',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		lotId: uuid('lot_id')
			.notNull()
			.references(() => lots.id, { onDelete: 'cascade' }),
		evaluationId: bigint('evaluation_id', { mode: 'number' }).references(() => evaluations.id),
		kind: text('kind', { enum: ['automatic', 'override'] }).notNull(),
		fromStatus: lotStatusEnum('from_status').notNull(),
		toStatus: lotStatusEnum('to_status').notNull(),
		reason: text('reason'),
		// Quality's material disposition (override only): what happens to the lot and what the supplier is asked.
		disposition: text('disposition', { enum: MATERIAL_DISPOSITIONS }),
		// The date by which the supplier is asked to act (every disposition but release).
		supplierDueDate: date('supplier_due_date', { mode: 'string' }),
		signature: jsonb('signature'),
		decidedBy: text('decided_by').references(() => users.id),
		decidedAt: timestamp('decided_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('decisions_lot_idx').on(t.lotId, t.decidedAt)]
);

/**
 * Server-issued, single-use challenges for the e-signature of a quality override: each binds one
 * signer to one lot at one revision and one decision, and expires. The override consumes it
 * (used_at) in the same transaction as the decision, so a signature cannot be replayed on another
 * lot, on the same lot after it changed, or for the other decision.
 */
export const signatureChallenges = pgTable(
	'signature_challenges',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		lotId: uuid('lot_id')
			.notNull()
			.references(() => lots.id, { onDelete: 'cascade' }),
		lotRevision: integer('lot_revision').notNull(),
		decision: text('decision', { enum: ['accept', 'reject'] }).notNull(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id),
		issuedAt: timestamp('issued_at', { withTimezone: true }).notNull().defaultNow(),
		expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
		usedAt: timestamp('used_at', { withTimezone: true })
	},
	(t) => [
		index('signature_challenges_lot_idx').on(t.lotId),
		check('signature_challenges_decision', sql`${t.decision} in ('accept', 'reject')`),
		check('signature_challenges_expiry_after_issue', sql`${t.expiresAt} > ${t.issuedAt}`)
	]
);
