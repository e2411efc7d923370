// Dangerous goods: which transport rule a lot travels under, and what that rule asks of its state of
// charge. One table of rules, each row naming its regulation, edition and effective date, so a new
// edition is one more row (the latest row in force on the lot's date wins).
//
// The rows are written from memory of the published texts (IATA Dangerous Goods Regulations,
// UN Recommendations on the Transport of Dangerous Goods, Model Regulations); every row says so in
// `basis`. They are a screening aid for receiving inspection, not a shipping decision: the current
// regulations, the operator's variations and licensed DG staff decide.

export const UN_NUMBERS = ['UN3480', 'UN3481', 'UN3090', 'UN3091', 'UN3551', 'UN3552'] as const;
export type UnNumber = (typeof UN_NUMBERS)[number];

/** How the cells or batteries travel: on their own, in the same package as equipment, or built into it. */
export const PACKINGS = ['alone', 'with_equipment', 'in_equipment'] as const;
export type Packing = (typeof PACKINGS)[number];

export type DgFamily = 'lithium_ion' | 'lithium_metal' | 'sodium_ion';

/** Chemistry codes (the electrochem library's, plus sodium-ion) → the family their UN numbers belong to. */
const FAMILY_OF_CHEMISTRY: Readonly<Record<string, DgFamily>> = {
	LCO: 'lithium_ion',
	NMC: 'lithium_ion',
	NCA: 'lithium_ion',
	LMO: 'lithium_ion',
	LFP: 'lithium_ion',
	LTO: 'lithium_ion',
	LIMNO2: 'lithium_metal',
	LISOCL2: 'lithium_metal',
	SIB: 'sodium_ion'
};

export function dgFamilyOf(chemistry: string): DgFamily | null {
	return FAMILY_OF_CHEMISTRY[chemistry.toUpperCase()] ?? null;
}

/**
 * UN numbers by family: batteries on their own, and batteries with or in equipment. UN Model
 * Regulations, Dangerous Goods List (UN 3551/3552 since the 23rd revised edition, 2023; from memory).
 */
const UN_OF_FAMILY: Readonly<Record<DgFamily, { alone: UnNumber; equipment: UnNumber }>> = {
	lithium_ion: { alone: 'UN3480', equipment: 'UN3481' },
	lithium_metal: { alone: 'UN3090', equipment: 'UN3091' },
	sodium_ion: { alone: 'UN3551', equipment: 'UN3552' }
};

export function unNumberFor(family: DgFamily, packing: Packing): UnNumber {
	return packing === 'alone' ? UN_OF_FAMILY[family].alone : UN_OF_FAMILY[family].equipment;
}

export function familyOfUnNumber(un: string): DgFamily | null {
	for (const [family, pair] of Object.entries(UN_OF_FAMILY) as Array<[DgFamily, { alone: UnNumber; equipment: UnNumber }]>) {
		if (pair.alone === un || pair.equipment === un) return family;
	}
	return null;
}

/** What a rule asks of the state of charge. `above_wh`: the rule applies only to cells/batteries above this energy. */
export type SocRule = { kind: 'limit'; limit: number; above_wh?: number } | { kind: 'recommended'; limit: number } | { kind: 'none' };

export interface DgRule {
	regulation: string;
	/** Short edition label used in the rule's name, e.g. "67th ed.". */
	edition: string;
	/** First day the edition is in force, ISO date. */
	effective: string;
	instruction: string;
	mode: 'air' | 'surface';
	un_numbers: readonly UnNumber[];
	packing: readonly Packing[];
	soc: SocRule;
	cargo_aircraft_only: boolean;
	/** The rule in plain words, shown beside the verdict. */
	summary: string;
	/** Where the row comes from and how sure it is. */
	basis: string;
}

const IATA_67 = { regulation: 'IATA DGR', edition: '67th ed.', effective: '2026-01-01', mode: 'air' } as const;
const FROM_MEMORY_IATA = 'IATA Dangerous Goods Regulations, 67th edition (2026), from memory: check the current edition.';
const AIR_SOC_LIMIT = 0.3;

