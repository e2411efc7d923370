/** Supplier contacts: the people who receive disposition notices. */
import { z } from 'zod';
import { text } from './fields';

export const contactSchema = z.object({
	contact_id: z.union([z.literal(''), z.uuid()]).default(''),
	name: text().trim().min(1, 'Enter the contact’s name').max(120, 'At most 120 characters'),
	email: z.email({ error: 'Enter an e-mail address like name@company.example' }),
	receives_notices: z.boolean().default(true)
});
export type ContactForm = z.infer<typeof contactSchema>;
