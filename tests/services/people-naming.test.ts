/**
 * The lot's history and its decision trail name people one way: name and role (src/lib/people.ts),
 * never an e-mail address in one place and a name in the other.
 */
import { describe, expect, it } from 'vitest';
import { getDb } from '$lib/server/db';
import { lotTimeline } from '$lib/server/services/lots';
import { personLabel } from '$lib/people';
import { useServiceDatabase } from '../helpers/service-db';

const db = useServiceDatabase('svc_people_naming');

describe('people in lot history', () => {
	it('names the decider and every event author by name and role, as the users table records them', async () => {
		const [decided] = await db.sql<{ lot_id: string; name: string | null; email: string; role: 'quality' }>(
			`select d.lot_id, u.name, u.email, u.role from decisions d join "user" u on u.id = d.decided_by limit 1`
		);
		expect(decided).toBeDefined();
		expect(decided.name).toBeTruthy();
		const timeline = await lotTimeline(getDb(), decided.lot_id);
		const decisionActors = timeline.filter((e) => e.kind === 'decision').map((e) => e.actor);
		expect(decisionActors).toContain(personLabel(decided));
		expect(personLabel(decided)).toMatch(/^[^@]+ \([A-Z][a-z]+( [a-z]+)?\)$/);
		const authors = await db.sql<{ name: string | null; email: string; role: 'buyer' }>(
			`select distinct u.name, u.email, u.role from audit_events a join "user" u on u.id = a.actor_id where a.lot_id = $1`,
			[decided.lot_id]
		);
		const eventActors = new Set(timeline.filter((e) => e.kind === 'event').map((e) => e.actor));
		for (const a of authors) expect(eventActors).toContain(personLabel(a));
		for (const actor of eventActors) if (actor) expect(actor).not.toMatch(/@/);
	});
});
