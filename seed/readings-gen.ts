/**
 * Demo readings generated from the library OCV models, so the demo's verdicts come from the same
 * physics the server checks with. Deterministic (seeded), invented serial numbers.
 */
import { getLibraryModel, ocvAt } from '../src/lib/electrochem';
import type { Finding } from './lot-plan';
import type { SeededPart } from './parts';
import { mulberry32, standardNormal } from './random';

/** Seeded uniform and normal draws, so every seed run produces the same readings. */
function prng(seed: number) {
	const next = mulberry32(seed);
	return { next, normal: () => standardNormal(next) };
}

export interface DemoReading {
	serial: string;
	ocv_v: number;
	temperature_c: number;
	ac_resistance_mohm: number | null;
	measured_at: string;
	/** Packs read with their BMS: one voltage per cell group. */
	cell_group_voltages?: number[];
}

const clampSoc = (z: number) => Math.min(0.99, Math.max(0.02, z));

function unitSoc(finding: Finding, declared: number, i: number, n: number, normal: () => number, spread: number): number {
	switch (finding) {
		case 'air_soc_high':
			return clampSoc(0.5 + 0.012 * normal());
		case 'declared_mismatch':
			return clampSoc(0.12 + 0.015 * normal());
		case 'mixed_lot':
			return clampSoc((i < n / 2 ? declared : declared + 0.18) + 0.01 * normal());
		default:
			return clampSoc(declared + spread * normal());
	}
}

/** Per-cell OCV for unit i, including the finding's odd units. */
function cellOcv(part: SeededPart, finding: Finding, soc: number, tempC: number, i: number, normal: () => number): number {
	const model = getLibraryModel(part.chemistry);
	if (finding === 'deep_discharge' && i === 2) return model.min_safe_v - 0.4 + 0.01 * normal();
	if (finding === 'over_window' && i % 9 === 1) return model.ocv_empty_v - 0.03 + 0.003 * normal();
	return ocvAt(model, soc, tempC) + 0.0015 * normal();
}

/**
 * The groups of one pack around its cell OCV (±2 mV); with `weak`, the sixth group rests 0.4 V below
 * the chemistry's minimum while the other groups sit a little higher, so the pack total still looks normal.
 */
function cellGroups(part: SeededPart, cellV: number, weak: boolean, normal: () => number): number[] {
	const groups = Array.from({ length: part.series }, () => cellV + 0.002 * normal());
	if (weak && part.series >= 6) {
		const low = getLibraryModel(part.chemistry).min_safe_v - 0.4;
		const lift = (groups[5] - low) / (part.series - 1);
		groups.forEach((_, g) => (groups[g] = g === 5 ? low : groups[g] + lift));
	}
	return groups.map((v) => Math.round(v * 10000) / 10000);
}

export function demoReadings(part: SeededPart, finding: Finding, declared: number, count: number, seed: number, at: Date): DemoReading[] {
	const { next, normal } = prng(seed);
	// Fresh primary cells come out of one production run far more alike than stored secondaries.
	const spread = getLibraryModel(part.chemistry).rechargeable ? 0.015 : 0.004;
	const prefix = part.partNumber.replace(/[^A-Z0-9]/g, '').slice(0, 6);
	return Array.from({ length: count }, (_, i) => {
		const tempC = Math.round((21.5 + 2 * next()) * 10) / 10;
		const soc = unitSoc(finding, declared, i, count, normal, spread);
		const cellV = cellOcv(part, finding, soc, tempC, i, normal);
		const groups = finding === 'weak_cell_group' ? cellGroups(part, cellV, i === 2, normal) : null;
		// With groups, the pack reads their sum (as the meter and the BMS agree).
		const pack = groups ? groups.reduce((a, v) => a + v, 0) : cellV * part.series;
		return {
			...(groups ? { cell_group_voltages: groups } : {}),
			serial: `${prefix}-${String(seed % 1000).padStart(3, '0')}-${String(i + 1).padStart(5, '0')}`,
			ocv_v: Math.round(pack * 10000) / 10000,
			temperature_c: tempC,
			ac_resistance_mohm: part.chemistry === 'PBACID' ? null : Math.round((18 + 4 * next()) * part.series * 10) / 10,
			measured_at: new Date(at.getTime() + i * 45_000).toISOString()
		};
	});
}
