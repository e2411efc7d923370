// PLACEHOLDER — replaced by the Auth.js integration (sign-in issue).
import type { Handle } from '@sveltejs/kit';

export const authHandle: Handle = ({ event, resolve }) => resolve(event);
export const resolveUser: Handle = ({ event, resolve }) => {
	event.locals.user = null;
	event.locals.authMethod = null;
	return resolve(event);
};
