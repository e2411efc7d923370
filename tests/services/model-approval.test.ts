/**
 * Part model versions on the real PostgreSQL: a tabulated fit is stored with its points and its
 * cross-validated σ; approving it is an e-signature (password and reason) by a quality manager
 * other than its author (four eyes, common practice in quality systems); the demo part VC-21700-50G
 * uses its approved tabulated model.
 */
import { describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../helpers/auth';
import { useServiceDatabase } from '../helpers/service-db';
import { approveModel, getModelVersion, modelHistory, saveFittedModel } from '$lib/server/services/models';
import { activeSessionUser } from '$lib/server/services/users';
import { chen2020Nmc811, sampled } from '../unit/electrochem/published-curves';

const db = useServiceDatabase('svc_model_approval');

async function staff(email: string) {
	const [row] = await db.sql<{ id: string }>('select id from "user" where email = $1', [email]);
	return (await activeSessionUser(row.id))!;
}

describe('fitted part models', () => {
	it('stores a tabulated fit with its points and σ; its author may not approve it; another QM with the password may', async () => {
		const author = await staff('quality@kestrel-mobility.example');
		const other = await staff('quality2@kestrel-mobility.example');
		const points = sampled(chen2020Nmc811); // Chen et al. 2020, J. Electrochem. Soc. 167, 080534 (from memory)
		const saved = await saveFittedModel(author, {
			chemistry: 'NMC',
			temperature_c: 25,
			points,
			form: 'tabulated',
			data_source: 'published curve'
		});
		if (!saved.ok) throw new Error(saved.reason);
		const id = saved.version.id;
		expect(saved.version.form).toBe('tabulated');
		expect(saved.version.point_count).toBe(21);
		expect(saved.version.fit_sigma_v).toBeGreaterThanOrEqual(0.001);
		expect(saved.version.data_source).toBe('published curve');

		await expect(approveModel(author, id, { password: DEMO_PASSWORD, reason: 'my own fit looks fine' })).rejects.toMatchObject({
			code: 'same_person'
		});
		await expect(approveModel(other, id, { password: 'not-the-password', reason: 'checked the points' })).rejects.toMatchObject({
			code: 'signature_invalid'
		});
		expect((await getModelVersion(id))!.version.status).toBe('awaiting_approval');

		expect(await approveModel(other, id, { password: DEMO_PASSWORD, reason: 'checked the points against our readings' })).toBe('approved');
		const approved = (await getModelVersion(id))!.version;
		expect(approved.status).toBe('approved');
		expect(approved.approved_by).toBe('quality2@kestrel-mobility.example');
		expect(approved.approval_reason).toBe('checked the points against our readings');
		const [stored] = await db.sql<{ sig: { content_sha256: string; meaning: string } }>(
			'select approval_signature as sig from ocv_models where id = $1',
			[id]
		);
		expect(stored.sig.content_sha256).toMatch(/^[0-9a-f]{64}$/);
		expect((await modelHistory(id)).map((h) => h.action)).toEqual(['model.fitted', 'model.approved']);
		expect(await approveModel(other, id, { password: DEMO_PASSWORD, reason: 'again, twice' })).toBe('already_approved');
	});

	it('refuses non-increasing points and stores nothing', async () => {
		const author = await staff('quality@kestrel-mobility.example');
		const points = sampled(chen2020Nmc811).map((p, i) => (i === 9 ? { ...p, ocv_v: 3.0 } : p));
		const before = await db.sql<{ n: number }>('select count(*)::int as n from ocv_models');
		const saved = await saveFittedModel(author, { chemistry: 'NMC', temperature_c: 25, points });
		expect(saved.ok).toBe(false);
		if (!saved.ok) expect(saved.issues.map((i) => i.path)).toContain('points.9');
		expect(await db.sql('select count(*)::int as n from ocv_models')).toEqual(before);
	});

	it('the demo part VC-21700-50G uses an approved tabulated model fitted and approved by two different people', async () => {
		const [row] = await db.sql<{ form: string; created_by: string; approved_by: string; approved_at: Date | null }>(
			`select m.parameters->>'form' as form, m.created_by, m.approved_by, m.approved_at
			   from parts p join ocv_models m on m.id = p.model_id where p.part_number = 'VC-21700-50G'`
		);
		expect(row.form).toBe('tabulated');
		expect(row.approved_at).not.toBeNull();
		expect(row.approved_by).not.toBe(row.created_by);
	});
});