export const DG_RULES: readonly DgRule[] = [
	{
		...IATA_67,
		instruction: 'PI 965',
		un_numbers: ['UN3480'],
		packing: ['alone'],
		soc: { kind: 'limit', limit: AIR_SOC_LIMIT },
		cargo_aircraft_only: true,
		summary: 'Lithium-ion cells and batteries on their own: at most 30 % state of charge; cargo aircraft only.',
		basis: `${FROM_MEMORY_IATA} The 30 % limit and the ban on passenger aircraft date from 1 April 2016.`
	},
	{
		...IATA_67,
		instruction: 'PI 966',
		un_numbers: ['UN3481'],
		packing: ['with_equipment'],
		soc: { kind: 'limit', limit: AIR_SOC_LIMIT, above_wh: 2.7 },
		cargo_aircraft_only: false,
		summary: 'Lithium-ion cells and batteries packed with equipment: at most 30 % state of charge above 2.7 Wh (from 1 January 2026).',
		basis: FROM_MEMORY_IATA
	},
	{
		...IATA_67,
		instruction: 'PI 967',
		un_numbers: ['UN3481'],
		packing: ['in_equipment'],
		soc: { kind: 'recommended', limit: AIR_SOC_LIMIT },
		cargo_aircraft_only: false,
		summary: 'Lithium-ion cells and batteries contained in equipment: 30 % state of charge or less is recommended, not required.',
		basis: FROM_MEMORY_IATA
	},
	{
		...IATA_67,
		instruction: 'PI 968',
		un_numbers: ['UN3090'],
		packing: ['alone'],
		soc: { kind: 'none' },
		cargo_aircraft_only: true,
		summary: 'Lithium metal cells and batteries on their own: cargo aircraft only (forbidden on passenger aircraft).',
		basis: `${FROM_MEMORY_IATA} The ban on passenger aircraft dates from 1 January 2015.`
	},
	{
		...IATA_67,
		instruction: 'PI 969',
		un_numbers: ['UN3091'],
		packing: ['with_equipment'],
		soc: { kind: 'none' },
		cargo_aircraft_only: false,
		summary: 'Lithium metal cells and batteries packed with equipment: no state-of-charge rule.',
		basis: FROM_MEMORY_IATA
	},
	{
		...IATA_67,
		instruction: 'PI 970',
		un_numbers: ['UN3091'],
		packing: ['in_equipment'],
		soc: { kind: 'none' },
		cargo_aircraft_only: false,
		summary: 'Lithium metal cells and batteries contained in equipment: no state-of-charge rule.',
		basis: FROM_MEMORY_IATA
	},
	{
		...IATA_67,
		instruction: 'PI 976',
		un_numbers: ['UN3551'],
		packing: ['alone'],
		soc: { kind: 'none' },
		cargo_aircraft_only: true,
		summary: 'Sodium-ion cells and batteries on their own: cargo aircraft only; no state-of-charge limit is known to apply.',
		basis: `${FROM_MEMORY_IATA} Sodium-ion instructions PI 976–978 were added with UN 3551/3552 (66th edition, 2025); the absence of an SOC limit is from memory and uncertain.`
	},
	{
		...IATA_67,
		instruction: 'PI 977',
		un_numbers: ['UN3552'],
		packing: ['with_equipment'],
		soc: { kind: 'none' },
		cargo_aircraft_only: false,
		summary: 'Sodium-ion cells and batteries packed with equipment: no state-of-charge limit is known to apply.',
		basis: `${FROM_MEMORY_IATA} Uncertain: confirm the sodium-ion instructions in the current edition.`
	},
	{
		...IATA_67,
		instruction: 'PI 978',
		un_numbers: ['UN3552'],
		packing: ['in_equipment'],
		soc: { kind: 'none' },
		cargo_aircraft_only: false,
		summary: 'Sodium-ion cells and batteries contained in equipment: no state-of-charge limit is known to apply.',
		basis: `${FROM_MEMORY_IATA} Uncertain: confirm the sodium-ion instructions in the current edition.`
	},
	{
		regulation: 'UN Model Regulations',
		edition: '23rd rev. ed.',
		effective: '2023-07-01',
		mode: 'surface',
		instruction: 'P903',
		un_numbers: UN_NUMBERS,
		packing: PACKINGS,
		soc: { kind: 'none' },
		cargo_aircraft_only: false,
		summary: 'By sea, road or rail: packing instruction P903 and the modal codes (IMDG, ADR, RID); no state-of-charge limit.',
		basis:
			'UN Recommendations on the Transport of Dangerous Goods, Model Regulations, 23rd revised edition (2023), P903; from memory, including the date.'
	}
];

