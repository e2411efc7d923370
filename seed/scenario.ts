/**
 * The invented demo scenario: Kestrel Mobility, a maker of e-bikes and medical carts, receives cells
 * and packs from four invented suppliers. Every name, address and part number here is made up.
 */
import type { ChemistryCode } from '../src/lib/electrochem';

export const DEMO_PASSWORD = 'restvolt-demo-2026';
export const OWN_COMPANY = { name: 'Kestrel Mobility Ltd', country: 'NL' };

export interface SupplierSeed {
	key: string;
	name: string;
	country: string;
	domain: string;
	contacts: Array<{ name: string; email: string }>;
}

export const SUPPLIERS: SupplierSeed[] = [
	{
		key: 'voltaria',
		name: 'Voltaria Cells Co.',
		country: 'KR',
		domain: 'voltaria-cells.example',
		contacts: [
			{ name: 'Mira Okonkwo', email: 'supplier@voltaria-cells.example' },
			{ name: 'Voltaria quality desk', email: 'quality-desk@voltaria-cells.example' }
		]
	},
	{
		key: 'ferrolith',
		name: 'Ferrolith Energy',
		country: 'CN',
		domain: 'ferrolith.example',
		contacts: [{ name: 'Jun Halvorsen', email: 'supplier@ferrolith.example' }]
	},
	{
		key: 'plumbridge',
		name: 'Plumbridge Batteries',
		country: 'DE',
		domain: 'plumbridge.example',
		contacts: [{ name: 'Greta Ashdown', email: 'supplier@plumbridge.example' }]
	},
	{
		key: 'nimbus',
		name: 'Nimbus Pack Works',
		country: 'PL',
		domain: 'nimbuspack.example',
		contacts: [{ name: 'Tomasz Ilves', email: 'supplier@nimbuspack.example' }]
	}
];

export const STAFF = [
	{ email: 'buyer@kestrel-mobility.example', name: 'Ana Buyer-Lindqvist', role: 'buyer' },
	{ email: 'inspector@kestrel-mobility.example', name: 'Ravi Inspector-Moreau', role: 'inspector' },
	{ email: 'inspector2@kestrel-mobility.example', name: 'Lena Inspector-Vos', role: 'inspector' },
	{ email: 'quality@kestrel-mobility.example', name: 'Sofia Quality-Brandt', role: 'quality' },
	{ email: 'quality2@kestrel-mobility.example', name: 'Omar Quality-Reyes', role: 'quality' },
	{ email: 'admin@kestrel-mobility.example', name: 'Noor Admin-Haddad', role: 'admin' }
] as const;

export interface PartSeed {
	key: string;
	supplier: string;
	partNumber: string;
	description: string;
	chemistry: ChemistryCode;
	series: number;
	parallel: number;
	capacityAh: number;
	aql: number;
	level: string;
	requiredDocuments: string[];
	/** per-cell acceptance window; null = the chemistry's OCV window */
	window?: [number, number];
}

