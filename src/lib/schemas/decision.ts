/** Quality override (release or reject a held lot), e-signed by re-entering the password. */
import { z } from 'zod';

export const overrideSchema = z.object({
	decision: z.enum(['accept', 'reject']),
	reason: z.string().trim().min(5, 'Give a reason (at least 5 characters)').max(2000),
	password: z.string().min(1, 'Re-enter your password to sign')
});
export type OverrideForm = z.infer<typeof overrideSchema>;

/** Supplier reply to a notice (the document travels as a multipart file beside it). */
export const replySchema = z.object({
	comment: z.string().trim().min(2, 'Write a comment').max(5000)
});

export const noticesQuery = z.object({ lot_id: z.uuid().optional() });

export const lotListExportQuery = z.object({
	status: z.enum(['draft', 'awaiting_arrival', 'in_inspection', 'pending_decision', 'accepted', 'on_hold', 'rejected', 'cancelled']).optional(),
	supplier_id: z.uuid().optional()
});
