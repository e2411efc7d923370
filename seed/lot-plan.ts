/**
 * The thirty demo lots: which part, how many, what was declared, how they travelled, what the
 * inspectors will find and where each one ends up. All invented.
 */
import type { MaterialDisposition } from '../src/lib/schemas/disposition';
export type Finding =
	| 'as_declared' // readings match the declared SOC → accept
	| 'deep_discharge' // one unit rests below its minimum voltage → safety reject
	| 'over_window' // several units far below the window → nonconforming over Re → reject
	| 'air_soc_high' // air-shipped Li-ion arriving well above 30 % SOC → hold
	| 'declared_mismatch' // SOC clearly differs from the declaration → hold
	| 'plateau' // LFP mid-plateau: SOC indeterminate where the declared-SOC check needs it → hold
	| 'mixed_lot' // two populations: spread over limit → hold
	| 'documents_missing' // no UN 38.3 summary → hold
	| 'weak_cell_group'; // packs read with their cell groups (BMS); one pack hides a dead group in a normal total → safety reject

export type Stage = 'draft' | 'awaiting_arrival' | 'in_inspection' | 'pending_decision' | 'decided' | 'cancelled';

export interface LotSeed {
	po: string;
	part: string;
	quantity: number;
	declaredSoc: number;
	transport: 'air' | 'sea' | 'road' | 'rail';
	stage: Stage;
	finding?: Finding;
	/** after an automatic hold, a quality manager's e-signed decision */
	/** Quality's material disposition of the held lot (a lot the engine rejects gets one by default in lots.ts). */
	override?: { disposition: MaterialDisposition; reason: string };
	daysAgo: number;
}

const air = 'air' as const,
	sea = 'sea' as const,
	road = 'road' as const,
	rail = 'rail' as const;
