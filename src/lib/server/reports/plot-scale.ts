import { scaleLinear } from 'd3-scale';

export interface Axis {
	toPage(value: number): number;
	ticks: number[];
	decimals: number;
}

/** A linear axis with round ticks over the values, padded so nothing sits on the frame. */
export function linearAxis(values: number[], range: [number, number], tickCount: number): Axis {
	const finite = values.filter(Number.isFinite);
	let lo = finite.length ? Math.min(...finite) : 0;
	let hi = finite.length ? Math.max(...finite) : 1;
	const pad = hi > lo ? (hi - lo) * 0.06 : Math.max(Math.abs(hi) * 0.01, 0.01);
	lo -= pad;
	hi += pad;
	const scale = scaleLinear().domain([lo, hi]).range(range).nice(tickCount);
	const ticks = scale.ticks(tickCount);
	const step = ticks.length > 1 ? ticks[1] - ticks[0] : 1;
	return { toPage: (v) => scale(v), ticks, decimals: Math.max(0, Math.ceil(-Math.log10(step) - 1e-9)) };
}

/** Unit index axis (1…n): whole-number ticks only. */
export function indexAxis(count: number, range: [number, number]): Axis {
	const scale = scaleLinear()
		.domain([0.5, Math.max(count, 1) + 0.5])
		.range(range);
	const ticks = count === 0 ? [] : scaleLinear().domain([1, count]).ticks(8).filter(Number.isInteger);
	return { toPage: (v) => scale(v), ticks, decimals: 0 };
}
