import type { SessionUser } from '$lib/roles';

declare global {
	namespace App {
		interface Locals {
			/** The signed-in person (session cookie or API token), or null. Set once in hooks.server.ts. */
			user: SessionUser | null;
			/** How the user authenticated: an interactive session or an API token. */
			authMethod: 'session' | 'token' | null;
			/** An API token's scope (server/token-scopes.ts); null for a cookie session. */
			tokenScope: import('$lib/server/token-scopes').TokenScope | null;
			/** The server-side session row of a cookie session (services/sessions.ts), or null. */
			sessionId: string | null;
			/** Set by handleError when PostgreSQL was unreachable: the answer becomes a 503 (unavailable.ts). */
			databaseUnavailable?: boolean;
		}
		interface Error {
			message: string;
			code?: string;
			/** Where the person can go from here, when the refusal belongs to one record (e.g. the lot). */
			back?: { href: string; label: string };
		}
	}
}

declare module '@auth/core/types' {
	interface Session {
		/** The server-side session row this cookie belongs to; null for cookies from before rows existed. */
		sessionId: string | null;
		user: {
			id: string;
			email: string;
			name?: string | null;
			role: import('$lib/roles').Role;
			organisationId: string | null;
		} & Omit<import('@auth/core/types').DefaultSession['user'], 'id'>;
	}
}

export {};