/** The rule's name as the evaluation, lot page and report show it, e.g. "IATA DGR 67th ed. PI 966". */
export function dgRuleName(rule: DgRule): string {
	return `${rule.regulation} ${rule.edition} ${rule.instruction}`;
}

export interface DgShipment {
	transport: 'air' | 'sea' | 'road' | 'rail';
	/** The lot's UN number; when absent it follows from the chemistry's family and the packing. */
	un_number: string | null;
	packing: Packing;
	family: DgFamily | null;
	/** Energy of one cell or battery of the part (nominal voltage × capacity), Wh; null when unknown. */
	energy_wh: number | null;
	/** The day the rules are taken from (ISO date); absent: the latest rows. */
	on?: string;
}

/** The UN number a shipment travels under: the recorded one, or the one its family and packing imply. */
export function shipmentUnNumber(s: Pick<DgShipment, 'un_number' | 'packing' | 'family'>): UnNumber | null {
	if (s.un_number && (UN_NUMBERS as readonly string[]).includes(s.un_number)) return s.un_number as UnNumber;
	return s.family ? unNumberFor(s.family, s.packing) : null;
}

/** The rule in force for this shipment, or null when none of the table's UN numbers applies. */
export function findDgRule(s: DgShipment): DgRule | null {
	const un = shipmentUnNumber(s);
	if (!un) return null;
	const mode = s.transport === 'air' ? 'air' : 'surface';
	const candidates = DG_RULES.filter(
		(r) => r.mode === mode && r.un_numbers.includes(un) && r.packing.includes(s.packing) && (!s.on || r.effective <= s.on)
	);
	// Latest effective date wins: a new edition's row replaces the old one from its date.
	return candidates.reduce<DgRule | null>((best, r) => (best === null || r.effective > best.effective ? r : best), null);
}

/** True when the rule's SOC limit binds this shipment (an unknown energy is treated as above the threshold). */
export function socLimitBinds(rule: DgRule, energyWh: number | null): boolean {
	if (rule.soc.kind !== 'limit') return false;
	return rule.soc.above_wh === undefined || energyWh === null || energyWh > rule.soc.above_wh;
}

/** The SOC figures of one unit the DG rules read: the estimate and its 95 % interval. */
export interface DgUnit {
	serial: string;
	soc: number;
	soc_low: number;
	soc_high: number;
	determinate: boolean;
}

export interface DgFinding {
	code: 'dg_soc_over_limit' | 'dg_soc_unverified' | 'dg_note';
	severity: 'hold' | 'info';
	message: string;
	units?: string[];
}

const pct = (x: number) => `${Math.round(x * 100)} %`;
const DEFER = "Check the current dangerous-goods regulations and the site's procedure before any onward shipment or return.";

/**
 * Where one reading stands against an SOC limit. An estimate above the limit is over it. An estimate
 * at or below it whose interval still reaches above, or an indeterminate reading that is not wholly
 * above, does not show compliance. The bench's per-row feedback uses the same test.
 */
export function socStanding(u: Omit<DgUnit, 'serial'>, limit: number): 'over' | 'unverified' | 'within' {
	if (u.determinate ? u.soc > limit : u.soc_low > limit) return 'over';
	if (!u.determinate || u.soc_high > limit) return 'unverified';
	return 'within';
}

function splitBySoc(units: readonly DgUnit[], limit: number) {
	const over = units.filter((u) => socStanding(u, limit) === 'over');
	const unverified = units.filter((u) => socStanding(u, limit) === 'unverified');
	return { over: over.map((u) => u.serial), unverified: unverified.map((u) => u.serial) };
}

