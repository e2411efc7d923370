// The dangerous-goods rules table and the SOC rule on the interval. Sources, each from memory (no copy of
// the texts at hand): IATA Dangerous Goods Regulations 67th edition (2026) packing instructions 965–970 and
// the sodium-ion instructions 976–978; UN Model Regulations 23rd revised edition (2023), P903 and the
// Dangerous Goods List entries UN 3480/3481/3090/3091/3551/3552.
import { describe, expect, it } from 'vitest';
import {
	DG_RULES,
	defaultRequiredDocuments,
	dgFindings,
	dgRuleName,
	findDgRule,
	type DgShipment,
	type DgUnit
} from '../../../src/lib/inspection/dangerous-goods';

const air = (o: Partial<DgShipment>): DgShipment => ({
	transport: 'air',
	un_number: null,
	packing: 'alone',
	family: 'lithium_ion',
	energy_wh: 10,
	...o
});
const unit = (serial: string, soc: number, low: number, high: number, determinate = true): DgUnit => ({
	serial,
	soc,
	soc_low: low,
	soc_high: high,
	determinate
});
const ruleOf = (s: DgShipment) => {
	const r = findDgRule(s);
	return r ? dgRuleName(r) : null;
};

describe('DG rules table', () => {
	it('every row names its regulation, edition, effective date and basis', () => {
		for (const r of DG_RULES) {
			expect(r.regulation).not.toBe('');
			expect(r.edition).toMatch(/ed\./);
			expect(r.effective).toMatch(/^\d{4}-\d{2}-\d{2}$/);
			expect(r.basis).toMatch(/from memory/);
		}
	});
	it('air: UN number and packing select the IATA DGR 67th ed. instruction (PI 965–970, 976–978)', () => {
		expect(ruleOf(air({ packing: 'alone' }))).toBe('IATA DGR 67th ed. PI 965');
		expect(ruleOf(air({ packing: 'with_equipment' }))).toBe('IATA DGR 67th ed. PI 966');
		expect(ruleOf(air({ packing: 'in_equipment' }))).toBe('IATA DGR 67th ed. PI 967');
		expect(ruleOf(air({ family: 'lithium_metal', packing: 'alone' }))).toBe('IATA DGR 67th ed. PI 968');
		expect(ruleOf(air({ un_number: 'UN3091', packing: 'with_equipment' }))).toBe('IATA DGR 67th ed. PI 969');
		expect(ruleOf(air({ un_number: 'UN3091', packing: 'in_equipment' }))).toBe('IATA DGR 67th ed. PI 970');
		expect(ruleOf(air({ family: 'sodium_ion', packing: 'alone' }))).toBe('IATA DGR 67th ed. PI 976');
		expect(ruleOf(air({ un_number: 'UN3552', packing: 'in_equipment' }))).toBe('IATA DGR 67th ed. PI 978');
	});
	it('sea, road and rail: UN Model Regulations P903, no SOC rule; no UN number: no rule', () => {
		expect(ruleOf(air({ transport: 'sea' }))).toBe('UN Model Regulations 23rd rev. ed. P903');
		expect(ruleOf(air({ family: null }))).toBeNull();
	});
	it('a rule applies only from its effective date', () => {
		expect(findDgRule(air({ on: '2025-12-31' }))).toBeNull();
		expect(ruleOf(air({ on: '2026-01-01' }))).toBe('IATA DGR 67th ed. PI 965');
	});
});

describe('SOC rule on the interval (IATA DGR 67th ed. PI 965/966, ≤ 30 % SOC)', () => {
	const findings = (s: DgShipment, units: DgUnit[], declared: number | null = 0.25) => dgFindings(findDgRule(s), s, declared, units);
	const codes = (s: DgShipment, units: DgUnit[], declared?: number | null) => findings(s, units, declared).map((f) => f.code);

	it('estimate above 30 % → dg_soc_over_limit (hold)', () => {
		const f = findings(air({}), [unit('A', 0.35, 0.25, 0.45)]);
		expect(f[0]).toMatchObject({ code: 'dg_soc_over_limit', severity: 'hold', units: ['A'] });
		expect(f[0].message).toMatch(/PI 965/);
	});
	it('estimate at or below 30 % but upper bound above → dg_soc_unverified (hold) naming what would show it', () => {
		const f = findings(air({}), [unit('A', 0.28, 0.2, 0.36)]);
		expect(f[0]).toMatchObject({ code: 'dg_soc_unverified', severity: 'hold', units: ['A'] });
		expect(f[0].message).toMatch(/part model/);
		expect(f[0].message).toMatch(/rest/);
	});
	it('an indeterminate SOC never passes: unverified unless wholly above', () => {
		expect(codes(air({}), [unit('A', 0.1, 0.0, 0.9, false)])).toContain('dg_soc_unverified');
		expect(codes(air({}), [unit('A', 0.6, 0.4, 0.9, false)])).toContain('dg_soc_over_limit');
	});
	it('interval wholly at or below 30 % → no SOC finding', () => {
		expect(codes(air({}), [unit('A', 0.2, 0.15, 0.29)])).toEqual(['dg_note']); // PI 965 cargo aircraft only
	});
	it('PI 966 binds above 2.7 Wh only (nominal voltage × capacity)', () => {
		const over = [unit('A', 0.5, 0.45, 0.55)];
		expect(codes(air({ packing: 'with_equipment', energy_wh: 3.7 * 2.5 }), over)).toEqual(['dg_soc_over_limit']);
		expect(codes(air({ packing: 'with_equipment', energy_wh: 3.7 * 0.5 }), over)).toEqual(['dg_note']);
	});
	it('PI 967 recommends, never holds; lithium metal alone by air → cargo aircraft only note', () => {
		const f = findings(air({ packing: 'in_equipment' }), [unit('A', 0.5, 0.45, 0.55)]);
		expect(f).toEqual([expect.objectContaining({ code: 'dg_note', severity: 'info' })]);
		expect(f[0].message).toMatch(/recommends/);
		const metal = findings(air({ family: 'lithium_metal' }), [unit('A', 0.9, 0.8, 1)]);
		expect(metal.map((x) => x.code)).toEqual(['dg_note']);
		expect(metal[0].message).toMatch(/cargo aircraft only/);
	});
	it('declared SOC above 30 % holds even before readings', () => {
		expect(codes(air({}), [], 0.5)).toContain('dg_soc_over_limit');
	});
});

describe('default required documents (UN Model Regulations 2.9.4: UN 38.3 for every lithium cell, from memory)', () => {
	it('lithium-ion and lithium metal ask for the UN 38.3 summary; others the CoC only', () => {
		expect(defaultRequiredDocuments('NMC')).toEqual(['coc', 'un38_3_summary']);
		expect(defaultRequiredDocuments('LISOCL2')).toEqual(['coc', 'un38_3_summary']);
		expect(defaultRequiredDocuments('PBACID')).toEqual(['coc']);
	});
});
