/**
 * A lot's last direction (after charge / after discharge / unknown) reaches the SOC engine: with the
 * library LFP model (which stores a charge and a discharge branch) an unknown direction widens each
 * unit's interval by the branch gap, a known one does not. Branch gap: LFP library model (from memory,
 * marked there). Uses the demo's LFP lot L-2026-00021 (invented), on the library model.
 */
import { describe, expect, it } from 'vitest';
import { evaluateLotNow } from '$lib/server/services/evaluation';
import { lotJson } from '$lib/server/services/lots';
import { eq } from 'drizzle-orm';
import { getDb } from '$lib/server/db';
import { lots } from '$lib/server/db/schema';
import { useServiceDatabase } from '../helpers/service-db';

const db = useServiceDatabase('svc_last_direction');
const LOT_CODE = 'L-2026-00021';

async function lfpLotOnLibraryModel(): Promise<string> {
	const [lot] = await db.sql<{ id: string; part_id: string }>('select id, part_id from lots where lot_code = $1', [LOT_CODE]);
	await db.sql('update parts set model_id = null where id = $1', [lot.part_id]);
	return lot.id;
}

describe('last_direction', () => {
	it('is unknown by default and the interval then covers both branches', async () => {
		const lotId = await lfpLotOnLibraryModel();
		const evaluation = await evaluateLotNow(getDb(), lotId);
		expect(evaluation.model.source).toBe('library');
		expect(evaluation.inputs.lot.last_direction).toBe('unknown');
		expect(evaluation.units.length).toBeGreaterThan(0);
		for (const u of evaluation.units) expect(u.uncertainty?.hysteresis_v).toBeGreaterThan(0);
	});

	it('after a charge the engine reads the upper branch: no branch gap in the interval, lower SOC', async () => {
		const lotId = await lfpLotOnLibraryModel();
		const unknown = await evaluateLotNow(getDb(), lotId);
		await db.sql(`update lots set last_direction = 'after_charge' where id = $1`, [lotId]);
		const charged = await evaluateLotNow(getDb(), lotId);
		expect(charged.inputs.lot.last_direction).toBe('after_charge');
		charged.units.forEach((u, i) => {
			expect(u.uncertainty?.hysteresis_v).toBe(0);
			expect(u.soc).toBeLessThanOrEqual(unknown.units[i].soc + 1e-12);
			expect(u.soc_high - u.soc_low).toBeLessThanOrEqual(unknown.units[i].soc_high - unknown.units[i].soc_low + 1e-12);
		});
		const [row] = await db.sql<Record<string, unknown>>('select * from lots where id = $1', [lotId]);
		expect(row.last_direction).toBe('after_charge');
	});

	it('the API shape names it', async () => {
		const lotId = await lfpLotOnLibraryModel();
		await db.sql(`update lots set last_direction = 'after_discharge' where id = $1`, [lotId]);
		const [row] = await getDb().select().from(lots).where(eq(lots.id, lotId));
		expect(lotJson(row).last_direction).toBe('after_discharge');
	});
});