export const LOTS: LotSeed[] = [
	// decided lots, oldest first (they build each supplier × part's switching history)
	{
		po: 'KM-PO-24101',
		part: 'vc18',
		quantity: 2000,
		declaredSoc: 0.3,
		transport: sea,
		stage: 'decided',
		finding: 'as_declared',
		daysAgo: 170
	},
	{
		po: 'KM-PO-24102',
		part: 'fl100',
		quantity: 300,
		declaredSoc: 0.3,
		transport: sea,
		stage: 'decided',
		finding: 'as_declared',
		daysAgo: 160
	},
	{
		po: 'KM-PO-24103',
		part: 'pb12',
		quantity: 400,
		declaredSoc: 0.95,
		transport: road,
		stage: 'decided',
		finding: 'as_declared',
		daysAgo: 150
	},
	{
		po: 'KM-PO-24104',
		part: 'nm6',
		quantity: 600,
		declaredSoc: 0.8,
		transport: road,
		stage: 'decided',
		finding: 'as_declared',
		daysAgo: 140
	},
	{
		po: 'KM-PO-24105',
		part: 'vc18',
		quantity: 3000,
		declaredSoc: 0.3,
		transport: air,
		stage: 'decided',
		finding: 'air_soc_high',
		daysAgo: 128,
		override: {
			disposition: 'return_to_supplier',
			reason: 'Arrived by air at about 55 % SOC; above the 30 % limit for cells packed alone. Returned to supplier.'
		}
	},
	{
		po: 'KM-PO-24106',
		part: 'vcpack',
		quantity: 120,
		declaredSoc: 0.3,
		transport: road,
		stage: 'decided',
		finding: 'as_declared',
		daysAgo: 120
	},
	{
		po: 'KM-PO-24107',
		part: 'cr2032',
		quantity: 5000,
		declaredSoc: 0.95,
		transport: air,
		stage: 'decided',
		finding: 'as_declared',
		daysAgo: 110
	},
	{
		po: 'KM-PO-24108',
		part: 'vc21',
		quantity: 1500,
		declaredSoc: 0.3,
		transport: sea,
		stage: 'decided',
		finding: 'deep_discharge',
		daysAgo: 100
	},
	{
		po: 'KM-PO-24109',
		part: 'fl280',
		quantity: 200,
		declaredSoc: 0.5,
		transport: rail,
		stage: 'decided',
		finding: 'plateau',
		daysAgo: 92,
		override: {
			disposition: 'release',
			reason: 'SOC indeterminate on the LFP plateau as expected; OCV spread 3 mV and all units inside the window. Released.'
		}
	},
	{
		po: 'KM-PO-24110',
		part: 'pb12b',
		quantity: 800,
		declaredSoc: 0.95,
		transport: road,
		stage: 'decided',
		finding: 'over_window',
		daysAgo: 85
	},
	{
		po: 'KM-PO-24111',
		part: 'nm10',
		quantity: 250,
		declaredSoc: 0.8,
		transport: road,
		stage: 'decided',
		finding: 'as_declared',
		daysAgo: 78
	},
	{
		po: 'KM-PO-24112',
		part: 'vnca',
		quantity: 1200,
		declaredSoc: 0.3,
		transport: sea,
		stage: 'decided',
		finding: 'as_declared',
		daysAgo: 70
	},
	{
		po: 'KM-PO-24113',
		part: 'vc18',
		quantity: 2000,
		declaredSoc: 0.3,
		transport: sea,
		stage: 'decided',
		finding: 'declared_mismatch',
		daysAgo: 62
	},
	{
		po: 'KM-PO-24114',
		part: 'fl12',
		quantity: 60,
		declaredSoc: 0.3,
		transport: sea,
		stage: 'decided',
		finding: 'as_declared',
		daysAgo: 55
	},
	{
		po: 'KM-PO-24115',
		part: 'vc21',
		quantity: 1500,
		declaredSoc: 0.3,
		transport: sea,
		stage: 'decided',
		finding: 'mixed_lot',
		daysAgo: 44
	},
	{
		po: 'KM-PO-24116',
		part: 'vc18',
		quantity: 2500,
		declaredSoc: 0.3,
		transport: sea,
		stage: 'decided',
		finding: 'as_declared',
		daysAgo: 35
	},
	{
		po: 'KM-PO-24117',
		part: 'vnca',
		quantity: 1000,
		declaredSoc: 0.3,
		transport: sea,
		stage: 'decided',
		finding: 'documents_missing',
		daysAgo: 21
	},
	{
		po: 'KM-PO-24118',
		part: 'pb12',
		quantity: 400,
		declaredSoc: 0.95,
		transport: road,
		stage: 'decided',
		finding: 'as_declared',
		daysAgo: 14
	},
	{
		po: 'KM-PO-24119',
		part: 'vcpack',
		quantity: 150,
		declaredSoc: 0.3,
		transport: air,
		stage: 'decided',
		finding: 'air_soc_high',
		daysAgo: 9
	},
	{
		po: 'KM-PO-24120',
		part: 'vc18',
		quantity: 1800,
		declaredSoc: 0.3,
		transport: sea,
		stage: 'decided',
		finding: 'deep_discharge',
		daysAgo: 5
	},
	// on the bench, waiting and in the making
	{
		po: 'KM-PO-24121',
		part: 'fl100',
		quantity: 300,
		declaredSoc: 0.3,
		transport: sea,
		stage: 'pending_decision',
		finding: 'as_declared',
		daysAgo: 3
	},
	{
		po: 'KM-PO-24122',
		part: 'vc21',
		quantity: 1500,
		declaredSoc: 0.3,
		transport: sea,
		stage: 'in_inspection',
		finding: 'as_declared',
		daysAgo: 3
	},
	{
		po: 'KM-PO-24123',
		part: 'nm6',
		quantity: 600,
		declaredSoc: 0.8,
		transport: road,
		stage: 'in_inspection',
		finding: 'as_declared',
		daysAgo: 2
	},
	{
		po: 'KM-PO-24124',
		part: 'vcpack',
		quantity: 100,
		declaredSoc: 0.3,
		transport: road,
		stage: 'in_inspection',
		finding: 'weak_cell_group',
		daysAgo: 2
	},
	{ po: 'KM-PO-24125', part: 'fl280', quantity: 200, declaredSoc: 0.3, transport: rail, stage: 'awaiting_arrival', daysAgo: 2 },
	{ po: 'KM-PO-24126', part: 'vc18', quantity: 2000, declaredSoc: 0.3, transport: air, stage: 'awaiting_arrival', daysAgo: 1 },
	{ po: 'KM-PO-24127', part: 'pb12b', quantity: 500, declaredSoc: 0.95, transport: road, stage: 'awaiting_arrival', daysAgo: 1 },
	{ po: 'KM-PO-24128', part: 'cr2032', quantity: 10000, declaredSoc: 0.95, transport: air, stage: 'draft', daysAgo: 1 },
	{ po: 'KM-PO-24129', part: 'nm10', quantity: 300, declaredSoc: 0.8, transport: road, stage: 'draft', daysAgo: 0 },
	{ po: 'KM-PO-24130', part: 'vnca', quantity: 800, declaredSoc: 0.3, transport: sea, stage: 'cancelled', daysAgo: 30 }
];
