/**
 * Original inspection only (ISO 2859-1:1999 9.3): a lot marked resubmitted is not counted by the
 * switching rules replayed from the database (services/switching.ts), on the real PostgreSQL.
 */
import { describe, expect, it } from 'vitest';
import { getDb } from '$lib/server/db';
import { currentSeverity } from '$lib/server/services/switching';
import { useServiceDatabase } from '../helpers/service-db';

const db = useServiceDatabase('svc_resubmitted', { demo: false });

async function pair() {
	const [row] = await db.sql<{ supplier_id: string; part_id: string }>('select supplier_id, id as part_id from parts order by id limit 1');
	return row;
}

async function decidedLot(code: string, p: { supplier_id: string; part_id: string }, status: string, day: number, resubmitted: boolean) {
	await db.sql(
		`insert into lots (lot_code, po_number, supplier_id, part_id, quantity, transport, status, decided_at, resubmitted)
		 values ($1, 'PO-RS', $2, $3, 500, 'road', $4, $5, $6)`,
		[code, p.supplier_id, p.part_id, status, new Date(Date.UTC(2026, 0, day)).toISOString(), resubmitted]
	);
}

describe('switching counts original inspections only', () => {
	it('two lots not accepted within five tighten; when the second is a resubmission they do not', async () => {
		const p = await pair();
		await decidedLot('RS-1', p, 'rejected', 1, false);
		await decidedLot('RS-2', p, 'rejected', 2, true);
		await decidedLot('RS-3', p, 'accepted', 3, false);
		const skipped = await currentSeverity(getDb(), p.supplier_id, p.part_id);
		expect(skipped.severity).toBe('normal');
		expect(skipped.lots.find((l) => l.lot_code === 'RS-2')?.resubmitted).toBe(true);
		expect(skipped.history.some((h) => h.lot_code === 'RS-2' && /Resubmitted lot/.test(h.reason))).toBe(true);

		await db.sql(`update lots set resubmitted = false where lot_code = 'RS-2'`);
		const counted = await currentSeverity(getDb(), p.supplier_id, p.part_id);
		expect(counted.severity).toBe('tightened');
	});
});
