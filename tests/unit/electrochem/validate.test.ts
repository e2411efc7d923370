// A model read back from JSON (a database row, an API body) is checked field by field; the optional
// uncertainty fields (sigma_model_soc_curve, hysteresis_half_v, plateau, determinate_width) are refused
// by name when bad, and kept when good.
import { describe, expect, it } from 'vitest';
import { checkModel, getLibraryModel, validateModel } from '../../../src/lib/electrochem';

const roundTrip = <T>(x: T): T => JSON.parse(JSON.stringify(x));
const LFP = roundTrip(getLibraryModel('LFP'));
const NMC = roundTrip(getLibraryModel('NMC'));

function fieldOf(x: unknown): string | null {
	const r = checkModel(x);
	return r.ok ? null : r.error.field;
}

describe('checkModel', () => {
	it('keeps every library model whole, the optional fields included', () => {
		for (const model of [LFP, NMC]) {
			const r = checkModel(model);
			expect(r.ok).toBe(true);
			if (r.ok) expect(r.value).toEqual(model);
		}
		expect(validateModel(LFP)?.plateau).toEqual([0.2, 0.9]);
	});

	it.each([
		['a plateau outside 0–1', { ...LFP, plateau: [0.2, 1.5] }, 'plateau'],
		['a plateau ending before it starts', { ...LFP, plateau: [0.9, 0.2] }, 'plateau'],
		['a plateau of one number', { ...LFP, plateau: [0.5] }, 'plateau'],
		[
			'a negative hysteresis',
			{
				...LFP,
				hysteresis_half_v: [
					[0, -0.01],
					[1, 0.01]
				]
			},
			'hysteresis_half_v'
		],
		[
			'a hysteresis in mV instead of V',
			{
				...LFP,
				hysteresis_half_v: [
					[0, 15],
					[1, 15]
				]
			},
			'hysteresis_half_v'
		],
		[
			'a hysteresis table with falling SOC',
			{
				...LFP,
				hysteresis_half_v: [
					[0.5, 0.01],
					[0.2, 0.01]
				]
			},
			'hysteresis_half_v'
		],
		['a sigma curve with a text value', { ...NMC, sigma_model_soc_curve: [[0, '0.05']] }, 'sigma_model_soc_curve'],
		[
			'a sigma curve in percent',
			{
				...NMC,
				sigma_model_soc_curve: [
					[0, 5],
					[1, 5]
				]
			},
			'sigma_model_soc_curve'
		],
		['a sigma curve that is not a table', { ...NMC, sigma_model_soc_curve: 0.05 }, 'sigma_model_soc_curve'],
		['a determinate width of 0', { ...NMC, determinate_width: 0 }, 'determinate_width'],
		['a determinate width in percent', { ...NMC, determinate_width: 30 }, 'determinate_width'],
		['a determinate width as text', { ...NMC, determinate_width: '0.3' }, 'determinate_width'],
		['an unknown chemistry', { ...NMC, chemistry: 'XYZ' }, 'chemistry'],
		['an unknown form', { ...NMC, form: 'spline' }, 'form'],
		['params missing a coefficient', { ...NMC, params: { k0: 3 } }, 'params'],
		['an empty voltage window', { ...NMC, ocv_empty_v: 4.2, ocv_full_v: 3.0 }, 'limits'],
		['not an object', [NMC], 'model']
	])('refuses %s, naming the field', (_what, model, field) => {
		expect(fieldOf(model)).toBe(field);
		expect(validateModel(model)).toBeNull();
	});

	it('refuses a curve that falls, since it cannot be inverted', () => {
		const falling = { ...NMC, params: { ...NMC.params, k2: 5 } };
		expect(fieldOf(falling)).toBe('params');
	});

	it('a model without the optional fields stays without them', () => {
		const { sigma_model_soc_curve: _s, determinate_width: _w, ...bare } = NMC;
		const r = checkModel(bare);
		expect(r.ok && r.value.sigma_model_soc_curve === undefined && r.value.determinate_width === undefined).toBe(true);
	});
});
