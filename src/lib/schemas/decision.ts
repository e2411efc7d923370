/** Quality override (release or reject a held lot), e-signed by re-entering the password. */
import { z } from 'zod';
import { text } from './fields';

/** Longest override reason, in characters (it goes into the audit trail and the supplier notice). */
export const OVERRIDE_REASON_MAX = 2000;

export const overrideSchema = z.object({
	decision: z.enum(['accept', 'reject']),
	reason: text({ multiline: true })
		.trim()
		.min(5, 'Give a reason (at least 5 characters)')
		.max(OVERRIDE_REASON_MAX, `The reason is limited to 2,000 characters; shorten it (nothing is cut)`),
	password: z.string().min(1, 'Re-enter your password to sign')
});
export type OverrideForm = z.infer<typeof overrideSchema>;

/** POST …/decision/challenge: which decision the quality manager is about to sign. */
export const challengeRequestSchema = z.object({ decision: z.enum(['accept', 'reject']) });

/** POST …/decision: the signed override names the single-use challenge it was issued (…/decision/challenge). */
export const overrideRequestSchema = overrideSchema.extend({
	challenge_id: z.uuid('Ask for a signing challenge first (POST /api/v1/lots/{id}/decision/challenge) and send its challenge_id')
});

/** Supplier reply to a notice (the document travels as a multipart file beside it). */
export const replySchema = z.object({
	comment: text({ multiline: true }).trim().min(2, 'Write a comment').max(5000)
});

export const noticesQuery = z.object({ lot_id: z.uuid().optional() });

export const lotListExportQuery = z.object({
	status: z
		.enum(['draft', 'awaiting_arrival', 'in_inspection', 'pending_decision', 'accepted', 'on_hold', 'rejected', 'cancelled'])
		.optional(),
	supplier_id: z.uuid().optional()
});
