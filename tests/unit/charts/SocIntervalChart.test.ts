import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import { SocIntervalChart, type SocUnit } from '$lib/components/charts';
import { dataMarkers, elements, num, textNodes, texts } from './svg';

// Invented demo units. Every fourth unit has an interval too wide to place it and is indeterminate.
function units(count: number): SocUnit[] {
	return Array.from({ length: count }, (_, i) => {
		const soc = 0.1 + ((i * 37) % 80) / 100;
		const determinate = i % 4 !== 0;
		const half = determinate ? 0.03 : 0.2;
		return { serial: `SN-${1000 + i}`, soc, soc_low: Math.max(0, soc - half), soc_high: Math.min(1, soc + half), determinate };
	});
}

// Air limit: IATA DGR Packing Instruction 965, lithium-ion cells/batteries packed on their own
// are shipped at no more than 30 % SOC (from memory; also stated in RULES-FOR-HELPERS.md).
const AIR_LIMIT = 0.3;

describe('SocIntervalChart', () => {
	const twelve = units(12);
	const body = render(SocIntervalChart, { props: { units: twelve, declaredSoc: 0.5, airLimit: AIR_LIMIT } }).body;

	it('labels the SOC axis in percent from 0 % to 100 %', () => {
		const words = texts(body);
		expect(words).toContain('0 %');
		expect(words).toContain('50 %');
		expect(words).toContain('100 %');
		expect(words).toContain('state of charge (%)');
	});

	it('draws one point per unit, hollow for indeterminate ones, with the word in the legend', () => {
		expect(dataMarkers(body)).toHaveLength(12);
		const hollow = dataMarkers(body, 'ring');
		expect(hollow).toHaveLength(twelve.filter((u) => !u.determinate).length);
		expect(hollow.every((m) => m.attrs.fill === 'none' && m.title?.endsWith('indeterminate'))).toBe(true);
		expect(texts(body)).toContain('indeterminate (interval too wide)');
		expect(texts(body)).toContain('SOC estimate with interval');
	});

	it('sorts units so the highest SOC is the top row', () => {
		const points = dataMarkers(body).map((m) => ({ cy: num(m.attrs.cy), cx: num(m.attrs.cx) }));
		const byRow = [...points].sort((a, b) => a.cy - b.cy);
		for (let i = 1; i < byRow.length; i++) expect(byRow[i].cx).toBeLessThanOrEqual(byRow[i - 1].cx);
		const serialsTopDown = texts(body).filter((t) => t.startsWith('SN-'));
		const expected = [...twelve].sort((a, b) => b.soc - a.soc).map((u) => u.serial);
		expect(serialsTopDown).toEqual(expected);
	});

	it('draws the declared SOC and the air limit as labelled vertical lines at the right place', () => {
		const words = texts(body);
		expect(words).toContain('declared SOC 50 %');
		expect(words).toContain('air limit 30 %');
		const tickX = (label: string) => num(textNodes(body).find((t) => t.text === label)?.attrs.x);
		const verticals = elements(body, 'line').filter((l) => l.attrs.x1 === l.attrs.x2 && l.attrs.y1 !== l.attrs.y2);
		const at = (x: number) => verticals.filter((l) => Math.abs(num(l.attrs.x1) - x) < 0.01);
		expect(at(tickX('50 %')).some((l) => l.attrs['stroke-dasharray'] === '6 4')).toBe(true);
		expect(at(tickX('30 %')).some((l) => l.attrs['stroke-width'] === '2')).toBe(true);
	});

	it('leaves out the air limit when it does not apply', () => {
		const ground = render(SocIntervalChart, { props: { units: twelve, declaredSoc: 0.5 } }).body;
		expect(texts(ground).some((t) => t.startsWith('air limit'))).toBe(false);
	});

	it('caps many units at 200 evenly sampled rows and says so', () => {
		const many = render(SocIntervalChart, { props: { units: units(1234), declaredSoc: null, airLimit: AIR_LIMIT } }).body;
		expect(dataMarkers(many)).toHaveLength(200);
		expect(texts(many).some((t) => t.startsWith('showing 200 of 1,234 units'))).toBe(true);
		expect(texts(many)).toContain('#1');
		expect(texts(many)).toContain('#1,234');
	});

	it('shows an empty state', () => {
		const empty = render(SocIntervalChart, { props: { units: [], declaredSoc: 0.3 } }).body;
		expect(texts(empty)).toContain('No SOC estimates yet');
		expect(dataMarkers(empty)).toHaveLength(0);
	});
});
