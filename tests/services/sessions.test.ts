/**
 * Server-side sessions (services/sessions.ts) on the real PostgreSQL: a session works until it is
 * ended, expires (12 h) or idles (2 h); deactivation ends every session, revokes API tokens and
 * spends unused links, so reactivation brings none of them back.
 */
import { describe, expect, it } from 'vitest';
import { endSession, sessionUser, startSession } from '$lib/server/services/sessions';
import { setActive } from '$lib/server/services/users';
import { createToken, userForToken } from '$lib/server/services/tokens';
import { useServiceDatabase } from '../helpers/service-db';

const db = useServiceDatabase('svc_sessions', { demo: false });
const person = async (email: string) =>
	(await db.sql<{ id: string; email: string }>('select id, email from "user" where email = $1', [email]))[0];

describe('sessions', () => {
	it('a live session names its person; an ended one names nobody', async () => {
		const buyer = await person('buyer@kestrel-mobility.example');
		const id = await startSession(buyer.id, 'credentials', '203.0.113.9');
		expect((await sessionUser(id))?.email).toBe(buyer.email);
		await endSession(id, 'signed_out');
		expect(await sessionUser(id)).toBeNull();
		const [row] = await db.sql<{ ended_reason: string }>('select ended_reason from user_sessions where id = $1', [id]);
		expect(row.ended_reason).toBe('signed_out');
	});

	it('ends 12 hours after sign-in and after 2 hours without a request', async () => {
		const inspector = await person('inspector@kestrel-mobility.example');
		const old = await startSession(inspector.id, 'credentials', null);
		const idle = await startSession(inspector.id, 'credentials', null);
		const fresh = await startSession(inspector.id, 'credentials', null);
		await db.sql(`update user_sessions set expires_at = now() - interval '1 second' where id = $1`, [old]);
		await db.sql(`update user_sessions set last_seen_at = now() - interval '2 hours 1 minute' where id = $1`, [idle]);
		await db.sql(`update user_sessions set last_seen_at = now() - interval '1 hour 59 minutes' where id = $1`, [fresh]);
		expect(await sessionUser(old)).toBeNull();
		expect(await sessionUser(idle)).toBeNull();
		expect(await sessionUser(fresh)).not.toBeNull();
		// The request just made counts as activity.
		const [row] = await db.sql<{ recent: boolean }>(
			`select last_seen_at > now() - interval '1 minute' as recent from user_sessions where id = $1`,
			[fresh]
		);
		expect(row.recent).toBe(true);
	});

	it('deactivation ends sessions and revokes tokens; reactivation revives neither', async () => {
		const admin = await person('admin@kestrel-mobility.example');
		const quality = await person('quality@kestrel-mobility.example');
		const session = await startSession(quality.id, 'credentials', null);
		const { token } = await createToken({ userId: quality.id, label: 'line-side tablet', actor: admin });
		expect(await userForToken(token)).not.toBeNull();
		await setActive(admin, quality.id, false);
		await setActive(admin, quality.id, true);
		expect(await sessionUser(session)).toBeNull();
		expect(await userForToken(token)).toBeNull();
		expect(await sessionUser(await startSession(quality.id, 'credentials', null))).not.toBeNull();
	});
});
