import { error, fail } from '@sveltejs/kit';
import { refusalOf } from '$lib/server/action-errors';
import { can } from '$lib/server/policy';
import { getDb } from '$lib/server/db';
import { CANCEL_REASON_MAX, tooLongMessage } from '$lib/text/length-limit';
import { BEFORE_INSPECTION, cancelLot, getLotForUser, lotTimeline, markAwaitingArrival } from '$lib/server/services/lots';
import { listDocuments, missingDocuments } from '$lib/server/services/documents';
import { uploadDocument } from '$lib/server/services/uploads';
import { getPart } from '$lib/server/services/parts';
import { currentSeverity } from '$lib/server/services/switching';
import { documentKindSchema } from '$lib/schemas/document';
import { hasControlCharacters } from '$lib/schemas/fields';
import { evaluationBody } from '$lib/server/services/evaluation-cache';
import { decisionTrail } from '$lib/server/services/decision-history';
import { samplingView } from './sampling';
import type { EvaluationView } from './evaluation-view';
import type { Actions, PageServerLoad } from './$types';

async function lotPanels(db: ReturnType<typeof getDb>, user: App.Locals['user'] & object, lot: { id: string; status: string }) {
	const [body, trail] = await Promise.all([evaluationBody(db, lot.id), decisionTrail(db, user, lot)]);
	return { evaluation: body ? (JSON.parse(body) as EvaluationView) : null, trail };
}

/** What `invalidate` names to read the evaluation and the paper trail again (after a submit or a recompute). */
const LOT_PANELS = 'restvolt:lot-panels';

export const load: PageServerLoad = async ({ locals, params, url, depends }) => {
	depends(LOT_PANELS);
	const user = locals.user!;
	if (!can(user, 'lot:read')) error(403, 'Your role may not read lots');
	const db = getDb();
	const lot = await getLotForUser(db, user, params.id);
	if (!lot) error(404, 'No such lot');
	const part = await getPart(db, lot.partId);
	if (!part) error(404, 'The lot’s part no longer exists');
	const [documents, history] = await Promise.all([listDocuments(db, lot.id), lotTimeline(db, lot.id)]);
	// Before the bench the severity is the supplier × part's current one; afterwards the one the lot was inspected under.
	const severity = BEFORE_INSPECTION.includes(lot.status)
		? (await currentSeverity(db, lot.supplierId, lot.partId)).severity
		: (lot.severity ?? 'normal');
	const onBenchOrLater = !['draft', 'awaiting_arrival', 'cancelled'].includes(lot.status);
	return {
		// Read with the page (not streamed: the page's CSP is hash-based, and kit streams through inline
		// scripts it cannot hash ahead). The evaluation comes from the cache at the lot's revision.
		panels: onBenchOrLater ? await lotPanels(db, user, lot) : null,
		lot: {
			...lot,
			createdAt: lot.createdAt.toISOString(),
			updatedAt: lot.updatedAt.toISOString(),
			receivedAt: lot.receivedAt?.toISOString() ?? null,
			decidedAt: lot.decidedAt?.toISOString() ?? null
		},
		part: {
			id: part.id,
			partNumber: part.partNumber,
			description: part.description,
			chemistry: part.chemistry,
			cellsInSeries: part.cellsInSeries,
			cellsInParallel: part.cellsInParallel,
			nominalCapacityAh: part.nominalCapacityAh,
			aql: part.aql,
			inspectionLevel: part.inspectionLevel,
			modelVersion: part.modelVersion
		},
		documents: documents.map((d) => ({ ...d, uploadedAt: d.uploadedAt.toISOString() })),
		missing: missingDocuments(part.requiredDocuments, documents),
		sampling: samplingView(lot.quantity, part.aql, part.inspectionLevel, severity),
		history: history.map((h) => ({ ...h, at: h.at.toISOString() })),
		justRegistered: url.searchParams.has('registered'),
		justEdited: url.searchParams.has('edited'),
		may: {
			release: can(user, 'lot:edit') && lot.status === 'draft',
			edit: can(user, 'lot:edit') && BEFORE_INSPECTION.includes(lot.status),
			cancel: can(user, 'lot:cancel') && BEFORE_INSPECTION.includes(lot.status),
			upload: can(user, 'document:upload') && lot.status !== 'cancelled',
			inspect: can(user, 'reading:write') && (lot.status === 'awaiting_arrival' || lot.status === 'in_inspection')
		}
	};
};

async function lotOr404(locals: App.Locals, id: string) {
	const lot = await getLotForUser(getDb(), locals.user!, id);
	if (!lot) error(404, 'No such lot');
	return lot;
}

/** A step the service refused (the lot moved on, a file not accepted…), as this page shows it. */
function refused(action: string, e: unknown) {
	const refusal = refusalOf(e);
	return fail(refusal.status, { action, ok: false, message: refusal.message });
}

export const actions: Actions = {
	release: async ({ locals, params }) => {
		if (!can(locals.user, 'lot:edit')) error(403, 'Only buyers release lots');
		await lotOr404(locals, params.id);
		try {
			await markAwaitingArrival(getDb(), locals.user!, params.id);
		} catch (e) {
			return refused('release', e);
		}
		return { action: 'release', ok: true, message: 'Released: receiving now expects this lot.' };
	},
	cancel: async ({ locals, params, request }) => {
		if (!can(locals.user, 'lot:cancel')) error(403, 'Only buyers cancel lots');
		await lotOr404(locals, params.id);
		const reason = String((await request.formData()).get('reason') ?? '').trim();
		if (reason.length > CANCEL_REASON_MAX) {
			return fail(400, { action: 'cancel', ok: false, message: tooLongMessage('The reason', reason.length, CANCEL_REASON_MAX) });
		}
		if (hasControlCharacters(reason, { multiline: true })) {
			return fail(400, { action: 'cancel', ok: false, message: 'The reason must not contain control characters such as NUL.' });
		}
		try {
			await cancelLot(getDb(), locals.user!, params.id, reason || undefined);
		} catch (e) {
			return refused('cancel', e);
		}
		return { action: 'cancel', ok: true, message: 'The lot is cancelled.' };
	},
	upload: async ({ locals, params, request }) => {
		if (!can(locals.user, 'document:upload')) error(403, 'Only buyers attach documents');
		const lot = await lotOr404(locals, params.id);
		if (lot.status === 'cancelled')
			return fail(409, { action: 'upload', ok: false, message: 'The lot is cancelled; documents can no longer be added.' });
		const form = await request.formData();
		const kind = documentKindSchema.safeParse(form.get('kind'));
		const file = form.get('file');
		if (!kind.success) return fail(400, { action: 'upload', ok: false, message: 'Choose what kind of document this is.' });
		if (!(file instanceof File) || file.size === 0) return fail(400, { action: 'upload', ok: false, message: 'Choose a file to attach.' });
		try {
			const doc = await uploadDocument(getDb(), locals.user!, lot.id, {
				kind: kind.data,
				fileName: file.name,
				declaredType: file.type,
				bytes: new Uint8Array(await file.arrayBuffer())
			});
			return { action: 'upload', ok: true, message: `Attached “${doc.fileName}”.` };
		} catch (e) {
			return refused('upload', e);
		}
	}
};