function limitFindings(rule: DgRule, limit: number, declared: number | null, units: readonly DgUnit[]): DgFinding[] {
	const name = dgRuleName(rule);
	const { over, unverified } = splitBySoc(units, limit);
	const declaredOver = declared !== null && declared > limit;
	const findings: DgFinding[] = [];
	if (over.length > 0 || declaredOver) {
		const what = over.length > 0 ? `${over.length} unit(s) estimated above ${pct(limit)} SOC` : `declared SOC ${pct(declared ?? 0)}`;
		findings.push({
			code: 'dg_soc_over_limit',
			severity: 'hold',
			message: `${name}: ${what}, above the ${pct(limit)} limit. ${DEFER}`,
			units: over.length > 0 ? over : undefined
		});
	}
	if (unverified.length > 0) {
		findings.push({
			code: 'dg_soc_unverified',
			severity: 'hold',
			message:
				`${name}: for ${unverified.length} unit(s) the reading does not show SOC at or below ${pct(limit)} ` +
				`(the estimate or its interval reaches above it), so compliance is not shown. ` +
				`An approved part model fitted to the supplier's curve or a reading after a longer rest would narrow the interval.`,
			units: unverified
		});
	}
	return findings;
}

/** The findings of the rule for this lot: SOC holds where a limit binds, notes where the rule only advises. */
export function dgFindings(rule: DgRule | null, shipment: DgShipment, declared: number | null, units: readonly DgUnit[]): DgFinding[] {
	if (!rule) return [];
	const name = dgRuleName(rule);
	const findings: DgFinding[] = [];
	if (socLimitBinds(rule, shipment.energy_wh) && rule.soc.kind === 'limit') {
		findings.push(...limitFindings(rule, rule.soc.limit, declared, units));
	} else if (rule.soc.kind === 'recommended') {
		findings.push({
			code: 'dg_note',
			severity: 'info',
			message: `${name} recommends at most ${pct(rule.soc.limit)} SOC for cells and batteries contained in equipment; it is not required. ${DEFER}`
		});
	} else if (rule.soc.kind === 'limit' && rule.soc.above_wh !== undefined) {
		findings.push({
			code: 'dg_note',
			severity: 'info',
			message: `${name}: at ${(shipment.energy_wh ?? 0).toFixed(1)} Wh the part is at or below ${rule.soc.above_wh} Wh, so the ${pct(rule.soc.limit)} SOC limit does not apply. ${DEFER}`
		});
	}
	if (rule.cargo_aircraft_only) {
		findings.push({
			code: 'dg_note',
			severity: 'info',
			message: `${name}: cells and batteries shipped on their own go on cargo aircraft only, never on passenger aircraft. ${DEFER}`
		});
	}
	return findings;
}

/** What the evaluation reports about the DG rule it applied. */
export interface DgSummary {
	/** e.g. "IATA DGR 67th ed. PI 966"; null when no rule of the table applies. */
	rule: string | null;
	un_number: UnNumber | null;
	packing: Packing;
	soc_rule: SocRule['kind'] | null;
	/** The SOC limit that binds this shipment (0.3 under PI 965, or PI 966 above 2.7 Wh), else null. */
	soc_limit: number | null;
	summary: string | null;
	basis: string | null;
}

export function dgSummary(rule: DgRule | null, shipment: DgShipment): DgSummary {
	return {
		rule: rule ? dgRuleName(rule) : null,
		un_number: shipmentUnNumber(shipment),
		packing: shipment.packing,
		soc_rule: rule ? (socLimitBinds(rule, shipment.energy_wh) ? 'limit' : rule.soc.kind === 'recommended' ? 'recommended' : 'none') : null,
		soc_limit: rule && socLimitBinds(rule, shipment.energy_wh) && rule.soc.kind === 'limit' ? rule.soc.limit : null,
		summary: rule?.summary ?? null,
		basis: rule?.basis ?? null
	};
}

/**
 * The documents a new part of this chemistry asks for by default: always the certificate of
 * conformity; for lithium (ion and metal) and sodium-ion cells also the UN 38.3 test summary
 * (UN Model Regulations 2.9.4 for lithium; 2.9.5 for sodium-ion, from memory).
 */
export function defaultRequiredDocuments(chemistry: string): Array<'coc' | 'un38_3_summary' | 'sds'> {
	return dgFamilyOf(chemistry) ? ['coc', 'un38_3_summary'] : ['coc'];
}
