/**
 * Domain errors (errors.ts) for form actions and page loads, mapped in one place as the API maps
 * them in http.ts `api()`. Anything that is not a domain error is thrown on unchanged: a bug or an
 * unreachable database is for `handleError` (hooks), never a form message.
 */
import { error } from '@sveltejs/kit';
import { setError, type SuperValidated } from 'sveltekit-superforms';
import { actionStatusOf, statusOf } from './error-status';
import { DomainError, type Issue } from './errors';

export interface Refusal {
	status: number;
	code: string;
	message: string;
	issues: Issue[];
	/** The first field the refusal names, for a page that shows one message next to one field. */
	field: string | null;
}

/** What a form action answers for `e`; rethrows `e` when it is not a domain error. */
export function refusalOf(e: unknown): Refusal {
	if (!(e instanceof DomainError)) throw e;
	const issues = e.issues ?? [];
	return { status: actionStatusOf(e.kind), code: e.code, message: e.message, issues, field: issues[0]?.path ?? null };
}

/**
 * Put a domain error on a superform: each issue on its field (`fieldOf` turns a service's path into
 * the form's field name where they differ), or the message on the form when it names none.
 * Returns the status for `fail(status, { …form })`.
 */
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- any superform: issue paths come from the service
export function refuseForm(form: SuperValidated<any, any>, e: unknown, fieldOf = (path: string) => path): number {
	const refusal = refusalOf(e);
	if (refusal.issues.length === 0) form.message = refusal.message;
	for (const issue of refusal.issues) setError(form, fieldOf(issue.path), issue.message, { status: refusal.status as 400 });
	form.valid = false;
	return refusal.status;
}

/** In a load: a domain error becomes SvelteKit's error page with its status (404 page, 403 …). */
export function pageError(e: unknown): never {
	if (!(e instanceof DomainError)) throw e;
	error(statusOf(e.kind), { message: e.message, code: e.code });
}

/** Run a load's service call, turning a domain error into the error page (see pageError). */
export async function orErrorPage<T>(work: Promise<T>): Promise<T> {
	try {
		return await work;
	} catch (e) {
		return pageError(e);
	}
}
