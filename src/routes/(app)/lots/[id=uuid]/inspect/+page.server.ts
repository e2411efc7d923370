import { error } from '@sveltejs/kit';
import { getDb } from '$lib/server/db';
import { can } from '$lib/server/policy';
import { evaluateLotNow } from '$lib/server/services/evaluation';
import { getLotForUser } from '$lib/server/services/lots';
import { listReadings } from '$lib/server/services/readings';
import type { PageServerLoad } from './$types';

/** Readings shown on the page; older ones stay in the lot's readings list and export. */
const SHOWN = 300;

export const load: PageServerLoad = async ({ locals, params, depends }) => {
	depends('restvolt:bench');
	const user = locals.user!;
	if (!can(user, 'lot:read')) error(403, 'Your role may not see lots');
	const db = getDb();
	const lot = await getLotForUser(db, user, params.id);
	if (!lot) error(404, 'No such lot');
	const [evaluation, readings] = await Promise.all([evaluateLotNow(db, lot.id), listReadings(db, lot.id)]);
	const { inputs } = evaluation;
	return {
		lot: { id: lot.id, lotCode: lot.lotCode, poNumber: lot.poNumber, status: lot.status, quantity: lot.quantity, declaredSoc: lot.declaredSoc, transport: lot.transport, supplierName: lot.supplierName },
		part: inputs.part,
		model: inputs.model,
		limits: inputs.limits,
		plan: evaluation.plan,
		severity: evaluation.severity,
		unitsMeasured: evaluation.units.length,
		readingCount: readings.length,
		readings: readings.slice(-SHOWN),
		canRecord: can(user, 'reading:write', { supplierId: lot.supplierId }),
		canSubmit: can(user, 'lot:submit', { supplierId: lot.supplierId })
	};
};
