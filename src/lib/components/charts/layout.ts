import type { LegendItem } from './types';

/** Rough width of sans-serif text; good enough to keep labels from colliding. */
export function textWidth(text: string, fontSize: number): number {
	return text.length * fontSize * 0.58;
}

/**
 * Spread labels along one axis so they keep `gap` between them, staying inside [lo, hi].
 * Input order does not matter; output is in the same order as the input.
 */
export function dodge(positions: number[], gap: number, lo: number, hi: number): number[] {
	const order = positions.map((pos, index) => ({ pos, index })).sort((a, b) => a.pos - b.pos);
	const placed = order.map((o) => Math.min(hi, Math.max(lo, o.pos)));
	for (let i = 1; i < placed.length; i++) placed[i] = Math.max(placed[i], placed[i - 1] + gap);
	// If the stack ran past the far edge, push it back and re-space downwards.
	const last = placed.length - 1;
	if (last >= 0 && placed[last] > hi) {
		placed[last] = hi;
		for (let i = last - 1; i >= 0; i--) placed[i] = Math.min(placed[i], placed[i + 1] - gap);
	}
	const result = new Array<number>(positions.length);
	order.forEach((o, k) => (result[o.index] = placed[k]));
	return result;
}

/** Evenly spaced picks that always include the first and the last item. */
export function evenSample<T>(items: T[], max: number): T[] {
	if (items.length <= max) return items;
	if (max <= 1) return items.slice(0, max);
	const step = (items.length - 1) / (max - 1);
	return Array.from({ length: max }, (_, i) => items[Math.round(i * step)]);
}

/** Show every n-th category label so that labels of `labelWidth` fit into `bandWidth`. */
export function labelStride(bandWidth: number, labelWidth: number): number {
	if (bandWidth <= 0) return 1;
	return Math.max(1, Math.ceil((labelWidth + 8) / bandWidth));
}

export const LEGEND_ROW_HEIGHT = 20;
const LEGEND_SYMBOL_WIDTH = 22;
const LEGEND_ITEM_GAP = 18;

export interface PlacedLegendItem {
	item: LegendItem;
	x: number;
	row: number;
}

/** Flow legend items left to right, wrapping into rows that fit `maxWidth`. */
export function layoutLegend(items: LegendItem[], maxWidth: number, fontSize: number) {
	const placed: PlacedLegendItem[] = [];
	let x = 0;
	let row = 0;
	for (const item of items) {
		const width = LEGEND_SYMBOL_WIDTH + textWidth(item.label, fontSize);
		if (x > 0 && x + width > maxWidth) {
			row += 1;
			x = 0;
		}
		placed.push({ item, x, row });
		x += width + LEGEND_ITEM_GAP;
	}
	const rows = items.length === 0 ? 0 : row + 1;
	return { placed, rows, height: rows * LEGEND_ROW_HEIGHT };
}
