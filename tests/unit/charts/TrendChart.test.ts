import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import { TrendChart } from '$lib/components/charts';
import TwoTrends from './fixtures/two-trends.svelte';
import { dataMarkers, elements, num, texts } from './svg';

// Invented supplier history for rendering checks.
const points = [
	{ period: '2025-01', received: 500, accepted: 470, held: 20, rejected: 10, ppm: 20_000 },
	{ period: '2025-02', received: 800, accepted: 800, held: 0, rejected: 0, ppm: 0 },
	{ period: '2025-03', received: 640, accepted: 600, held: 30, rejected: 5, ppm: null },
	{ period: '2025-04', received: 300, accepted: 240, held: 45, rejected: 15, ppm: 50_000 }
];

const segment = (markup: string, period: string, key: string) => {
	const html = markup.replace(/<!--[\s\S]*?-->/g, '');
	const group = new RegExp(`<g data-period="${period}">([\\s\\S]*?)</g>`).exec(html)?.[1] ?? '';
	return elements(group, 'rect').find((r) => r.attrs['data-segment'] === key);
};

describe('TrendChart', () => {
	const body = render(TrendChart, { props: { points } }).body;

	it('stacks accepted, held and rejected without gaps, heights in proportion to the counts', () => {
		const accepted = segment(body, '2025-04', 'accepted');
		const held = segment(body, '2025-04', 'held');
		const rejected = segment(body, '2025-04', 'rejected');
		expect(accepted && held && rejected).toBeTruthy();
		const h = (r: typeof accepted) => num(r?.attrs.height);
		expect(h(accepted) / h(held)).toBeCloseTo(240 / 45, 1);
		expect(h(held) / h(rejected)).toBeCloseTo(45 / 15, 1);
		expect(num(rejected?.attrs.y) + h(rejected)).toBeCloseTo(num(held?.attrs.y), 1);
		expect(num(held?.attrs.y) + h(held)).toBeCloseTo(num(accepted?.attrs.y), 1);
	});

	it('omits empty segments and outlines the received total', () => {
		expect(segment(body, '2025-02', 'held')).toBeUndefined();
		expect(segment(body, '2025-02', 'rejected')).toBeUndefined();
		const received = segment(body, '2025-03', 'received');
		expect(received?.attrs.fill).toBe('none');
		expect(received?.attrs['stroke-dasharray']).toBe('3 2');
	});

	it('tells held and rejected apart by pattern, not colour alone', () => {
		const held = segment(body, '2025-01', 'held');
		const rejected = segment(body, '2025-01', 'rejected');
		const fillId = (r: typeof held) => /url\(#([^)]+)\)/.exec(r?.attrs.style ?? '')?.[1];
		expect(fillId(held)).toMatch(/-held$/);
		expect(fillId(rejected)).toMatch(/-rejected$/);
		const patternIds = elements(body, 'pattern').map((p) => p.attrs.id);
		expect(patternIds).toContain(fillId(held));
		expect(patternIds).toContain(fillId(rejected));
		for (const word of ['accepted', 'held', 'rejected', 'received (outline)', 'rejected ppm (right axis)']) {
			expect(texts(body)).toContain(word);
		}
	});

	it('draws ppm on a right axis, skipping periods without a value', () => {
		expect(dataMarkers(body, 'triangle')).toHaveLength(3);
		const words = texts(body);
		expect(words).toContain('rejected (ppm)');
		expect(words.filter((t) => /^[\d,]+ ppm$/.test(t)).length).toBeGreaterThanOrEqual(3);
		// triangle paths start at their apex "M{x},{y}"
		const ppmY = (period: string) =>
			num(/^M[\d.]+,([\d.]+)/.exec(dataMarkers(body, 'triangle').find((m) => m.title?.startsWith(period))?.attrs.d ?? '')?.[1]);
		expect(ppmY('2025-04')).toBeLessThan(ppmY('2025-01'));
		const noPpm = render(TrendChart, { props: { points: points.map((p) => ({ ...p, ppm: undefined })) } }).body;
		expect(dataMarkers(noPpm, 'triangle')).toHaveLength(0);
		expect(texts(noPpm)).not.toContain('rejected (ppm)');
	});

	it('names its axes and legend after what the caller counts', () => {
		const labelled = render(TrendChart, { props: { points, countLabel: 'lots', ppmLabel: 'nonconforming ppm' } }).body;
		const words = texts(labelled);
		expect(words).toContain('lots');
		expect(words).toContain('nonconforming (ppm)');
		expect(words).toContain('nonconforming ppm (right axis)');
		expect(words).not.toContain('rejected (ppm)');
	});

	it('thins period labels when there are too many to fit', () => {
		const many = Array.from({ length: 30 }, (_, i) => ({ period: `W${i + 10}-2025`, received: 10, accepted: 9, held: 1, rejected: 0 }));
		const markup = render(TrendChart, { props: { points: many, width: 600 } }).body;
		const labels = texts(markup).filter((t) => /^W\d+-2025$/.test(t));
		expect(labels.length).toBeGreaterThanOrEqual(5);
		expect(labels.length).toBeLessThan(30);
		expect(labels[0]).toBe('W10-2025');
	});

	it('gives each chart on a page its own pattern ids', () => {
		const page = render(TwoTrends, { props: { points } }).body;
		const ids = elements(page, 'pattern').map((p) => p.attrs.id);
		expect(ids).toHaveLength(4);
		expect(new Set(ids).size).toBe(4);
	});

	it('shows an empty state', () => {
		const empty = render(TrendChart, { props: { points: [] } }).body;
		expect(texts(empty)).toContain('No supplier lots in this period');
		expect(elements(empty, 'rect').filter((r) => r.attrs['data-segment'])).toHaveLength(0);
	});
});
