/**
 * Auth.js for Restvolt: staff sign in with e-mail + password (argon2id), supplier users with an
 * e-mailed one-time link; staff with a TOTP second factor on sign in in two steps (password, then a
 * current code: see the Credentials provider below and services/second-factor.ts). Sessions are
 * JWT cookies; who the person is *now* (role, organisation, still active?) is read from the
 * database on every request in `resolveUser`, so a role change or deactivation takes effect at
 * once. The API also accepts `Authorization: Bearer <token>`.
 *
 * Auth.js's own POST endpoints are closed: sign-in goes through /signin's form actions, which
 * throttle and audit, and call `signInWith` below.
 */
import { isRedirect, redirect, type Handle, type RequestEvent } from '@sveltejs/kit';
import { SvelteKitAuth, AuthError, CredentialsSignin, type SvelteKitAuthConfig } from '@auth/sveltekit';
import Credentials from '@auth/sveltekit/providers/credentials';
import Nodemailer from '@auth/sveltekit/providers/nodemailer';
import { DrizzleAdapter } from '@auth/drizzle-adapter';
import { env } from '$env/dynamic/private';
import { getDb } from './db';
import { accounts, sessions, users, verificationTokens } from './db/schema';
import { activeSessionUser } from './services/users';
import { checkStaffPassword, recordSignIn, sendMailLater, supplierMayUseLink } from './services/sign-in';
import { endSession, sessionUser, startSession, SESSION_LIFETIME_HOURS } from './services/sessions';
import { appOrigin, onAppOrigin } from './origin';
import { tokenGrant } from './services/tokens';
import { checkSignInCode, startCodeStep } from './services/second-factor';
import type { Role } from '$lib/roles';

export const LINK_MINUTES = 30;

/** A refused sign-in because of too many failures; the page shows the throttle message. */
class TooManyAttempts extends CredentialsSignin {
	code = 'throttled';
}

/** The password was right, but the account has a second factor: the code step comes next. */
class CodeNeeded extends CredentialsSignin {
	code = 'code_needed';
	constructor(readonly stepToken: string) {
		super();
	}
}

/** The code step's token is unknown, used or expired: the person starts again with the password. */
class CodeStepExpired extends CredentialsSignin {
	code = 'code_step_expired';
}

export function clientAddress(event: RequestEvent): string {
	try {
		return event.getClientAddress();
	} catch {
		return 'unknown';
	}
}

function config(event: RequestEvent): SvelteKitAuthConfig {
	const address = clientAddress(event);
	return {
		adapter: DrizzleAdapter(getDb(), {
			usersTable: users,
			accountsTable: accounts,
			sessionsTable: sessions,
			verificationTokensTable: verificationTokens
		}),
		// The cookie's own lifetime; the server-side row (services/sessions.ts) decides before it.
		session: { strategy: 'jwt', maxAge: SESSION_LIFETIME_HOURS * 60 * 60 },
		trustHost: env.AUTH_TRUST_HOST === 'true',
		secret: env.AUTH_SECRET,
		pages: { signIn: '/signin', verifyRequest: '/signin/link-sent', error: '/signin' },
		logger: {
			// A wrong password or a refused e-mail address is an expected outcome, not a server error.
			error: (error) => {
				const expected =
					error instanceof CredentialsSignin ||
					(error instanceof AuthError && (error.type === 'AccessDenied' || error.type === 'Verification'));
				if (!expected) console.error('[auth]', error);
			}
		},
		providers: [
			Credentials({
				id: 'credentials',
				// Either e-mail + password, or (second half, see services/second-factor.ts) the code step's
				// token + a current TOTP code.
				credentials: { email: {}, password: {}, step: {}, code: {} },
				authorize: async (credentials) => {
					if (credentials.step) return authorizeCode(String(credentials.step), String(credentials.code ?? ''), address);
					const email = String(credentials.email ?? '');
					const password = String(credentials.password ?? '');
					if (!email || !password) return null;
					const result = await checkStaffPassword({ email, password, address });
					if (!result.ok && result.reason === 'throttled') throw new TooManyAttempts();
					if (result.ok && result.secondFactor) throw new CodeNeeded(await startCodeStep(result.user.id));
					return result.ok ? { id: result.user.id, email: result.user.email, name: result.user.name } : null;
				}
			}),
			Nodemailer({
				server: env.SMTP_URL ?? 'smtp://127.0.0.1:25',
				from: env.MAIL_FROM,
				maxAge: LINK_MINUTES * 60,
				// Not awaited: the answer must not take longer because the address has an account.
				sendVerificationRequest: ({ identifier, url }) =>
					sendMailLater(identifier, 'Your Restvolt sign-in link', [
						'Hello,',
						'',
						`Open this link within ${LINK_MINUTES} minutes to sign in to the Restvolt supplier portal (it works once):`,
						'',
						signInLinkOnAppOrigin(url),
						'',
						'If you did not ask for it, ignore this message; nobody can sign in without the link.'
					])
			})
		],
		callbacks: {
			// The e-mail link is for active supplier users only, both when sending and when following it.
			signIn: async ({ user, account }) => {
				if (account?.provider === 'nodemailer') return !!user.email && (await supplierMayUseLink(user.email));
				return true;
			},
			// At sign-in (user is set) a server-side session row is started; the cookie carries its id.
			jwt: async ({ token, user, account }) => {
				if (user?.id) {
					const fresh = await activeSessionUser(user.id);
					if (!fresh) return null;
					token.sub = fresh.id;
					token.sid = await startSession(fresh.id, account?.provider ?? 'unknown', address);
					token.role = fresh.role;
					token.organisationId = fresh.organisationId;
				}
				return token;
			},
			session: ({ session, token }) => {
				session.sessionId = typeof token.sid === 'string' ? token.sid : null;
				session.user = {
					...session.user,
					id: String(token.sub),
					role: token.role as Role,
					organisationId: (token.organisationId as string | null) ?? null
				};
				return session;
			}
		},
		events: {
			signIn: async ({ user, account }) => {
				if (user.id && user.email) await recordSignIn({ id: user.id, email: user.email }, account?.provider ?? 'unknown', address);
			}
		}
	};
}

