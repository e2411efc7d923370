import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import { OcvStripChart } from '$lib/components/charts';
import { DETAIL_LIMIT, FLAGGED_LIMIT, type OcvUnit } from '$lib/components/charts/ocv-strip';
import { dataMarkers, elements, num, texts } from './svg';

// Invented demo lot: serials and voltages are made up for these rendering checks.
function lot(count: number): OcvUnit[] {
	return Array.from({ length: count }, (_, i) => ({
		serial: `DM-${String(i + 1).padStart(5, '0')}`,
		ocv_at_25c_v: 3.3 + ((i * 7) % 11) * 0.001,
		nonconforming: false
	}));
}

const window = { windowMinV: 3.28, windowMaxV: 3.34, expectedV: 3.305 };
const draw = (props: Partial<Parameters<typeof OcvStripChart>[1]> & { units: OcvUnit[] }) =>
	render(OcvStripChart, { props: { ...window, ...props } }).body;

describe('OcvStripChart', () => {
	const units = lot(20);
	units[3] = { serial: 'DM-LOW', ocv_at_25c_v: 3.262, nonconforming: true, outlier: true };
	units[7] = { serial: 'DM-HIGH', ocv_at_25c_v: 3.331, nonconforming: false, outlier: true };
	units[11] = { serial: 'DM-OVER', ocv_at_25c_v: 3.36, nonconforming: true };
	const body = draw({ units });

	it('is an accessible image with a title, a description and an aria-label', () => {
		const svg = elements(body, 'svg')[0];
		expect(svg.attrs.role).toBe('img');
		expect(svg.attrs['aria-label']).toMatch(/OCV/);
		expect(svg.attrs.viewBox).toBe('0 0 760 380');
		expect(body).toMatch(/<title>Cell OCV at 25 °C/);
		expect(body).toMatch(/<desc[^>]*>20\sunits[^<]*2 nonconforming, 2\soutliers/);
	});

	it('labels the voltage axis with V and the window and expected lines in words', () => {
		const words = texts(body);
		const voltLabels = words.filter((t) => /^\d\.\d{3,4} V$/.test(t));
		expect(voltLabels.length).toBeGreaterThanOrEqual(4);
		expect(words).toContain('cell OCV at 25 °C (V)');
		expect(words).toContain('window min');
		expect(words).toContain('window max');
		expect(words).toContain('3.280 V');
		expect(words).toContain('3.340 V');
		expect(words.filter((t) => t === 'expected at declared SOC').length).toBe(2); // line label + legend
		for (const word of ['conforming', 'outlier', 'nonconforming', 'acceptance window']) expect(words).toContain(word);
	});

	it('draws one marker per unit, with a ring for outliers and a cross for nonconforming units', () => {
		expect(dataMarkers(body, 'dot')).toHaveLength(17);
		const rings = dataMarkers(body, 'ring');
		const crosses = dataMarkers(body, 'cross');
		expect(rings.map((r) => r.title?.split(':')[0]).sort()).toEqual(['DM-HIGH', 'DM-LOW']);
		expect(crosses.map((c) => c.title?.split(':')[0]).sort()).toEqual(['DM-LOW', 'DM-OVER']);
		// different shapes, not just different colours: a hollow circle and a path, versus a filled circle
		expect(rings.every((r) => r.tag === 'circle' && r.attrs.fill === 'none')).toBe(true);
		expect(crosses.every((c) => c.tag === 'path')).toBe(true);
		expect(dataMarkers(body, 'dot').every((d) => d.tag === 'circle' && d.attrs.fill !== 'none')).toBe(true);
	});

	it('places higher voltages higher up (smaller SVG y) and keeps every unit inside the plot', () => {
		// DM-LOW is drawn as cross + ring; the ring (a circle) carries the centre as cy
		const cy = (serial: string) => num(dataMarkers(body).find((m) => m.tag === 'circle' && m.title?.startsWith(`${serial}:`))?.attrs.cy);
		expect(cy('DM-HIGH')).toBeLessThan(cy('DM-00001'));
		expect(cy('DM-00001')).toBeLessThan(cy('DM-LOW'));
		const ys = dataMarkers(body)
			.filter((m) => m.tag === 'circle')
			.map((m) => num(m.attrs.cy));
		expect(Math.min(...ys)).toBeGreaterThanOrEqual(30);
		expect(Math.max(...ys)).toBeLessThanOrEqual(380);
	});

	it('draws a histogram whose bars add up to the number of units', () => {
		const bars = elements(body, 'rect').filter((r) => r.title?.includes(' units'));
		const total = bars.reduce((sum, bar) => sum + Number(/: (\d+) units$/.exec(bar.title ?? '')?.[1]), 0);
		expect(total).toBe(20);
	});

	it('drops the expected line and its legend word when the declared SOC is unknown', () => {
		const words = texts(draw({ units, expectedV: null }));
		expect(words).not.toContain('expected at declared SOC');
		expect(words).toContain('window min');
	});

	it('shows an empty state with the window still visible', () => {
		const empty = draw({ units: [] });
		expect(texts(empty)).toContain('No OCV readings yet');
		expect(texts(empty)).toContain('window max');
		expect(dataMarkers(empty)).toHaveLength(0);
		expect(empty).toMatch(/<desc[^>]*>No OCV readings yet/);
	});

	it('keeps the markup small for 10,000 units by drawing min–max strokes and only flagged units', () => {
		const big = lot(10_000).map((u, i) => ({ ...u, outlier: i % 20 === 0, nonconforming: i === 5 }));
		expect(big.length).toBeGreaterThan(DETAIL_LIMIT);
		const markup = draw({ units: big });
		expect(markup.length).toBeLessThan(150_000);
		expect(dataMarkers(markup, 'dot')).toHaveLength(0);
		expect(dataMarkers(markup).length).toBeLessThanOrEqual(FLAGGED_LIMIT + 1);
		expect(elements(markup, 'path').some((p) => p.attrs.class === 'ranges' && p.attrs.d.length > 100)).toBe(true);
		expect(texts(markup).some((t) => /^conforming: min–max per \d+ units$/.test(t))).toBe(true);
		expect(texts(markup)).toContain('showing 300 of 501 flagged units');
	});
});
