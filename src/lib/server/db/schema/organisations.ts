import { boolean, index, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { organisationKindEnum } from './enums';

/** The receiving company (kind 'own') and its suppliers. */
export const organisations = pgTable('organisations', {
	id: uuid('id').primaryKey().defaultRandom(),
	name: text('name').notNull().unique(),
	kind: organisationKindEnum('kind').notNull(),
	country: text('country'),
	/** Postal address as people write it, lines separated by newlines. */
	address: text('address'),
	createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
});

/** People at a supplier who receive disposition notices (they need not have a sign-in). */
export const supplierContacts = pgTable(
	'supplier_contacts',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		organisationId: uuid('organisation_id')
			.notNull()
			.references(() => organisations.id, { onDelete: 'cascade' }),
		name: text('name').notNull(),
		email: text('email').notNull(),
		receivesNotices: boolean('receives_notices').notNull().default(true),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('supplier_contacts_org_idx').on(t.organisationId)]
);
