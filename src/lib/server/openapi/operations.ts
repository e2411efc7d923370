/**
 * Every /api/v1 operation, described once. Adding a route? Add its entry here (the same method and
 * path, the zod schemas its handler parses); tests/unit/openapi.test.ts fails for a route file
 * under src/routes/api/v1 whose methods have no entry, and for an entry without a route.
 */
import { z } from 'zod';
import { lotApiSchema, lotListQuerySchema } from '$lib/schemas/lot';
import { challengeRequestSchema, lotListExportQuery, noticesQuery, overrideRequestSchema } from '$lib/schemas/decision';
import { documentUploadSchema } from '$lib/schemas/document';
import { cellPotentialBody, curveQuery, evaluateHeader, fitBody, modelListQuery, saveModelBody } from '$lib/schemas/electrochem';
import { partListQuerySchema } from '$lib/schemas/part';
import { MAX_READINGS_PER_CALL, planQuerySchema, readingCorrectionSchema, readingSchema } from '$lib/schemas/readings';
import { traceQuerySchema } from '$lib/schemas/trace';
import { scorecardQuery } from '$lib/schemas/scorecard';
import { webhookCreateSchema, webhookPatchSchema } from '$lib/schemas/webhook';
import { deliveryShape, described, file, lotPageShape, lotShape, traceShape, webhookSecretShape, webhookShape } from './shapes';
import type { ApiOperation } from './types';

const PDF = 'application/pdf';
const XLSX = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';
const multipart = (fields: Record<string, unknown>, required: string[]) => ({
	contentType: 'multipart/form-data',
	schema: { type: 'object', properties: fields, required }
});

