/** An organisation's details as the administrator edits them (contacts have their own schema, supplier.ts). */
import { z } from 'zod';
import { text } from './fields';

export const organisationDetailsSchema = z.object({
	name: text().trim().min(2, 'Enter the company name').max(160, 'At most 160 characters'),
	country: text().trim().max(80, 'At most 80 characters').default(''),
	address: text({ multiline: true }).trim().max(500, 'At most 500 characters').default('')
});
export type OrganisationDetails = z.infer<typeof organisationDetailsSchema>;
