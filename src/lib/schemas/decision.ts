/** Quality's material disposition of a lot in review, e-signed by re-entering the password. */
import { z } from 'zod';
import { text } from './fields';
import { MATERIAL_DISPOSITIONS } from './disposition';

/** Longest override reason, in characters (it goes into the audit trail and the supplier notice). */
export const OVERRIDE_REASON_MAX = 2000;

/**
 * Nullable in shape so the review form starts with nothing chosen (a required enum would default
 * to its first value), then required by the refinement: every disposition is a deliberate choice.
 */
const dispositionField = z
	.enum(MATERIAL_DISPOSITIONS, 'Choose a disposition')
	.nullable()
	.refine((d) => d !== null, 'Choose a disposition');
/** YYYY-MM-DD; whether it is needed depends on the disposition (checked by the decision service). */
const dueDateField = z
	.string()
	.trim()
	.regex(/^(\d{4}-\d{2}-\d{2})?$/, 'Give the date as YYYY-MM-DD')
	.optional();

/** The review form: the disposition decides release or reject; nothing is pre-selected. */
export const overrideSchema = z.object({
	disposition: dispositionField,
	due_date: dueDateField,
	reason: text({ multiline: true })
		.trim()
		.min(5, 'Give a reason (at least 5 characters)')
		.max(OVERRIDE_REASON_MAX, `The reason is limited to 2,000 characters; shorten it (nothing is cut)`),
	password: z.string().min(1, 'Re-enter your password to sign')
});
export type OverrideForm = z.infer<typeof overrideSchema>;

/** POST …/decision/challenge: which decision the quality manager is about to sign. */
export const challengeRequestSchema = z.object({ decision: z.enum(['accept', 'reject']) });

/**
 * POST …/decision: the signed disposition names the single-use challenge it was issued
 * (…/decision/challenge). `decision` (accept/reject) is the challenge's; when sent it must fit the
 * disposition (release and use as is accept, the others reject).
 */
export const overrideRequestSchema = overrideSchema.extend({
	decision: z.enum(['accept', 'reject']).optional(),
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