const lots: ApiOperation[] = [
	{
		method: 'get',
		path: '/lots',
		tag: 'Lots',
		summary: 'List lots, newest first (keyset pages)',
		description: 'Suppliers see only their own lots. `serial` keeps the lots holding a reading of that unit.',
		query: lotListQuerySchema,
		responses: { 200: { description: 'A page of lots', schema: lotPageShape } }
	},
	{
		method: 'post',
		path: '/lots',
		tag: 'Lots',
		summary: 'Register a lot (released at once: awaiting arrival)',
		body: { schema: lotApiSchema },
		responses: { 201: { description: 'The lot', schema: lotShape } }
	},
	{
		method: 'get',
		path: '/lots/{id}',
		tag: 'Lots',
		summary: 'One lot with its documents',
		responses: { 200: { description: 'The lot and its documents', schema: described('The lot fields (as in the list) and `documents`') } }
	},
	{
		method: 'get',
		path: '/lots.xlsx',
		tag: 'Reports',
		summary: 'The lot list as an XLSX workbook',
		query: lotListExportQuery,
		responses: { 200: { description: 'Workbook', contentType: XLSX, schema: file('XLSX') } }
	},
	{
		method: 'get',
		path: '/lots/{id}/readings',
		tag: 'Readings',
		summary: 'Every stored reading of a lot, oldest first',
		responses: { 200: { description: '{lot_id, count, readings}', schema: described('lot_id, count and the readings') } }
	},
	{
		method: 'post',
		path: '/lots/{id}/readings',
		tag: 'Readings',
		summary: `Record up to ${MAX_READINGS_PER_CALL} readings, all or nothing`,
		description:
			'The first reading records the arrival. Rows sent with a client_key are stored once. An OCV far outside the part window (× cells in series, with a margin) answers 422 implausible_reading for the whole batch, naming each row, unless the row carries confirmed: true.',
		body: { schema: z.object({ readings: z.array(readingSchema).min(1).max(MAX_READINGS_PER_CALL) }) },
		responses: {
			201: {
				description: '{inserted, duplicates, lot_status, arrived, stored}',
				schema: described('inserted, duplicates, lot_status, arrived, stored: [{client_key, id}]')
			}
		},
		errors: { 409: 'The lot is not open for readings', 413: 'Too many readings in one call' }
	},
	{
		method: 'patch',
		path: '/lots/{id}/readings/{readingId}',
		tag: 'Readings',
		summary: 'Correct a wrong value before the decision (with a reason)',
		description: 'An OCV far outside the part window answers 422 implausible_reading unless confirmed: true is sent.',
		body: { schema: readingCorrectionSchema },
		responses: { 200: { description: 'The corrected reading', schema: described('The reading after the correction') } },
		errors: { 409: 'The lot is decided already' }
	},
	{
		method: 'get',
		path: '/readings',
		tag: 'Readings',
		summary: 'Serial trace: every reading of a serial (or serial prefix) across the lots you may see',
		description:
			"Give `serial` (exact) or `serial_prefix`. Each reading comes with its lot, supplier, part, flags and the lot's latest decision. Suppliers see only their own lots.",
		query: traceQuerySchema,
		responses: { 200: { description: 'The matching readings', schema: traceShape } }
	},
	{
		method: 'post',
		path: '/lots/{id}/imports',
		tag: 'Readings',
		summary: 'Import a meter file (CSV or XLSX): preview, or commit with a column mapping; or a BMS readout of cell-group voltages',
		body: multipart(
			{
				file: { type: 'string', format: 'binary' },
				mapping: { type: 'string', description: 'JSON column mapping; without it the answer is a preview' },
				kind: {
					type: 'string',
					enum: ['cell_groups'],
					description:
						'cell_groups: the file is a BMS readout, a header row then `serial,group_1,…,group_N` in volts (N = cells in series); each row sets the cell-group voltages of that unit’s latest reading, all or nothing'
				}
			},
			['file']
		),
		responses: {
			200: {
				description:
					'A preview, the same file imported before, or (kind=cell_groups) {updated, readings: [{serial, reading_id, min_v, max_v}]}',
				schema: described('preview, already_imported_at or the cell groups set')
			},
			201: { description: 'Imported', schema: described('The import result') }
		},
		errors: { 413: 'The file is too large', 415: 'Not a CSV or XLSX file' }
	},
	{
		method: 'get',
		path: '/lots/{id}/evaluation',
		tag: 'Evaluation',
		summary: 'The current evaluation (SOC intervals, flags, proposed disposition)',
		description: 'Answers with ETag = the lot revision; If-None-Match gives 304.',
		responses: {
			200: {
				description: 'The evaluation',
				schema: described('Plan, statistics, units with SOC intervals and flags, reasons, proposed status')
			},
			304: { description: 'Unchanged since the given ETag' }
		}
	},
	{
		method: 'post',
		path: '/lots/{id}/submit',
		tag: 'Decisions',
		summary: 'Submit the complete sample: the engine decides',
		responses: {
			201: {
				description: 'The decision outcome',
				schema: described('lotId, previousStatus, status, evaluationId, decisionId, noticeId, evaluation')
			}
		},
		errors: { 409: 'The lot is not pending a decision' }
	},
	{
		method: 'post',
		path: '/lots/{id}/decision/challenge',
		tag: 'Decisions',
		summary: 'A single-use signing challenge for a quality decision (30 minutes)',
		body: { schema: challengeRequestSchema },
		responses: { 201: { description: 'The challenge', schema: described('challenge_id, lot revision, decision, expires_at') } },
		errors: { 409: 'The lot is not on hold' }
	},
	{
		method: 'post',
		path: '/lots/{id}/decision',
		tag: 'Decisions',
		summary: 'Record the material disposition of a lot in review (e-signed; interactive sessions only); only then is the supplier notified',
		description:
			'disposition: release, use_as_is (deviation), sort_rework (at the supplier’s cost), return_to_supplier or scrap; release and use_as_is accept the lot, the others reject it, and the challenge must be for that decision. due_date (YYYY-MM-DD) is required for every disposition but release. A lot with a safety finding allows only return_to_supplier or scrap (409 safety_disposition). API tokens get 403 session_required: an e-signature needs a person and their password.',
		body: { schema: overrideRequestSchema },
		responses: { 200: { description: 'The decision outcome', schema: described('lotId, previousStatus, status, decisionId, noticeId') } },
		errors: {
			409: 'The challenge was used or expired, or the lot changed since (lot_changed), or the disposition is not allowed after a safety finding',
			422: 'A disposition that does not fit the decision, or a due date missing, in the past or given for a release'
		}
	},
	{
		method: 'get',
		path: '/lots/{id}/decisions',
		tag: 'Decisions',
		summary: 'Evaluations, decisions, notices and replies of a lot',
		responses: { 200: { description: 'The decision history', schema: described('evaluations, decisions, notices, replies') } }
	},
	{
		method: 'get',
		path: '/lots/{id}/documents',
		tag: 'Documents',
		summary: "A lot's documents (metadata)",
		responses: { 200: { description: 'The documents', schema: described('documents: [{id, kind, file_name, size, …}]') } }
	},
	{
		method: 'post',
		path: '/lots/{id}/documents',
		tag: 'Documents',
		summary: 'Upload a document (CoC, UN 38.3 test summary, SDS, other)',
		body: multipart({ file: { type: 'string', format: 'binary' }, kind: z.toJSONSchema(documentUploadSchema.shape.kind) }, [
			'file',
			'kind'
		]),
		responses: { 201: { description: 'The stored document', schema: described('Document metadata') } },
		errors: { 409: 'The same file is stored already', 413: 'The file is too large', 415: 'The file type is not allowed' }
	},
	{
		method: 'get',
		path: '/lots/{id}/documents/{docId}',
		tag: 'Documents',
		summary: 'Download a document (as an attachment)',
		responses: { 200: { description: 'The file', contentType: 'application/octet-stream', schema: file('The stored file') } }
	},
	{
		method: 'get',
		path: '/lots/{id}/report.pdf',
		tag: 'Reports',
		summary: 'The inspection report (PDF)',
		responses: { 200: { description: 'PDF', contentType: PDF, schema: file('PDF') } }
	},
	{
		method: 'get',
		path: '/lots/{id}/quarantine-tag.pdf',
		tag: 'Reports',
		summary: 'A printable quarantine tag for a held or rejected lot',
		responses: { 200: { description: 'PDF', contentType: PDF, schema: file('PDF') } },
		errors: { 409: 'The lot is neither held nor rejected' }
	},
	{
		method: 'get',
		path: '/lots/{id}/readings.xlsx',
		tag: 'Reports',
		summary: 'The readings with their results as XLSX',
		responses: { 200: { description: 'Workbook', contentType: XLSX, schema: file('XLSX') } }
	}
];

