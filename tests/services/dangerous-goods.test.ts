/**
 * The evaluation names the dangerous-goods rule it applied, on the demo lots in the real PostgreSQL.
 * Rules: IATA DGR 67th edition (2026) PI 965 for lithium-ion cells and batteries alone by air; UN Model
 * Regulations 23rd rev. ed. P903 by sea, road or rail (both from memory, see src/lib/inspection/dangerous-goods.ts).
 */
import { describe, expect, it } from 'vitest';
import { dgFamilyOf } from '$lib/inspection/dangerous-goods';
import { getDb } from '$lib/server/db';
import { evaluateLotNow } from '$lib/server/services/evaluation';
import { useServiceDatabase } from '../helpers/service-db';

const db = useServiceDatabase('svc_dangerous_goods');

describe('evaluation dg_rule and packing', () => {
	it('each demo lot names the rule of its UN number, packing and transport', async () => {
		const lots = await db.sql<{ id: string; transport: string; chemistry: string }>(
			'select l.id, l.transport::text as transport, p.chemistry from lots l join parts p on p.id = l.part_id'
		);
		expect(lots.length).toBeGreaterThan(0);
		const seen = new Set<string>();
		for (const lot of lots) {
			const e = await evaluateLotNow(getDb(), lot.id);
			expect(e.packing).toBe('alone');
			const family = dgFamilyOf(lot.chemistry);
			const expected =
				family === null
					? null
					: lot.transport !== 'air'
						? 'UN Model Regulations 23rd rev. ed. P903'
						: family === 'lithium_ion'
							? 'IATA DGR 67th ed. PI 965'
							: family === 'lithium_metal'
								? 'IATA DGR 67th ed. PI 968'
								: 'IATA DGR 67th ed. PI 976';
			expect(e.dg_rule).toBe(expected);
			seen.add(String(expected));
		}
		// The demo covers at least an air lithium-ion lot and a lot with no DG rule.
		expect(seen.has('IATA DGR 67th ed. PI 965')).toBe(true);
	});
});