/** The code step of a sign-in with a second factor: the step token proves the password was right. */
async function authorizeCode(step: string, code: string, address: string) {
	const result = await checkSignInCode({ token: step, code, address });
	if (result.ok) return { id: result.user.id, email: result.user.email, name: result.user.name };
	if (result.reason === 'throttled') throw new TooManyAttempts();
	if (result.reason === 'expired') throw new CodeStepExpired();
	return null;
}

const auth = SvelteKitAuth(async (event) => config(event));

/** Auth.js's routes under /auth (the e-mail link callback, session), minus its POST endpoints. */
export const authHandle: Handle = async (input) => {
	const { request, url } = input.event;
	if (request.method === 'POST' && url.pathname.startsWith('/auth/')) {
		return new Response('Sign in at /signin', { status: 404 });
	}
	const response = await auth.handle(input);
	if (!url.pathname.startsWith('/auth/')) return response;
	// Auth.js answers some errors with Response.redirect(), whose headers are immutable; the
	// security-headers hook needs to add to them.
	return new Response(response.body, response);
};

/**
 * Auth.js builds the link from the request's Host / X-Forwarded-Host. Whatever it built, the
 * mailed link (and the page it returns to) is put on the configured origin.
 */
function signInLinkOnAppOrigin(url: string): string {
	const link = new URL(onAppOrigin(url));
	const callback = link.searchParams.get('callbackUrl');
	if (callback) link.searchParams.set('callbackUrl', onAppOrigin(new URL(callback, appOrigin()).toString()));
	return link.toString();
}

/**
 * Rebuild the request with these fields (superforms has already read the original body), on the
 * configured origin: host headers sent by the client take no part in what Auth.js builds.
 */
function withForm(event: RequestEvent, fields: Record<string, string>): RequestEvent {
	const body = new FormData();
	for (const [key, value] of Object.entries(fields)) body.set(key, value);
	const headers = new Headers(event.request.headers);
	headers.delete('content-type');
	headers.delete('content-length');
	headers.delete('x-forwarded-host');
	headers.delete('x-forwarded-proto');
	headers.set('host', new URL(appOrigin()).host);
	return { ...event, request: new Request(event.request.url, { method: 'POST', headers, body }) };
}

export type SignInOutcome =
	| { ok: true; location: string }
	| { ok: false; reason: 'code_needed'; stepToken: string }
	| { ok: false; reason: 'invalid' | 'throttled' | 'refused' | 'code_step_expired' };

/**
 * Sign in through Auth.js from a form action (superforms has read the body, so the fields are
 * passed again). Success gives the location Auth.js would redirect to; the caller redirects.
 */
export async function signInWith(
	event: RequestEvent,
	provider: 'credentials' | 'nodemailer',
	fields: Record<string, string> & { redirectTo: string }
): Promise<SignInOutcome> {
	try {
		await auth.signIn(withForm(event, { providerId: provider, ...fields }));
	} catch (error) {
		if (isRedirect(error)) return { ok: true, location: error.location };
		if (error instanceof CodeNeeded) return { ok: false, reason: 'code_needed', stepToken: error.stepToken };
		if (error instanceof TooManyAttempts) return { ok: false, reason: 'throttled' };
		if (error instanceof CodeStepExpired) return { ok: false, reason: 'code_step_expired' };
		if (error instanceof CredentialsSignin) return { ok: false, reason: 'invalid' };
		if (error instanceof AuthError && error.type === 'AccessDenied') return { ok: false, reason: 'refused' };
		throw error;
	}
	return { ok: false, reason: 'refused' };
}

/** End the server-side session, clear the cookie (Auth.js sign-out), then go to `redirectTo` with a 303. */
export async function signOutOf(event: RequestEvent, redirectTo: string): Promise<never> {
	if (event.locals.sessionId) await endSession(event.locals.sessionId, 'signed_out');
	try {
		await auth.signOut(withForm(event, { redirectTo }));
	} catch (error) {
		if (!isRedirect(error)) throw error;
	}
	redirect(303, redirectTo);
}

function bearerToken(request: Request): string | null | undefined {
	const header = request.headers.get('authorization');
	if (header === null) return undefined;
	const match = /^Bearer\s+(\S+)\s*$/i.exec(header);
	return match ? match[1] : null;
}

/**
 * Sets `locals.user` and `locals.authMethod`. An Authorization header on an API call decides alone
 * (no falling back to the cookie); otherwise the Auth.js session, re-checked in the DB.
 */
export const resolveUser: Handle = async ({ event, resolve }) => {
	event.locals.user = null;
	event.locals.authMethod = null;
	event.locals.sessionId = null;
	event.locals.tokenScope = null;
	const token = bearerToken(event.request);
	if (token !== undefined && event.url.pathname.startsWith('/api/')) {
		const grant = token ? await tokenGrant(token) : null;
		if (grant) {
			event.locals.user = grant.user;
			event.locals.authMethod = 'token';
			event.locals.tokenScope = grant.scope;
		}
		return resolve(event);
	}
	const session = await event.locals.auth();
	const sessionId = session?.sessionId;
	const user = sessionId ? await sessionUser(sessionId) : null;
	if (user && user.id === session?.user?.id) {
		event.locals.user = user;
		event.locals.authMethod = 'session';
		event.locals.sessionId = sessionId!;
	}
	return resolve(event);
};