const reference: ApiOperation[] = [
	{
		method: 'get',
		path: '/parts',
		tag: 'Parts and suppliers',
		summary: 'Parts with their limits and sampling settings',
		query: partListQuerySchema,
		responses: { 200: { description: 'Parts', schema: described('parts') } }
	},
	{
		method: 'get',
		path: '/suppliers',
		tag: 'Parts and suppliers',
		summary: 'Supplier organisations with their notice contacts',
		responses: { 200: { description: 'Suppliers', schema: described('suppliers') } }
	},
	{
		method: 'get',
		path: '/suppliers/{id}/scorecard',
		tag: 'Parts and suppliers',
		summary: 'Lots, acceptance, holds, rejects, ppm, severity and the monthly trend, over a period (all, 90d, 12m or custom from–to)',
		query: scorecardQuery,
		responses: { 200: { description: 'The scorecard', schema: described('Scorecard figures and the period counted') } }
	},
	{
		method: 'get',
		path: '/suppliers/{id}/scorecard.xlsx',
		tag: 'Reports',
		summary: 'The scorecard as an XLSX workbook (Summary, Months, Parts), over a period',
		query: scorecardQuery,
		responses: { 200: { description: 'Workbook', contentType: XLSX, schema: file('XLSX') } }
	},
	{
		method: 'get',
		path: '/suppliers/{id}/scorecard.pdf',
		tag: 'Reports',
		summary: 'The scorecard as an A4 PDF, over a period',
		query: scorecardQuery,
		responses: { 200: { description: 'PDF', contentType: PDF, schema: file('PDF') } }
	},
	{
		method: 'get',
		path: '/sampling/plan',
		tag: 'Sampling',
		summary: 'An ISO 2859-1:1999 single sampling plan (code letter, n, Ac, Re, edition)',
		query: planQuerySchema,
		responses: {
			200: {
				description: 'The plan of Tables 1 and 2-A/2-B/2-C, arrows followed; a bad parameter answers 400 naming it',
				schema: described('code_letter, plan_code_letter, sample_size, accept, reject, hundred_percent, edition ("ISO 2859-1:1999")')
			}
		}
	},
	{
		method: 'get',
		path: '/chemistries',
		tag: 'Electrochemistry',
		summary: 'The chemistry OCV models in the library',
		responses: { 200: { description: 'Chemistries', schema: { type: 'array', items: described('A chemistry and its model') } } }
	},
	{
		method: 'get',
		path: '/chemistries/{code}/curve',
		tag: 'Electrochemistry',
		summary: "A chemistry's OCV–SOC curve at a temperature",
		query: curveQuery,
		responses: { 200: { description: 'The curve', schema: described('points: [{soc, ocv_v}]') } }
	},
	{
		method: 'post',
		path: '/electrochem/cell-potential',
		tag: 'Electrochemistry',
		summary: 'Nernst equation: E = E° − (RT/nF) ln Q',
		body: { schema: cellPotentialBody },
		responses: { 200: { description: 'The potential with its terms', schema: described('e_v and the terms used (CODATA constants)') } }
	},
	{
		method: 'post',
		path: '/ocv/evaluate',
		tag: 'Electrochemistry',
		summary: 'SOC with an interval for many OCV readings of one chemistry',
		body: {
			schema: evaluateHeader.extend({ readings: z.array(z.object({ ocv_v: z.number().min(0), temperature_c: z.number() })).min(1) })
		},
		responses: {
			200: { description: 'One result per reading', schema: described('results: SOC interval, expected OCV, residual, flags') }
		},
		errors: { 413: 'Too many readings in one call' }
	},
	{
		method: 'post',
		path: '/ocv/fit',
		tag: 'Electrochemistry',
		summary: 'Fit a model to a measured OCV–SOC curve (nothing is stored)',
		body: { schema: fitBody },
		responses: { 200: { description: 'The fitted parameters and their errors', schema: described('parameters, residuals, sigma') } }
	},
	{
		method: 'get',
		path: '/models',
		tag: 'Electrochemistry',
		summary: 'Stored OCV model versions',
		query: modelListQuery,
		responses: { 200: { description: 'Model versions', schema: described('models') } }
	},
	{
		method: 'post',
		path: '/models',
		tag: 'Electrochemistry',
		summary: 'Fit and store a model version (awaiting approval)',
		body: { schema: saveModelBody },
		responses: { 201: { description: 'The stored version', schema: described('The model version') } }
	},
	{
		method: 'get',
		path: '/models/{id}',
		tag: 'Electrochemistry',
		summary: 'One model version',
		responses: { 200: { description: 'The version', schema: described('The model version') } }
	},
	{
		method: 'post',
		path: '/models/{id}/approve',
		tag: 'Electrochemistry',
		summary: 'Approve a model version (quality; not your own fit)',
		responses: { 200: { description: 'The approved version', schema: described('The model version') } },
		errors: { 409: 'Approved already, or your own fit' }
	}
];

