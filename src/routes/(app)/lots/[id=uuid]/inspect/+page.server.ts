import { error, fail } from '@sveltejs/kit';
import { readingCorrectionSchema } from '$lib/schemas/readings';
import { strictNumberFromText, wholeNumberParam } from '$lib/schemas/fields';
import { refusalOf } from '$lib/server/action-errors';
import { getDb } from '$lib/server/db';
import { can } from '$lib/server/policy';
import type { ServedEvaluation } from '$lib/server/services/evaluation-body';
import { evaluationBody } from '$lib/server/services/evaluation-cache';
import { getLotForUser } from '$lib/server/services/lots';
import { correctReading, listReadings } from '$lib/server/services/readings';
import type { Actions, PageServerLoad } from './$types';
import { correctionMessages } from './entry-messages';

/** Readings shown on the page; older ones stay in the lot's readings list and export. */
const SHOWN = 300;

export const load: PageServerLoad = async ({ locals, params, depends }) => {
	depends('restvolt:bench');
	const user = locals.user!;
	if (!can(user, 'lot:read')) error(403, 'Your role may not see lots');
	const db = getDb();
	const lot = await getLotForUser(db, user, params.id);
	if (!lot) error(404, 'No such lot');
	// The served evaluation from the cache at the lot's revision (computed and cached only when it is
	// stale): part, plan and limits come from it, so a visit computes at most one evaluation.
	const [body, readings] = await Promise.all([evaluationBody(db, lot.id), listReadings(db, lot.id)]);
	if (body === null) error(404, 'No such lot');
	const evaluation = JSON.parse(body) as ServedEvaluation;
	const { inputs } = evaluation;
	return {
		lot: {
			id: lot.id,
			lotCode: lot.lotCode,
			poNumber: lot.poNumber,
			status: lot.status,
			quantity: lot.quantity,
			declaredSoc: lot.declaredSoc,
			transport: lot.transport,
			supplierName: lot.supplierName
		},
		part: inputs.part,
		model: inputs.model,
		limits: inputs.limits,
		// The SOC limit the lot's DG rule binds (the evaluation's own rule), for the per-row air check.
		dgSocLimit: evaluation.dg?.soc_limit ?? null,
		plan: evaluation.plan,
		severity: evaluation.severity,
		evaluation,
		// Every reading: the browser evaluates the lot with them as the server does; the grid shows the latest SHOWN.
		readings,
		shown: SHOWN,
		canRecord: can(user, 'reading:write', { supplierId: lot.supplierId }),
		canSubmit: can(user, 'lot:submit', { supplierId: lot.supplierId })
	};
};

/**
 * A form number: blank is "not given", a decimal comma is accepted (bench keyboards); anything else
 * not written plainly (`1e3`, `0x10`, `3.6V`) is not a number, which the schema refuses for that field.
 */
function formNumber(value: FormDataEntryValue | null): number | undefined {
	const text = typeof value === 'string' ? value.trim() : '';
	return text === '' ? undefined : (strictNumberFromText(text.replace(',', '.')) ?? Number.NaN);
}

export const actions: Actions = {
	/** Correct a wrongly typed stored reading, with a reason for the audit trail (as PATCH …/readings/{id}). */
	correct: async ({ locals, params, request }) => {
		const user = locals.user!;
		const db = getDb();
		const lot = await getLotForUser(db, user, params.id);
		if (!lot) error(404, 'No such lot');
		if (!can(user, 'reading:write', { supplierId: lot.supplierId })) error(403, 'Your role may not correct readings');
		const form = await request.formData();
		const readingId = wholeNumberParam(String(form.get('readingId') ?? ''));
		if (readingId === null) return fail(400, { readingId: null, errors: {}, message: 'No reading chosen.' });
		const parsed = readingCorrectionSchema.safeParse({
			ocv_v: formNumber(form.get('ocv_v')),
			temperature_c: formNumber(form.get('temperature_c')),
			reason: form.get('reason') ?? ''
		});
		if (!parsed.success) {
			const issues = Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0] ?? 'form'), i.message]));
			const errors = correctionMessages(issues, {
				ocv_v: String(form.get('ocv_v') ?? ''),
				temperature_c: String(form.get('temperature_c') ?? '')
			});
			return fail(400, { readingId, errors, message: errors.form ?? 'Check the marked fields.' });
		}
		try {
			await correctReading(db, user, lot.id, readingId, parsed.data);
		} catch (e) {
			const refusal = refusalOf(e);
			return fail(refusal.status, { readingId, errors: {}, message: refusal.message });
		}
		return { corrected: readingId };
	}
};
