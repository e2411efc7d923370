// Library models: shape, monotonicity, windows and round trips. Window values are compared with
// trade rules of thumb (marked common practice) or recalled handbook values (marked from memory).
import { describe, expect, it } from 'vitest';
import {
	CHEMISTRY_CODES,
	ElectrochemError,
	type ChemistryCode,
	curve,
	evaluateReadings,
	getLibraryModel,
	invertSoc,
	isChemistryCode,
	leadAcidOcvFromSpecificGravity,
	listChemistries,
	ocvAt,
	validateModel
} from '../../../src/lib/electrochem';

const grid = (n: number) => Array.from({ length: n + 1 }, (_, i) => i / n);

describe('every library model', () => {
	it.each(CHEMISTRY_CODES)('%s is strictly increasing over [0, 1] at 25 °C', (code) => {
		// inversion needs a one-to-one OCV(z): OCV rises with charge for every cell chemistry (Nernst equation)
		const m = getLibraryModel(code);
		const pts = curve(m, 25, 2001);
		for (let i = 1; i < pts.length; i++) expect(pts[i].ocv_v).toBeGreaterThan(pts[i - 1].ocv_v);
	});

	it.each(CHEMISTRY_CODES)('%s curve ends match its stored window within 2 mV and stays inside it', (code) => {
		// windows are the chemistry's rested empty/full voltages (common practice, see per-chemistry tests)
		const m = getLibraryModel(code);
		expect(Math.abs(ocvAt(m, 0) - m.ocv_empty_v)).toBeLessThan(0.002);
		expect(Math.abs(ocvAt(m, 1) - m.ocv_full_v)).toBeLessThan(0.002);
		for (const z of grid(100)) {
			expect(ocvAt(m, z)).toBeGreaterThan(m.ocv_empty_v - 0.002);
			expect(ocvAt(m, z)).toBeLessThan(m.ocv_full_v + 0.002);
		}
		expect(m.min_safe_v).toBeLessThanOrEqual(m.ocv_empty_v);
		expect(m.max_v).toBeGreaterThanOrEqual(m.ocv_full_v);
	});

	it.each(CHEMISTRY_CODES)('%s round-trips SOC → OCV → SOC within 0.005 at 25 °C and 35 °C', (code) => {
		// an exact inverse of a monotonic function (intermediate value theorem); σ only widens the interval
		const m = getLibraryModel(code);
		for (const t of [25, 35]) {
			for (const z of grid(50)) {
				const inv = invertSoc(m, ocvAt(m, z, t), t, 0.005);
				expect(Math.abs(inv.soc - z)).toBeLessThan(0.005);
				expect(inv.soc_low).toBeLessThanOrEqual(inv.soc + 1e-12);
				expect(inv.soc_high).toBeGreaterThanOrEqual(inv.soc - 1e-12);
			}
		}
	});

	it.each(CHEMISTRY_CODES)('%s is JSON data with a source note and passes validateModel', (code) => {
		// models are stored as JSON rows; source notes name a publication, "common practice" or "from memory"
		const m = getLibraryModel(code);
		const copy = JSON.parse(JSON.stringify(m));
		expect(copy).toEqual(m);
		const valid = validateModel(copy);
		expect(valid).not.toBeNull();
		if (valid) expect(ocvAt(valid, 0.37)).toBeCloseTo(ocvAt(m, 0.37), 12);
		expect(m.source).toMatch(/from memory|common practice|J\. Power Sources|Plett/);
		expect(m.sigma_model_v).toBeGreaterThan(0);
		expect(m.temperature_range_c[0]).toBeLessThan(25);
		expect(m.temperature_range_c[1]).toBeGreaterThan(25);
	});
});