const LI_DOCS = ['coc', 'un38_3_summary', 'sds'];
export const PARTS: PartSeed[] = [
	{
		key: 'vc18',
		supplier: 'voltaria',
		partNumber: 'VC-18650-35E',
		description: 'NMC 18650-size cell, 3.5 Ah',
		chemistry: 'NMC',
		series: 1,
		parallel: 1,
		capacityAh: 3.5,
		aql: 0.65,
		level: 'II',
		requiredDocuments: LI_DOCS
	},
	{
		key: 'vc21',
		supplier: 'voltaria',
		partNumber: 'VC-21700-50G',
		description: 'NMC 21700-size cell, 5.0 Ah',
		chemistry: 'NMC',
		series: 1,
		parallel: 1,
		capacityAh: 5,
		aql: 1,
		level: 'II',
		requiredDocuments: LI_DOCS
	},
	{
		key: 'vcpack',
		supplier: 'voltaria',
		partNumber: 'VC-EB36-10S4P',
		description: 'E-bike pack 36 V, NMC 10s4p, 14 Ah',
		chemistry: 'NMC',
		series: 10,
		parallel: 4,
		capacityAh: 14,
		aql: 1,
		level: 'S-3',
		requiredDocuments: LI_DOCS
	},
	{
		key: 'vnca',
		supplier: 'voltaria',
		partNumber: 'VC-18650-NC30',
		description: 'NCA 18650-size cell, 3.0 Ah',
		chemistry: 'NCA',
		series: 1,
		parallel: 1,
		capacityAh: 3,
		aql: 1,
		level: 'II',
		requiredDocuments: LI_DOCS
	},
	{
		key: 'fl100',
		supplier: 'ferrolith',
		partNumber: 'FL-PR-100',
		description: 'LFP prismatic cell, 100 Ah',
		chemistry: 'LFP',
		series: 1,
		parallel: 1,
		capacityAh: 100,
		aql: 1,
		level: 'II',
		requiredDocuments: LI_DOCS
	},
	{
		key: 'fl280',
		supplier: 'ferrolith',
		partNumber: 'FL-PR-280',
		description: 'LFP prismatic cell, 280 Ah',
		chemistry: 'LFP',
		series: 1,
		parallel: 1,
		capacityAh: 280,
		aql: 1.5,
		level: 'I',
		requiredDocuments: LI_DOCS
	},
	{
		key: 'fl12',
		supplier: 'ferrolith',
		partNumber: 'FL-MOD-12V50',
		description: 'LFP 12.8 V module, 4s1p, 50 Ah',
		chemistry: 'LFP',
		series: 4,
		parallel: 1,
		capacityAh: 50,
		aql: 1,
		level: 'S-4',
		requiredDocuments: LI_DOCS
	},
	{
		key: 'pb12',
		supplier: 'plumbridge',
		partNumber: 'PB-AGM-12-18',
		description: 'Lead-acid AGM block 12 V, 18 Ah (6 cells)',
		chemistry: 'PBACID',
		series: 6,
		parallel: 1,
		capacityAh: 18,
		aql: 1.5,
		level: 'II',
		requiredDocuments: ['coc', 'sds']
	},
	{
		key: 'pb12b',
		supplier: 'plumbridge',
		partNumber: 'PB-AGM-12-7',
		description: 'Lead-acid AGM block 12 V, 7 Ah (6 cells)',
		chemistry: 'PBACID',
		series: 6,
		parallel: 1,
		capacityAh: 7,
		aql: 2.5,
		level: 'I',
		requiredDocuments: ['coc', 'sds']
	},
	{
		key: 'nm6',
		supplier: 'nimbus',
		partNumber: 'NP-NIMH-6S-2000',
		description: 'NiMH pack 7.2 V, 6s1p AA, 2.0 Ah',
		chemistry: 'NIMH',
		series: 6,
		parallel: 1,
		capacityAh: 2,
		aql: 1.5,
		level: 'II',
		requiredDocuments: ['coc', 'sds']
	},
	{
		key: 'nm10',
		supplier: 'nimbus',
		partNumber: 'NP-NIMH-10S-4500',
		description: 'NiMH pack 12 V, 10s1p Sub-C, 4.5 Ah (medical cart backup)',
		chemistry: 'NIMH',
		series: 10,
		parallel: 1,
		capacityAh: 4.5,
		aql: 1,
		level: 'II',
		requiredDocuments: ['coc', 'sds']
	},
	{
		key: 'cr2032',
		supplier: 'nimbus',
		partNumber: 'NP-CR2032-T',
		description: 'Li-MnO2 coin cell CR2032 with tabs, 0.22 Ah',
		chemistry: 'LIMNO2',
		series: 1,
		parallel: 1,
		capacityAh: 0.22,
		aql: 0.65,
		level: 'S-4',
		requiredDocuments: ['coc', 'un38_3_summary']
	}
];
