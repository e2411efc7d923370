/** Webhook registration and the events an integration may subscribe to (API, admin page, OpenAPI). */
import { z } from 'zod';
import { text } from './fields';

/**
 * The events Restvolt sends. `corrective_action.updated` can be subscribed to already; nothing
 * produces it yet (corrective actions are not tracked in Restvolt so far).
 */
export const WEBHOOK_EVENTS = ['lot.registered', 'lot.arrived', 'lot.decided', 'notice.acknowledged', 'corrective_action.updated'] as const;
export type WebhookEvent = (typeof WEBHOOK_EVENTS)[number];

export const webhookUrl = text()
	.trim()
	.max(2000, 'url is at most 2000 characters')
	.refine((v) => URL.canParse(v) && ['http:', 'https:'].includes(new URL(v).protocol), 'url must be an http:// or https:// address')
	.refine(
		(v) => !URL.canParse(v) || (new URL(v).username === '' && new URL(v).password === ''),
		'url must not carry a user name or password'
	);

const events = z
	.array(z.enum(WEBHOOK_EVENTS, { error: `each event is one of ${WEBHOOK_EVENTS.join(', ')}` }))
	.min(1, 'choose at least one event')
	.max(WEBHOOK_EVENTS.length);

/** POST /api/v1/webhooks */
export const webhookCreateSchema = z.object({ url: webhookUrl, events });

/** PATCH /api/v1/webhooks/{id}: pause or resume. */
export const webhookPatchSchema = z.object({ paused: z.boolean({ error: 'paused must be true or false' }) });

/** The admin page's form: the events arrive as checkboxes. */
export const webhookFormSchema = z.object({ url: webhookUrl, events: z.array(z.enum(WEBHOOK_EVENTS)).min(1, 'Choose at least one event') });