describe('library lookup', () => {
	it('lists all thirteen chemistries with their limits', () => {
		// the twelve codes of the product's chemistry list (Restvolt issue text) and sodium-ion (issue 15)
		const list = listChemistries();
		expect(list.map((c) => c.code)).toEqual([...CHEMISTRY_CODES]);
		expect(list).toHaveLength(13);
		const lfp = list.find((c) => c.code === 'LFP');
		expect(lfp?.max_v).toBe(3.65);
	});

	it('rejects unknown codes', () => {
		// the code set is closed: unknown codes must not silently map to a default model
		expect(isChemistryCode('NMC')).toBe(true);
		expect(isChemistryCode('nmc')).toBe(false);
		expect(isChemistryCode(42)).toBe(false);
		expect(() => getLibraryModel('XYZ' as ChemistryCode)).toThrow(ElectrochemError);
	});

	it('returns copies so callers cannot change the library', () => {
		// models are data; a caller's edit must not leak into other requests
		const a = getLibraryModel('NMC');
		a.max_v = 99;
		expect(getLibraryModel('NMC').max_v).not.toBe(99);
	});

	it('flags lithium-ion and primary chemistries correctly', () => {
		// LCO NMC NCA LMO LFP LTO are lithium-ion intercalation chemistries; alkaline, Li-MnO2 and
		// Li-SOCl2 are primary (non-rechargeable) cells (common practice, IEC 60086 / IEC 62133 scope)
		const li = CHEMISTRY_CODES.filter((c) => getLibraryModel(c).lithium_ion);
		expect(li).toEqual(['LCO', 'NMC', 'NCA', 'LMO', 'LFP', 'LTO']);
		const primaries = CHEMISTRY_CODES.filter((c) => !getLibraryModel(c).rechargeable);
		expect(primaries).toEqual(['ALKALINE', 'LIMNO2', 'LISOCL2']);
		for (const c of primaries) expect(getLibraryModel(c).soc_meaning).toBe('capacity_remaining');
		for (const c of li) expect(getLibraryModel(c).soc_meaning).toBe('state_of_charge');
	});
});

