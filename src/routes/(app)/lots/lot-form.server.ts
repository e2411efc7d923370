// Server side of lot-form.svelte, shared by "Register a lot" and "Edit lot".
import type { Database } from '$lib/server/db';
import { listParts } from '$lib/server/services/parts';
import { listSuppliers } from '$lib/server/services/suppliers';
import type { LotForm } from '$lib/schemas/lot';

/** The suppliers and parts the form offers (parts are filtered by supplier in the browser). */
export async function lotFormChoices(db: Database) {
	const [suppliers, parts] = await Promise.all([listSuppliers(db), listParts(db)]);
	return {
		suppliers: suppliers.map((s) => ({ id: s.id, name: s.name })),
		parts: parts.map((p) => ({
			id: p.id,
			supplierId: p.supplierId,
			partNumber: p.partNumber,
			description: p.description,
			chemistry: p.chemistry,
			cellsInSeries: p.cellsInSeries,
			cellsInParallel: p.cellsInParallel
		}))
	};
}

/** Service field names (API spelling) → the form's field names. */
export const formField = (path: string): keyof LotForm => (path === 'declared_soc' ? 'declared_soc_pct' : (path as keyof LotForm));
