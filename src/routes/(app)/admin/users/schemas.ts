import { z } from 'zod';
import { ROLES } from '$lib/roles';
import { text } from '$lib/schemas/fields';

export const roleSchema = z.enum(ROLES as ['buyer', 'inspector', 'quality', 'supplier', 'admin']);

export const invite = z.object({
	email: z.email('Enter an e-mail address').max(320),
	name: text().trim().min(1, 'Enter a name').max(120),
	role: roleSchema,
	organisationId: z.uuid('Choose an organisation')
});

export const changeRole = z.object({ userId: text().min(1), role: roleSchema });
export const setActive = z.object({ userId: text().min(1), active: z.enum(['true', 'false']) });
export const removeSecondFactor = z.object({ userId: text().min(1) });
