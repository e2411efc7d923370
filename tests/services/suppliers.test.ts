/**
 * Supplier list (services/suppliers.ts) on the real PostgreSQL: each supplier's part count is the
 * number of parts that name it as supplier, in the list and in the API's `part_count`.
 */
import { describe, expect, it } from 'vitest';
import { getDb } from '$lib/server/db';
import { listSuppliers, supplierJson } from '$lib/server/services/suppliers';
import { useServiceDatabase } from '../helpers/service-db';

const db = useServiceDatabase('svc_suppliers', { demo: false });

describe('suppliers list', () => {
	it('counts each supplier’s own parts, as the parts table does', async () => {
		const rows = await db.sql<{ supplier_id: string; n: number }>('select supplier_id, count(*)::int as n from parts group by supplier_id');
		const expected = new Map(rows.map((r) => [r.supplier_id, r.n]));
		// The demo suppliers have parts; a count of 0 everywhere must fail this test.
		expect([...expected.values()].some((n) => n > 1)).toBe(true);
		const suppliers = await listSuppliers(getDb());
		expect(suppliers.length).toBeGreaterThan(1);
		for (const s of suppliers) {
			expect(s.partCount).toBe(expected.get(s.id) ?? 0);
			expect(supplierJson(s).part_count).toBe(expected.get(s.id) ?? 0);
		}
	});
});
