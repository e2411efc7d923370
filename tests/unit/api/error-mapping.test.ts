// Domain errors (src/lib/server/errors.ts) are mapped once for the API (http.ts errorResponse and
// api()) and once for form actions and page loads (action-errors.ts). Each kind gives the status
// and the machine code clients saw before the taxonomy existed.
import { isHttpError, type RequestEvent } from '@sveltejs/kit';
import { superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { orErrorPage, pageError, refusalOf, refuseForm } from '../../../src/lib/server/action-errors';
import { actionStatusOf, statusOf } from '../../../src/lib/server/error-status';
import {
	Conflict,
	DomainError,
	Forbidden,
	Invalid,
	invalidFields,
	Malformed,
	NotFound,
	Throttled,
	TooLarge,
	Unauthenticated,
	type ErrorKind
} from '../../../src/lib/server/errors';
import { api, databaseUnavailable, errorResponse } from '../../../src/lib/server/http';
import { acceptUpload, DuplicateDocument } from '../../../src/lib/server/services/uploads';

const CASES: Array<[DomainError, number, string]> = [
	[new Malformed('The request body is not valid JSON'), 400, 'bad_request'],
	[new Invalid('Some readings are not valid', [{ path: 'readings.0.ocv_v', message: 'too high' }]), 422, 'unprocessable'],
	[new Invalid('The sample is not complete', undefined, 'sample_incomplete'), 422, 'sample_incomplete'],
	[new Unauthenticated('Sign in'), 401, 'unauthenticated'],
	[new Forbidden('Your role may not do this'), 403, 'forbidden'],
	[new Forbidden('Sign in interactively', 'session_required'), 403, 'session_required'],
	[new NotFound('lot'), 404, 'not_found'],
	[new Conflict('The lot is accepted'), 409, 'conflict'],
	[new DuplicateDocument({ id: 'd1', fileName: 'coc.pdf' }), 409, 'duplicate_document'],
	[new TooLarge('At most 10000 readings', 'too_many_readings'), 413, 'too_many_readings'],
	[new Throttled('Too many wrong passwords'), 429, 'throttled'],
	[databaseUnavailable(), 503, 'database_unavailable']
];

const KINDS: Record<ErrorKind, number> = {
	malformed: 400,
	invalid: 422,
	unauthenticated: 401,
	forbidden: 403,
	not_found: 404,
	conflict: 409,
	too_large: 413,
	unsupported_type: 415,
	throttled: 429,
	unavailable: 503
};

const event = (method = 'GET') =>
	({ request: new Request('http://app.test/api/v1/x', { method }), url: new URL('http://app.test/api/v1/x') }) as RequestEvent;

describe('statusOf', () => {
	it.each(Object.entries(KINDS))('%s → %i', (kind, status) => {
		expect(statusOf(kind as ErrorKind)).toBe(status);
	});

	it('answers refused form fields with 400 and every other kind as the API does', () => {
		expect(actionStatusOf('invalid')).toBe(400);
		for (const kind of Object.keys(KINDS) as ErrorKind[]) if (kind !== 'invalid') expect(actionStatusOf(kind)).toBe(KINDS[kind]);
	});
});

describe('the API mapping', () => {
	it.each(CASES.map(([e, status, code]) => [code, e, status] as const))('%s → its status and error shape', async (code, e, status) => {
		const response = errorResponse(e);
		expect(response.status).toBe(status);
		const body = await response.json();
		expect(body).toEqual({ error: { code, message: e.message, ...(e.issues ? { issues: e.issues } : {}) } });
		expect(response.headers.get('retry-after')).toBe(status === 503 ? '2' : null);
	});

	it('api() answers a thrown domain error in the error shape', async () => {
		const handler = api(async () => {
			throw new NotFound('lot');
		});
		const response = await handler(event('POST'));
		expect(response.status).toBe(404);
		expect(await response.json()).toEqual({ error: { code: 'not_found', message: 'lot not found' } });
	});

	it('api() hides anything else behind a plain 500', async () => {
		const handler = api(async () => {
			throw new Error('secret internals');
		});
		const original = console.error;
		console.error = () => {};
		try {
			const response = await handler(event('POST'));
			expect(response.status).toBe(500);
			const text = await response.text();
			expect(JSON.parse(text).error.code).toBe('internal');
			expect(text).not.toContain('secret');
		} finally {
			console.error = original;
		}
	});

	it('upload refusals keep their statuses and name the field', () => {
		const file = (name: string, declaredType: string, bytes: Uint8Array) => ({ name, declaredType, bytes });
		let refused: unknown;
		try {
			acceptUpload('lot_document', file('notes.exe', 'application/octet-stream', new Uint8Array([0x4d, 0x5a, 1, 2, 3, 4])));
		} catch (e) {
			refused = e;
		}
		expect(refused).toBeInstanceOf(DomainError);
		const e = refused as DomainError;
		expect(statusOf(e.kind)).toBe(415);
		expect(e.issues?.[0]?.path).toBe('file');
	});
});

describe('the action and page mapping', () => {
	it('gives a refusal with the action status, the message and the first field', () => {
		expect(refusalOf(new Conflict('The lot moved on'))).toEqual({
			status: 409,
			code: 'conflict',
			message: 'The lot moved on',
			issues: [],
			field: null
		});
		const refusal = refusalOf(invalidFields([{ path: 'part_number', message: 'taken' }]));
		expect(refusal).toMatchObject({ status: 400, code: 'unprocessable', field: 'part_number' });
	});

	it('throws on what is not a domain error', () => {
		const bug = new TypeError('x is undefined');
		expect(() => refusalOf(bug)).toThrow(bug);
		expect(() => pageError(bug)).toThrow(bug);
	});

	it('puts field issues on a superform and other refusals in its message', async () => {
		const schema = z.object({ part_number: z.string(), name: z.string() });
		const form = await superValidate({ part_number: 'P-1', name: 'Cell' }, zod4(schema));
		expect(refuseForm(form, invalidFields([{ path: 'part_number', message: 'This supplier already has a part with this number' }]))).toBe(
			400
		);
		expect(form.errors.part_number).toEqual(['This supplier already has a part with this number']);
		expect(form.valid).toBe(false);

		const other = await superValidate({ part_number: 'P-1', name: 'Cell' }, zod4(schema));
		expect(refuseForm(other, new Conflict('Inspection of this part is normal'))).toBe(409);
		expect(other.message).toBe('Inspection of this part is normal');
	});

	it.each(CASES.map(([e, status]) => [e.code, e, status] as const))(
		'a load that throws %s shows the error page with its status',
		async (_code, e, status) => {
			const thrown = await orErrorPage(Promise.reject(e)).catch((x: unknown) => x);
			expect(isHttpError(thrown)).toBe(true);
			expect(isHttpError(thrown) && thrown.status).toBe(status);
			expect(isHttpError(thrown) && thrown.body).toEqual({ message: e.message, code: e.code });
		}
	);
});
