import { index, integer, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { noticeStatusEnum } from './enums';
import { decisions } from './decisions';
import { documents } from './documents';
import { lots } from './lots';
import { organisations } from './organisations';
import { users } from './users';

/**
 * The mail outbox: a notice row is written in the same transaction as the decision, together with
 * the graphile-worker job that sends it (mail/outbox.ts); the row keeps the state people see.
 */
export const notices = pgTable(
	'notices',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		lotId: uuid('lot_id')
			.notNull()
			.references(() => lots.id, { onDelete: 'cascade' }),
		decisionId: uuid('decision_id').references(() => decisions.id),
		organisationId: uuid('organisation_id')
			.notNull()
			.references(() => organisations.id),
		// 'alert': an internal message to the receiving company's buyers and quality managers (organisation = own).
		kind: text('kind', { enum: ['accept', 'hold', 'reject', 'override', 'alert'] }).notNull(),
		recipients: text('recipients').array().notNull(),
		subject: text('subject').notNull(),
		bodyText: text('body_text').notNull(),
		bodyHtml: text('body_html').notNull(),
		status: noticeStatusEnum('status').notNull().default('pending'),
		attempts: integer('attempts').notNull().default(0),
		lastError: text('last_error'),
		messageId: text('message_id'),
		sentAt: timestamp('sent_at', { withTimezone: true }),
		acknowledgedAt: timestamp('acknowledged_at', { withTimezone: true }),
		acknowledgedBy: text('acknowledged_by').references(() => users.id),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		index('notices_status_idx').on(t.status, t.createdAt),
		index('notices_lot_idx').on(t.lotId),
		index('notices_org_idx').on(t.organisationId, t.createdAt)
	]
);

/** A supplier's reply to a notice: a comment and optionally a document (e.g. corrective action). */
export const noticeResponses = pgTable(
	'notice_responses',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		noticeId: uuid('notice_id')
			.notNull()
			.references(() => notices.id, { onDelete: 'cascade' }),
		userId: text('user_id')
			.notNull()
			.references(() => users.id),
		comment: text('comment').notNull(),
		documentId: uuid('document_id').references(() => documents.id),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('notice_responses_notice_idx').on(t.noticeId)]
);
