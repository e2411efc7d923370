/**
 * Scorecards over a period, suppliers side by side, and the scorecard exports (services/scorecards.ts,
 * reports/scorecard-xlsx.ts, reports/scorecard-pdf.ts) on a real PostgreSQL. Lots are placed on
 * known days, so each period's count follows from the dates alone; the exports are read back by
 * independent readers (xlsx-populate, poppler's pdftotext).
 */
import { describe, expect, it } from 'vitest';
import XlsxPopulate from 'xlsx-populate';
import { getDb } from '$lib/server/db';
import { compareSuppliers, supplierScorecard } from '$lib/server/services/scorecards';
import { scorecardXlsx } from '$lib/server/reports/scorecard-xlsx';
import { scorecardPdf } from '$lib/server/reports/scorecard-pdf';
import { periodOf } from '$lib/schemas/scorecard';
import { pdfText, writeTemp } from '../unit/reports/poppler';
import { useServiceDatabase } from '../helpers/service-db';

const db = useServiceDatabase('svc_scorecard_period', { demo: false });
const DAY = 86_400_000;
const isoDay = (daysAgo: number) => new Date(Date.now() - daysAgo * DAY).toISOString().slice(0, 10);

let serial = 0;
async function lotDecided(partId: string, status: string, daysAgo: number): Promise<void> {
	serial += 1;
	await db.sql(
		`insert into lots (lot_code, po_number, supplier_id, part_id, quantity, declared_soc, transport, status, created_at, decided_at)
		 select $1, $2, p.supplier_id, p.id, 1200, 0.3, 'road', $3::lot_status, now() - ($4 || ' days')::interval - interval '2 days',
		        now() - ($4 || ' days')::interval
		   from parts p where p.id = $5`,
		[`L-1998-${String(serial).padStart(5, '0')}`, `PO-SCORE-${serial}`, status, String(daysAgo), partId]
	);
}

/** An NMC part of a second supplier, copied from an existing NMC part, so the comparison has two sides. */
async function setUp() {
	const [first] = await db.sql<{ id: string; supplier_id: string }>(
		`select id, supplier_id from parts where chemistry = 'NMC' order by part_number limit 1`
	);
	const [other] = await db.sql<{ id: string }>(`select id from organisations where kind = 'supplier' and id <> $1 order by name limit 1`, [
		first.supplier_id
	]);
	const [copy] = await db.sql<{ id: string }>(
		`insert into parts select (jsonb_populate_record(null::parts, to_jsonb(p) || jsonb_build_object('id', gen_random_uuid(), 'supplier_id', $2::uuid, 'part_number', 'CMP-NMC-2'))).*
		   from parts p where p.id = $1 returning id`,
		[first.id, other.id]
	);
	await lotDecided(first.id, 'accepted', 10);
	await lotDecided(first.id, 'rejected', 200);
	await lotDecided(first.id, 'accepted', 500);
	await lotDecided(copy.id, 'accepted', 20);
	await lotDecided(copy.id, 'on_hold', 30);
	return { supplierA: first.supplier_id, supplierB: other.id };
}

describe('scorecard periods, comparison and exports', () => {
	it('counts each lot by the day it was decided, per period; compares suppliers for one chemistry; exports the same figures', async () => {
		const { supplierA, supplierB } = await setUp();
		const now = new Date();
		const count = async (q: Parameters<typeof periodOf>[0]) =>
			(await supplierScorecard(getDb(), supplierA, undefined, periodOf(q, now))).totals;

		expect((await count({ period: 'all' })).lotsReceived).toBe(3);
		const last90 = await count({ period: '90d' });
		expect([last90.lotsReceived, last90.accepted, last90.rejected]).toEqual([1, 1, 0]);
		const last12 = await count({ period: '12m' });
		expect([last12.lotsReceived, last12.accepted, last12.rejected]).toEqual([2, 1, 1]);
		expect(last12.acceptanceRate).toBeCloseTo(0.5, 12);
		const custom = await count({ period: 'custom', from: isoDay(201), to: isoDay(199) });
		expect([custom.lotsReceived, custom.rejected]).toEqual([1, 1]);
		// Both days of a custom period are included: a one-day period on the decision day holds the lot.
		expect((await count({ period: 'custom', from: isoDay(200), to: isoDay(200) })).lotsReceived).toBe(1);
		expect((await count({ period: 'custom', from: isoDay(199), to: isoDay(190) })).lotsReceived).toBe(0);

		// The existing call without a period still counts everything (the bench and the API call it so).
		expect((await supplierScorecard(getDb(), supplierA)).totals.lotsReceived).toBe(3);

		const side = await compareSuppliers(getDb(), { chemistry: 'NMC' }, periodOf({ period: '12m' }, now));
		const bySupplier = new Map(side.map((r) => [r.supplier.id, r.totals]));
		expect(bySupplier.get(supplierA)?.lotsReceived).toBe(2);
		expect(bySupplier.get(supplierB)).toMatchObject({ lotsReceived: 2, accepted: 1, held: 1, rejected: 0 });
		for (const row of side) {
			const [{ n }] = await db.sql<{ n: number }>(
				`select count(*)::int as n from lots l join parts p on p.id = l.part_id
				  where l.supplier_id = $1 and p.chemistry = 'NMC' and l.decided_at >= now() - interval '1 year' - interval '1 day'`,
				[row.supplier.id]
			);
			expect(row.totals.lotsReceived).toBe(n);
		}
		expect(await compareSuppliers(getDb(), { partNumber: 'CMP-NMC-2' })).toHaveLength(1);
		expect(await compareSuppliers(getDb(), { partNumber: 'no-such-part' })).toEqual([]);

		const card = await supplierScorecard(getDb(), supplierA, undefined, periodOf({ period: '12m' }, now));
		const workbook = await XlsxPopulate.fromDataAsync(await scorecardXlsx(card, now));
		const summary = workbook.sheet('Summary')!;
		const rows = summary.usedRange()!.value() as unknown[][];
		const figure = (label: string) => rows.find((r) => r[0] === label)?.[1];
		expect(figure('Lots received')).toBe(2);
		expect(figure('Acceptance rate')).toBeCloseTo(50, 9);
		expect(String(figure('Period'))).toContain(isoDay(0));
		// No unit was inspected in these lots: the ppm cell is empty, never 0.
		expect(figure('Nonconforming')).toBeUndefined();
		expect(workbook.sheet('Parts')!.cell(2, 3).value()).toBe(2);

		const text = pdfText(writeTemp('scorecard.pdf', await scorecardPdf(card, now)));
		expect(text).toContain('Supplier scorecard');
		expect(text).toContain('Lots received');
		expect(text).toMatch(/^2\s+lots$/m);
		expect(text).toMatch(/^1\s+lot$/m);
		expect(text).toMatch(/^50\.0\s+%$/m);
		expect(text).toContain(card.period!.label.slice(0, 10));
	});
});
