import { error, fail } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { getDb } from '$lib/server/db';
import { orErrorPage, refusalOf } from '$lib/server/action-errors';
import { can } from '$lib/server/policy';
import { overrideSchema } from '$lib/schemas/decision';
import { listDecisions } from '$lib/server/services/decision-history';
import { decideOverride, reevaluateLot, SAFETY_RELEASE_REFUSED } from '$lib/server/services/decisions';
import { DISPOSITION } from '$lib/schemas/disposition';
import { getLotForUser } from '$lib/server/services/lots';
import { buildReportData } from '$lib/server/services/report-data';
import { issueChallenge } from '$lib/server/services/signature-challenges';
import type { Actions, PageServerLoad } from './$types';

const FORM_ID = 'override';

function quality(locals: App.Locals) {
	if (!locals.user || !can(locals.user, 'review:read')) error(403, 'The hold review is for quality managers');
	return locals.user;
}

/**
 * Single-use signing challenges for the held lot as shown (one per decision, bound to its
 * revision): the form sends both, the action signs with the one for the chosen decision. Each
 * page load issues fresh ones, so after a refusal the reloaded page signs the lot as it is now.
 */
async function signingChallenges(locals: App.Locals, lot: { id: string; status: string }, safety: boolean) {
	const user = locals.user!;
	if (lot.status !== 'on_hold' || locals.authMethod !== 'session' || !can(user, 'lot:decide')) return null;
	const reject = await issueChallenge(getDb(), user, lot.id, 'reject');
	const accept = safety ? null : await issueChallenge(getDb(), user, lot.id, 'accept');
	return { accept: accept?.challengeId ?? '', reject: reject.challengeId, revision: reject.revision, expiresAt: reject.expiresAt };
}

export const load: PageServerLoad = async ({ locals, params }) => {
	const user = quality(locals);
	const lot = await getLotForUser(getDb(), user, params.id);
	if (!lot) error(404, 'Lot not found');
	const [report, decisions] = await orErrorPage(Promise.all([buildReportData(getDb(), lot.id), listDecisions(getDb(), lot.id)]));
	return {
		lot: { id: lot.id, status: lot.status },
		report,
		decisions,
		safetyText: SAFETY_RELEASE_REFUSED,
		challenges: await orErrorPage(signingChallenges(locals, lot, report.disposition.safety)),
		form: await superValidate(zod4(overrideSchema), { id: FORM_ID })
	};
};

export const actions: Actions = {
	decide: async (event) => {
		const user = quality(event.locals);
		const data = await event.request.formData();
		const form = await superValidate(data, zod4(overrideSchema), { id: FORM_ID });
		// The password is the signature: used once, never sent back to the browser.
		const password = form.data.password;
		form.data.password = '';
		if (!form.valid) return fail(400, { form });
		if (event.locals.authMethod !== 'session') return message(form, 'Sign in interactively to sign a decision.', { status: 403 });
		try {
			const { disposition, due_date: dueDate, reason } = form.data;
			if (!disposition) return setError(form, 'disposition', 'Choose a disposition');
			const decision = DISPOSITION[disposition].decision;
			const challengeId = String(data.get(decision === 'accept' ? 'challenge_accept' : 'challenge_reject') ?? '');
			const input = { disposition, dueDate, reason, password, challengeId };
			const outcome = await decideOverride(user, event.params.id, input, event.getClientAddress());
			const told = outcome.noticeId ? 'The supplier notice is queued.' : 'The supplier has nobody to notify (see the audit trail).';
			return message(form, `Recorded: ${DISPOSITION[disposition].label.toLowerCase()}; the lot is now ${outcome.status}. ${told}`);
		} catch (e) {
			const refusal = refusalOf(e);
			if (refusal.code === 'signature_invalid') return setError(form, 'password', refusal.message, { status: 403 });
			const field = refusal.field;
			if (field === 'due_date' || field === 'disposition') return setError(form, field, refusal.message, { status: refusal.status as 400 });
			return message(form, refusal.message, { status: refusal.status as 400 });
		}
	},
	reevaluate: async (event) => {
		const user = quality(event.locals);
		try {
			const outcome = await reevaluateLot(user, event.params.id);
			return { reevaluated: outcome.status };
		} catch (e) {
			const refusal = refusalOf(e);
			return fail(refusal.status, { reevaluateError: refusal.message });
		}
	}
};
