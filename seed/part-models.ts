// A part model fitted to invented supplier data: the Voltaria VC-21700-50G datasheet table (21
// points, invented for the demo) as a tabulated model, fitted by one quality manager and approved
// by the other, so the demo shows a sharp interval on that part next to generic ones elsewhere.
import { and, eq } from 'drizzle-orm';
import { fitPartModel } from '../src/lib/electrochem';
import type { Database } from '../src/lib/server/db';
import { auditEvents, ocvModels } from '../src/lib/server/db/schema';

/** Invented: the rested OCV table a supplier might print, 25 °C, mV resolution. */
export const VC21_DATASHEET_POINTS: Array<[soc: number, ocv_v: number]> = [
	[0, 2.997],
	[0.05, 3.435],
	[0.1, 3.508],
	[0.15, 3.537],
	[0.2, 3.556],
	[0.25, 3.575],
	[0.3, 3.595],
	[0.35, 3.616],
	[0.4, 3.639],
	[0.45, 3.664],
	[0.5, 3.69],
	[0.55, 3.719],
	[0.6, 3.749],
	[0.65, 3.781],
	[0.7, 3.816],
	[0.75, 3.854],
	[0.8, 3.896],
	[0.85, 3.942],
	[0.9, 3.996],
	[0.95, 4.064],
	[1, 4.172]
];

const VERSION = 'fit-vc21-1';
const DATA_SOURCE = 'Voltaria Cells datasheet VC-21700-50G rev. C, rested OCV table at 25 °C (invented demo data)';

/** Upsert the approved tabulated model; returns its id. Signed like a real approval, with the seed as witness. */
export async function upsertVc21Model(db: Database, authorId: string, approver: { id: string; email: string }): Promise<string> {
	const found = await db.query.ocvModels.findFirst({ where: and(eq(ocvModels.chemistry, 'NMC'), eq(ocvModels.version, VERSION)) });
	if (found) return found.id;
	const points = VC21_DATASHEET_POINTS.map(([soc, ocv_v]) => ({ soc, ocv_v }));
	const fit = fitPartModel({ chemistry: 'NMC', temperature_c: 25, points, form: 'tabulated' });
	if (!fit.ok) throw new Error(`seed: the VC-21700-50G model does not fit: ${fit.message}`);
	const model = { ...fit.model, version: VERSION, name: 'NMC — VC-21700-50G datasheet' };
	const approvedAt = new Date();
	const reason = 'Datasheet table checked against our own rested readings of lot KM-PO-24108';
	const [row] = await db
		.insert(ocvModels)
		.values({
			chemistry: 'NMC',
			version: VERSION,
			name: model.name,
			origin: 'fitted',
			parameters: model,
			source: model.source,
			fitTemperatureC: 25,
			fitRmseV: fit.rmse_v,
			fitMaxErrorV: fit.max_error_v,
			fitSigmaV: fit.sigma_model_v,
			referencePoints: points,
			dataSource: DATA_SOURCE,
			createdBy: authorId,
			approvedBy: approver.id,
			approvedAt,
			approvalSignature: {
				signer_id: approver.id,
				signer_email: approver.email,
				meaning: 'approval of an OCV model version for use on parts',
				signed_at: approvedAt.toISOString(),
				method: 'seeded demo approval (no password entered)',
				reason
			}
		})
		.returning({ id: ocvModels.id });
	await db.insert(auditEvents).values([
		{
			actorId: authorId,
			action: 'model.fitted',
			entityType: 'ocv_model',
			entityId: row.id,
			details: { version: VERSION, form: 'tabulated', points: 21 }
		},
		{
			actorId: approver.id,
			actorEmail: approver.email,
			action: 'model.approved',
			entityType: 'ocv_model',
			entityId: row.id,
			details: { version: VERSION, reason }
		}
	]);
	return row.id;
}