const people: ApiOperation[] = [
	{
		method: 'get',
		path: '/notices',
		tag: 'Notices',
		summary: 'Notices to suppliers (a supplier sees only its own)',
		query: noticesQuery,
		responses: { 200: { description: 'Notices', schema: described('notices') } }
	},
	{
		method: 'post',
		path: '/notices/{id}/acknowledge',
		tag: 'Notices',
		summary: 'The supplier confirms it read the notice (idempotent)',
		responses: {
			200: { description: 'When it was acknowledged', schema: z.object({ id: z.uuid(), acknowledgedAt: z.string(), already: z.boolean() }) }
		}
	},
	{
		method: 'get',
		path: '/me',
		tag: 'System',
		summary: 'Who the token or session acts as',
		responses: { 200: { description: 'The person', schema: described('id, email, name, role, organisation_id, auth_method') } }
	},
	{
		method: 'get',
		path: '/health',
		tag: 'System',
		summary: 'Liveness and database reachability',
		public: true,
		responses: { 200: { description: 'Up', schema: z.object({ status: z.literal('ok'), db: z.literal('ok') }) } }
	},
	{
		method: 'get',
		path: '/openapi.json',
		tag: 'System',
		summary: 'This document',
		public: true,
		responses: { 200: { description: 'OpenAPI 3.1', schema: described('OpenAPI 3.1 document') } }
	}
];