describe('chemistry windows against rules of thumb', () => {
	it('NMC: 3.0 V empty, 4.18 V full, 3.65–3.70 V at 50 %, limits 2.5–3.0 V / 4.2 V', () => {
		// common practice: 4.20 V charge limit (+≤50 mV tolerance), 2.5–3.0 V discharge floor, nominal 3.6–3.7 V
		const m = getLibraryModel('NMC');
		expect(m.ocv_empty_v).toBe(3.0);
		expect(m.ocv_full_v).toBeCloseTo(4.18, 2);
		expect(ocvAt(m, 0.5)).toBeGreaterThanOrEqual(3.65);
		expect(ocvAt(m, 0.5)).toBeLessThanOrEqual(3.7);
		expect(m.min_safe_v).toBeGreaterThanOrEqual(2.5);
		expect(m.min_safe_v).toBeLessThanOrEqual(3.0);
		expect(m.max_v).toBeGreaterThanOrEqual(4.2);
		expect(m.max_v).toBeLessThanOrEqual(4.25);
	});

	it('LCO, NCA, LMO share the 4.2 V family limits', () => {
		// common practice for 4.2 V lithium-ion cells
		for (const c of ['LCO', 'NCA', 'LMO'] as const) {
			const m = getLibraryModel(c);
			expect(m.max_v).toBeGreaterThanOrEqual(4.2);
			expect(m.max_v).toBeLessThanOrEqual(4.25);
			expect(m.ocv_full_v).toBeGreaterThan(4.15);
			expect(m.nominal_v).toBeGreaterThanOrEqual(3.6);
			expect(m.nominal_v).toBeLessThanOrEqual(3.7);
		}
	});

	it('LFP: 2.5–3.6 V window, 3.65 V max, flat 3.24–3.35 V plateau from 15 % to 90 %', () => {
		// common practice: LFP 3.65 V charge limit, 2.5 V discharge floor, nominal 3.2 V, ≈3.3 V plateau
		const m = getLibraryModel('LFP');
		expect(m.ocv_empty_v).toBe(2.5);
		expect(m.ocv_full_v).toBe(3.6);
		expect(m.max_v).toBe(3.65);
		expect(m.nominal_v).toBe(3.2);
		for (let z = 0.15; z <= 0.9001; z += 0.05) {
			expect(ocvAt(m, z)).toBeGreaterThan(3.24);
			expect(ocvAt(m, z)).toBeLessThan(3.345);
		}
		expect(m.sigma_model_v).toBeGreaterThanOrEqual(0.01);
		expect(m.ocv_information).toBe('poor');
	});

	it('LTO: roughly 1.8–2.7 V with a 2.3 V nominal', () => {
		// common practice: lithium-titanate cells 2.3–2.4 V nominal, 1.5–1.8 V to 2.7–2.85 V
		const m = getLibraryModel('LTO');
		expect(ocvAt(m, 0)).toBeCloseTo(1.8, 2);
		expect(ocvAt(m, 1)).toBeCloseTo(2.7, 2);
		expect(m.nominal_v).toBe(2.3);
	});

	it('NiMH and NiCd: nominal 1.2 V, rested OCV about 1.15–1.45 V', () => {
		// nominal 1.2 V per cell (common practice; IEC 61951 cell designations, from memory)
		for (const c of ['NIMH', 'NICD'] as const) {
			const m = getLibraryModel(c);
			expect(m.nominal_v).toBe(1.2);
			expect(ocvAt(m, 0)).toBeGreaterThanOrEqual(1.14);
			expect(ocvAt(m, 1)).toBeLessThanOrEqual(1.46);
			expect(m.form).toBe('redlich_kister');
		}
	});

	it('lead-acid: OCV per cell = SG + 0.84 V, 12 V block 12.6–12.75 V full, ≈11.8 V empty', () => {
		// common practice: rest voltage per cell ≈ specific gravity + 0.84; 12.6–12.7 V for a full 12 V block
		const m = getLibraryModel('PBACID');
		expect(leadAcidOcvFromSpecificGravity(1.265)).toBeCloseTo(2.105, 10);
		expect(6 * ocvAt(m, 1)).toBeGreaterThanOrEqual(12.6);
		expect(6 * ocvAt(m, 1)).toBeLessThanOrEqual(12.75);
		expect(6 * ocvAt(m, 0)).toBeGreaterThan(11.7);
		expect(6 * ocvAt(m, 0)).toBeLessThan(11.9);
		// specific gravity taken as linear in state of charge (common practice) → OCV linear in z
		const mid = (ocvAt(m, 0) + ocvAt(m, 1)) / 2;
		expect(ocvAt(m, 0.5)).toBeCloseTo(mid, 6);
		// The deep-discharge threshold is a REST voltage: 1.95 V/cell = 11.7 V per block (OCV ≈ SG + 0.84 at SG ≈ 1.11,
		// below a discharged cell's SG ≈ 1.12; Linden's Handbook of Batteries, lead-acid chapter, from memory). The
		// 10.5 V often quoted is the end of discharge under load, so a block resting at 11.4 V must be flagged.
		expect(6 * m.min_safe_v).toBeCloseTo(11.7, 6);
	});
	it('a 12 V lead-acid block resting at 11.4 V is flagged deep-discharged; one at 12.0 V is not', () => {
		const m = getLibraryModel('PBACID');
		const [low, ok] = evaluateReadings(
			m,
			[
				{ ocv_v: 11.4, temperature_c: 25 },
				{ ocv_v: 12.0, temperature_c: 25 }
			],
			{ cells_in_series: 6 }
		);
		expect(low.flags).toContain('deep_discharge');
		expect(ok.flags).not.toContain('deep_discharge');
	});

	it('alkaline 1.05–1.6 V, Li-MnO2 coin 2.8–3.3 V, Li-SOCl2 3.60–3.67 V', () => {
		// common practice: fresh alkaline ≈1.6 V OCV, Li-MnO2 3.0 V nominal, Li-SOCl2 3.6 V nominal with ≈3.67 V OCV
		const alk = getLibraryModel('ALKALINE');
		expect(ocvAt(alk, 1)).toBeCloseTo(1.6, 2);
		expect(ocvAt(alk, 0)).toBeGreaterThanOrEqual(1.0);
		const coin = getLibraryModel('LIMNO2');
		expect(coin.nominal_v).toBe(3.0);
		expect(ocvAt(coin, 0.5)).toBeGreaterThan(3.0);
		expect(ocvAt(coin, 0.5)).toBeLessThan(3.15);
		const soc = getLibraryModel('LISOCL2');
		expect(ocvAt(soc, 1) - ocvAt(soc, 0)).toBeLessThan(0.08);
		expect(soc.ocv_information).toBe('none');
	});
});
