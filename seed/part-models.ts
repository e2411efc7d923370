// A part model fitted to invented supplier data: the Voltaria VC-21700-50G datasheet table (21
// points, invented for the demo) as a tabulated model, fitted by one quality manager and approved
// by the other, so the demo shows a sharp interval on that part next to generic ones elsewhere.
import { and, eq } from 'drizzle-orm';
import { VC21_VERSION as VERSION, vc21Fit } from './vc21-datasheet';
import type { Database } from '../src/lib/server/db';
import { auditEvents, ocvModels } from '../src/lib/server/db/schema';

const DATA_SOURCE = 'Voltaria Cells datasheet VC-21700-50G rev. C, rested OCV table at 25 °C (invented demo data)';

/** Upsert the approved tabulated model; returns its id. Signed like a real approval, with the seed as witness. */
export async function upsertVc21Model(db: Database, authorId: string, approver: { id: string; email: string }): Promise<string> {
	const found = await db.query.ocvModels.findFirst({ where: and(eq(ocvModels.chemistry, 'NMC'), eq(ocvModels.version, VERSION)) });
	if (found) return found.id;
	const { points, fit, model } = vc21Fit();
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