const webhooks: ApiOperation[] = [
	{
		method: 'get',
		path: '/webhooks',
		tag: 'Webhooks',
		summary: 'Registered endpoints (never their secrets)',
		responses: { 200: { description: 'Endpoints', schema: z.object({ webhooks: z.array(webhookShape) }) } }
	},
	{
		method: 'post',
		path: '/webhooks',
		tag: 'Webhooks',
		summary: 'Register an endpoint; the signing secret is in this answer only',
		description:
			'Deliveries are JSON POSTs `{id, event, occurred_at, data}` with `x-restvolt-event` and `x-restvolt-signature: sha256=<hex HMAC-SHA256 of the raw body with the secret>`. `corrective_action.updated` can be subscribed to; nothing sends it yet. In production, internal addresses are refused.',
		body: { schema: webhookCreateSchema },
		responses: { 201: { description: 'The endpoint and its secret', schema: webhookSecretShape } }
	},
	{
		method: 'get',
		path: '/webhooks/{id}',
		tag: 'Webhooks',
		summary: 'One endpoint',
		responses: { 200: { description: 'The endpoint', schema: webhookShape } }
	},
	{
		method: 'patch',
		path: '/webhooks/{id}',
		tag: 'Webhooks',
		summary: 'Pause or resume (a paused endpoint gets no new events)',
		body: { schema: webhookPatchSchema },
		responses: { 200: { description: 'The endpoint', schema: webhookShape } }
	},
	{
		method: 'delete',
		path: '/webhooks/{id}',
		tag: 'Webhooks',
		summary: 'Delete an endpoint and its delivery log',
		responses: { 204: { description: 'Deleted' } }
	},
	{
		method: 'post',
		path: '/webhooks/{id}/rotate-secret',
		tag: 'Webhooks',
		summary: 'A new signing secret (shown once); the old one stops at once',
		responses: { 200: { description: 'The new secret', schema: z.object({ id: z.uuid(), secret: z.string() }) } }
	},
	{
		method: 'get',
		path: '/webhooks/{id}/deliveries',
		tag: 'Webhooks',
		summary: 'The latest 100 deliveries with response codes',
		responses: { 200: { description: 'Deliveries', schema: z.object({ deliveries: z.array(deliveryShape) }) } }
	},
	{
		method: 'post',
		path: '/webhooks/{id}/deliveries/{deliveryId}/resend',
		tag: 'Webhooks',
		summary: 'Send a delivery again (same body, same event id)',
		responses: { 202: { description: 'Queued', schema: z.object({ id: z.uuid(), status: z.literal('pending') }) } }
	}
];

export const API_OPERATIONS: readonly ApiOperation[] = [...lots, ...reference, ...people, ...webhooks];
