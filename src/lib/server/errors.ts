/**
 * The errors services throw. Each has a `kind` (what went wrong, in the domain's words) and a
 * machine `code` that clients and tests see unchanged in `{"error":{"code","message","issues"?}}`.
 * Nothing here knows about HTTP: the API maps kinds to statuses once (http.ts `api()`), form
 * actions and page loads once (action-errors.ts), both through error-status.ts.
 */

export type ErrorKind =
	/** The request could not be read at all (broken JSON, bad cursor, empty upload). */
	| 'malformed'
	/** Readable, but some fields are not acceptable; `issues` names them. */
	| 'invalid'
	| 'unauthenticated'
	| 'forbidden'
	/** Missing, or belongs to another supplier (they are told the same thing). */
	| 'not_found'
	/** The thing is in a state where this no longer applies, or someone else was first. */
	| 'conflict'
	| 'too_large'
	| 'unsupported_type'
	| 'throttled'
	/** Something the app depends on (the database) is not reachable right now. */
	| 'unavailable';

export interface Issue {
	/** The field, dotted for nested ones (`readings.3.ocv_v`). */
	path: string;
	message: string;
}

export class DomainError extends Error {
	constructor(
		readonly kind: ErrorKind,
		readonly code: string,
		message: string,
		readonly issues?: Issue[]
	) {
		super(message);
		this.name = 'DomainError';
	}
}

export class NotFound extends DomainError {
	constructor(what = 'resource', code = 'not_found') {
		super('not_found', code, `${what} not found`);
	}
}

export class Conflict extends DomainError {
	constructor(message: string, code = 'conflict', issues?: Issue[]) {
		super('conflict', code, message, issues);
	}
}

export class Invalid extends DomainError {
	constructor(message: string, issues?: Issue[], code = 'unprocessable') {
		super('invalid', code, message, issues);
	}
}

/** Field problems only the database can judge (unknown ids, a part number taken…). */
export const invalidFields = (issues: Issue[]) => new Invalid('Some fields are not valid', issues);

export class Malformed extends DomainError {
	constructor(message: string, issues?: Issue[], code = 'bad_request') {
		super('malformed', code, message, issues);
	}
}

export class Forbidden extends DomainError {
	constructor(message: string, code = 'forbidden') {
		super('forbidden', code, message);
	}
}

export class Unauthenticated extends DomainError {
	constructor(message: string, code = 'unauthenticated') {
		super('unauthenticated', code, message);
	}
}

export class Throttled extends DomainError {
	constructor(message: string, code = 'throttled') {
		super('throttled', code, message);
	}
}

export class Unavailable extends DomainError {
	constructor(message: string, code = 'unavailable') {
		super('unavailable', code, message);
	}
}

export class TooLarge extends DomainError {
	constructor(message: string, code: string, issues?: Issue[]) {
		super('too_large', code, message, issues);
	}
}
