/**
 * Response shapes for the document. Request shapes come from $lib/schemas (what the handlers
 * parse); answers are built by the services as plain objects, so their shapes are written here,
 * field by field, beside the service that builds them (named in each comment).
 */
import { z } from 'zod';
import { LAST_DIRECTIONS, LOT_STATUSES, TRANSPORTS } from '$lib/schemas/lot';
import { WEBHOOK_EVENTS } from '$lib/schemas/webhook';
import type { JsonSchema } from './types';

/** `{"error":{"code","message","issues"?}}` (server/http.ts). */
export const errorShape = z.object({
	error: z.object({
		code: z.string().describe('Machine-readable, e.g. unprocessable, not_found, token_scope'),
		message: z.string().describe('For people, in plain words'),
		issues: z
			.array(z.object({ path: z.string().describe('The field, dotted for nested ones (readings.3.ocv_v)'), message: z.string() }))
			.optional()
	})
});

const instant = z.iso.datetime({ offset: true });

/** services/lots.ts lotJson. */
export const lotShape = z.object({
	id: z.uuid(),
	lot_code: z.string().describe('e.g. L-2026-00042'),
	po_number: z.string(),
	supplier_id: z.uuid(),
	supplier_name: z.string().optional(),
	part_id: z.uuid(),
	part_number: z.string().optional(),
	chemistry: z.string().optional(),
	quantity: z.number().int(),
	declared_soc: z.number().describe('Declared state of charge at shipment, a fraction 0–1'),
	transport: z.enum(TRANSPORTS),
	last_direction: z
		.enum(LAST_DIRECTIONS)
		.describe('How the cells were last moved before shipping: picks the OCV hysteresis branch (LFP); unknown covers both'),
	un_number: z.string().nullable(),
	expected_arrival: z.string().nullable().describe('YYYY-MM-DD'),
	received_at: instant.nullable(),
	status: z.enum(LOT_STATUSES),
	severity: z.enum(['normal', 'tightened', 'reduced']).describe('ISO 2859-1 inspection severity'),
	created_at: instant.nullable(),
	updated_at: instant.nullable(),
	decided_at: instant.nullable()
});

export const lotPageShape = z.object({ lots: z.array(lotShape), next_cursor: z.string().nullable() });

/** services/webhooks.ts endpointJson. */
export const webhookShape = z.object({
	id: z.uuid(),
	url: z.string(),
	events: z.array(z.enum(WEBHOOK_EVENTS)),
	paused: z.boolean(),
	created_at: instant,
	secret_rotated_at: instant.nullable()
});

export const webhookSecretShape = z.object({
	id: z.uuid(),
	secret: z.string().describe('The signing secret, shown this once: keep it in the receiver'),
	...webhookShape.omit({ id: true }).partial().shape
});

/** services/webhooks.ts listDeliveries. */
export const deliveryShape = z.object({
	id: z.uuid(),
	endpoint_id: z.uuid(),
	event_id: z.uuid().describe('The `id` in the body, the same for every endpoint that got this event'),
	event: z.enum(WEBHOOK_EVENTS),
	status: z.enum(['pending', 'delivered', 'failed', 'refused']),
	attempts: z.number().int(),
	response_status: z.number().int().nullable().describe("The receiver's last HTTP status, null when it never answered"),
	last_error: z.string().nullable(),
	created_at: instant,
	delivered_at: instant.nullable(),
	next_attempt_at: instant.nullable()
});

/** services/serial-trace.ts TracedReading. */
export const traceShape = z.object({
	truncated: z.boolean().describe('More readings matched than `limit`'),
	readings: z.array(
		z.object({
			reading_id: z.number().int(),
			serial: z.string(),
			ocv_v: z.number().describe('V, as measured (pack voltage for packs)'),
			temperature_c: z.number().describe('°C'),
			ac_resistance_mohm: z.number().nullable().describe('mΩ'),
			measured_at: instant,
			source: z.string(),
			lot_id: z.uuid(),
			lot_code: z.string(),
			lot_status: z.enum(LOT_STATUSES),
			supplier_id: z.uuid(),
			supplier_name: z.string(),
			part_id: z.uuid(),
			part_number: z.string(),
			flags: z
				.array(z.string())
				.nullable()
				.describe("The unit's flags in the evaluation behind the lot's latest decision; null while undecided"),
			decision: z
				.object({
					kind: z.enum(['automatic', 'override']),
					to_status: z.enum(LOT_STATUSES),
					decided_at: instant,
					decided_by: z.string().nullable()
				})
				.nullable()
		})
	)
});

/** A plain JSON object whose fields are described in words (evaluations, scorecards, fits). */
export const described = (description: string): JsonSchema => ({ type: 'object', description, additionalProperties: true });
export const file = (description: string): JsonSchema => ({ type: 'string', format: 'binary', description });
