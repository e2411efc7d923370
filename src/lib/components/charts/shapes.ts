import type { MarkerShape } from './types';

/** Two decimals are plenty for SVG user units and keep large charts small. */
export function round2(value: number): number {
	return Math.round(value * 100) / 100;
}

/** Path data for the non-circular marker shapes, centred on (x, y). */
export function markerPath(shape: Exclude<MarkerShape, 'dot' | 'ring'>, x: number, y: number, size: number): string {
	const s = round2(size);
	const cx = round2(x);
	const cy = round2(y);
	switch (shape) {
		case 'cross':
			return `M${cx - s},${cy - s}L${cx + s},${cy + s}M${cx - s},${cy + s}L${cx + s},${cy - s}`;
		case 'diamond': {
			const d = round2(s * 1.3);
			return `M${cx},${cy - d}L${cx + d},${cy}L${cx},${cy + d}L${cx - d},${cy}Z`;
		}
		case 'square':
			return `M${cx - s},${cy - s}h${2 * s}v${2 * s}h${-2 * s}Z`;
		case 'triangle': {
			const h = round2(s * 1.25);
			return `M${cx},${cy - h}L${cx + h},${cy + h * 0.8}L${cx - h},${cy + h * 0.8}Z`;
		}
	}
}
