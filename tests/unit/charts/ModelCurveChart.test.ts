import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import { ModelCurveChart } from '$lib/components/charts';
import { dataMarkers, elements, num, texts } from './svg';

// Invented demo curve (monotonic, flat in the middle); not a real chemistry model.
const curve = Array.from({ length: 21 }, (_, i) => {
	const soc = i / 20;
	return { soc, ocv_v: 3.0 + 0.3 * (1 - Math.exp(-soc * 12)) + 0.1 * soc ** 6 };
});
const readings = [
	{ soc: 0.2, ocv_v: 3.27, label: 'R-1' },
	{ soc: 0.6, ocv_v: 3.31, label: 'R-2' },
	{ soc: 0.9, ocv_v: 3.36 }
];
const base = { curve, readings, minSafeV: 2.5, windowMinV: 3.2, windowMaxV: 3.35 };

function pathPoints(d: string): Array<[number, number]> {
	return [...d.matchAll(/[ML]([\d.]+),([\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])]);
}

describe('ModelCurveChart', () => {
	const body = render(ModelCurveChart, { props: base }).body;

	it('has V ticks, % ticks and the axis titles', () => {
		const words = texts(body);
		expect(words.filter((t) => /^\d\.\d{3} V$/.test(t)).length).toBeGreaterThanOrEqual(4);
		expect(words).toContain('0 %');
		expect(words).toContain('100 %');
		expect(words).toContain('OCV per cell (V)');
		expect(words).toContain('state of charge (%)');
	});

	it('draws the curve rising to the right: higher OCV at higher SOC means smaller y', () => {
		const d = elements(body, 'path').find((p) => p.attrs.class === 'model-curve')?.attrs.d ?? '';
		const pts = pathPoints(d);
		expect(pts).toHaveLength(curve.length);
		expect(pts[pts.length - 1][0]).toBeGreaterThan(pts[0][0]);
		expect(pts[pts.length - 1][1]).toBeLessThan(pts[0][1]);
	});

	it('places one diamond per reading, with visible labels when there are few', () => {
		const diamonds = dataMarkers(body, 'diamond');
		expect(diamonds).toHaveLength(3);
		expect(diamonds[0].title).toMatch(/^R-1: 3\.2700 V at 20 % SOC$/);
		expect(texts(body)).toContain('R-1');
		expect(texts(body)).toContain('R-2');
		expect(texts(body)).toContain('readings');
	});

	it('labels the min-safe line below the window lines', () => {
		const lineYs = (cls: string) =>
			elements(body, 'line')
				.filter((l) => l.attrs.class === cls)
				.map((l) => num(l.attrs.y1));
		const [safeY] = lineYs('min-safe-line');
		const windowYs = lineYs('window-line');
		expect(windowYs).toHaveLength(2);
		expect(safeY).toBeGreaterThan(Math.max(...windowYs));
		const words = texts(body);
		expect(words).toContain('min safe');
		expect(words).toContain('2.500 V');
		expect(words).toContain('window min');
		expect(words).toContain('window max');
	});

	it('overlays a dashed fitted curve only when one is given', () => {
		expect(elements(body, 'path').some((p) => p.attrs.class === 'fit-curve')).toBe(false);
		const fitCurve = curve.map((p) => ({ soc: p.soc, ocv_v: p.ocv_v + 0.002 }));
		const withFit = render(ModelCurveChart, { props: { ...base, fitCurve } }).body;
		const fit = elements(withFit, 'path').find((p) => p.attrs.class === 'fit-curve');
		expect(fit?.attrs['stroke-dasharray']).toBe('6 4');
		expect(texts(withFit)).toContain('fitted curve');
	});

	it('adds a residual panel in mV below the curve when residuals are given', () => {
		expect(texts(body)).not.toContain('residual (mV)');
		const residuals = [
			{ soc: 0.2, residual_mv: -3.2 },
			{ soc: 0.6, residual_mv: 1.5 },
			{ soc: 0.9, residual_mv: 0.4 }
		];
		const withResiduals = render(ModelCurveChart, { props: { ...base, residuals } }).body;
		const words = texts(withResiduals);
		expect(words).toContain('residual (mV)');
		expect(words.filter((t) => /^−?\d+(\.\d)? mV$/.test(t)).length).toBeGreaterThanOrEqual(3);
		const squares = dataMarkers(withResiduals, 'square');
		expect(squares).toHaveLength(3);
		// below the main panel: every residual marker sits lower than every reading
		const lowestReading = Math.max(...dataMarkers(withResiduals, 'diamond').map((m) => pathPoints(m.attrs.d)[0][1]));
		expect(Math.min(...squares.map((m) => pathPoints(m.attrs.d)[0][1]))).toBeGreaterThan(lowestReading);
		// a negative residual is drawn lower than a positive one
		expect(pathPoints(squares[0].attrs.d)[0][1]).toBeGreaterThan(pathPoints(squares[1].attrs.d)[0][1]);
	});

	it('says so when there is no curve', () => {
		const empty = render(ModelCurveChart, { props: { curve: [] } }).body;
		expect(texts(empty)).toContain('No model curve available');
	});
});
