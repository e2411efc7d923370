import { and, eq } from 'drizzle-orm';
import { getLibraryModel, type ChemistryCode } from '../src/lib/electrochem';
import type { Database } from '../src/lib/server/db';
import { ocvModels, parts } from '../src/lib/server/db/schema';
import { upsertVc21Model } from './part-models';
import type { SeededPeople } from './people';
import { PARTS, type PartSeed } from './scenario';

export interface SeededPart extends PartSeed {
	id: string;
	supplierId: string;
	modelId: string;
}

/** The library model of a chemistry as a stored, approved model version. */
async function upsertLibraryModel(db: Database, chemistry: ChemistryCode, approverId: string | undefined) {
	const model = getLibraryModel(chemistry);
	const found = await db.query.ocvModels.findFirst({
		where: and(eq(ocvModels.chemistry, chemistry), eq(ocvModels.version, model.version))
	});
	if (found) return found.id;
	const [row] = await db
		.insert(ocvModels)
		.values({
			chemistry,
			version: model.version,
			name: model.name,
			origin: 'library',
			parameters: model,
			source: model.source,
			approvedBy: approverId,
			approvedAt: new Date()
		})
		.returning({ id: ocvModels.id });
	return row.id;
}

export async function seedModelsAndParts(db: Database, people: SeededPeople): Promise<Map<string, SeededPart>> {
	const seeded = new Map<string, SeededPart>();
	const { CHEMISTRY_CODES } = await import('../src/lib/electrochem');
	const modelIds = new Map<string, string>();
	for (const code of CHEMISTRY_CODES) modelIds.set(code, await upsertLibraryModel(db, code, people.staff.get('quality')));
	// one part with its own approved, tabulated model (fitted by one quality manager, approved by the other)
	const approverEmail = 'quality2@kestrel-mobility.example';
	const vc21Model = await upsertVc21Model(db, people.staff.get('quality')!, { id: people.staff.get(approverEmail)!, email: approverEmail });
	for (const part of PARTS) {
		const supplierId = people.suppliers.get(part.supplier)!;
		const modelId = part.key === 'vc21' ? vc21Model : modelIds.get(part.chemistry)!;
		const model = getLibraryModel(part.chemistry);
		const [ocvMin, ocvMax] = part.window ?? [model.ocv_empty_v, model.ocv_full_v];
		const found = await db.query.parts.findFirst({
			where: and(eq(parts.supplierId, supplierId), eq(parts.partNumber, part.partNumber))
		});
		const id =
			found?.id ??
			(
				await db
					.insert(parts)
					.values({
						supplierId,
						partNumber: part.partNumber,
						description: part.description,
						chemistry: part.chemistry,
						cellsInSeries: part.series,
						cellsInParallel: part.parallel,
						nominalCapacityAh: part.capacityAh,
						modelId,
						ocvMinCellV: ocvMin,
						ocvMaxCellV: ocvMax,
						// Per-unit residuals catch gross anomalies (wrong part, damaged unit); a lot-wide SOC
						// difference is the declared-SOC check's job (a hold), so this tolerance is the wider one.
						residualToleranceMv: part.chemistry === 'PBACID' ? 60 : 150,
						spreadLimitMv: part.chemistry === 'PBACID' ? 60 : 40,
						aql: part.aql,
						inspectionLevel: part.level,
						requiredDocuments: part.requiredDocuments
					})
					.returning({ id: parts.id })
			)[0].id;
		seeded.set(part.key, { ...part, id, supplierId, modelId });
	}
	return seeded;
}
