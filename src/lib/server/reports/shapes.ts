import type { PDFPage, RGB } from 'pdf-lib';
import type { Shape } from '$lib/status';

/** Marks that carry meaning by shape, so nothing depends on colour alone. */
export function dot(page: PDFPage, x: number, y: number, radius: number, color: RGB): void {
	page.drawCircle({ x, y, size: radius, color });
}

export function cross(page: PDFPage, x: number, y: number, half: number, color: RGB, thickness = 1.2): void {
	page.drawLine({ start: { x: x - half, y: y - half }, end: { x: x + half, y: y + half }, thickness, color });
	page.drawLine({ start: { x: x - half, y: y + half }, end: { x: x + half, y: y - half }, thickness, color });
}

/** Upright triangle centred on (x, y); drawSvgPath measures y downwards from its origin. */
export function triangle(page: PDFPage, x: number, y: number, half: number, color: RGB): void {
	page.drawSvgPath(`M 0 ${-half} L ${half} ${half * 0.8} L ${-half} ${half * 0.8} Z`, { x, y, color });
}

export function ring(page: PDFPage, x: number, y: number, radius: number, color: RGB): void {
	page.drawCircle({ x, y, size: radius, borderColor: color, borderWidth: 1.2 });
}

/**
 * The status shapes of src/lib/status.ts, as the web's status-shape.svelte draws them: filled marks
 * carry their sign (tick, exclamation mark, cross) in `knockout`, the colour behind them.
 */
export function statusShape(page: PDFPage, shape: Shape, x: number, y: number, half: number, color: RGB, knockout: RGB): void {
	const line = { thickness: Math.max(1, half * 0.22), color: knockout };
	switch (shape) {
		case 'check':
			dot(page, x, y, half, color);
			page.drawLine({ start: { x: x - half * 0.45, y }, end: { x: x - half * 0.1, y: y - half * 0.35 }, ...line });
			page.drawLine({ start: { x: x - half * 0.1, y: y - half * 0.35 }, end: { x: x + half * 0.5, y: y + half * 0.35 }, ...line });
			return;
		case 'alert':
			triangle(page, x, y, half, color);
			page.drawLine({ start: { x, y: y + half * 0.35 }, end: { x, y: y - half * 0.2 }, ...line });
			page.drawLine({ start: { x, y: y - half * 0.42 }, end: { x, y: y - half * 0.5 }, ...line });
			return;
		case 'cross':
			page.drawRectangle({ x: x - half, y: y - half, width: 2 * half, height: 2 * half, color });
			cross(page, x, y, half * 0.45, knockout, line.thickness);
			return;
		case 'diamond':
			page.drawSvgPath(`M 0 ${-half} L ${half} 0 L 0 ${half} L ${-half} 0 Z`, { x, y, borderColor: color, borderWidth: 1.2 });
			return;
		case 'half':
			ring(page, x, y, half, color);
			page.drawSvgPath(`M 0 ${-half} A ${half} ${half} 0 0 1 0 ${half} Z`, { x, y, color });
			return;
		case 'dashed':
			page.drawCircle({ x, y, size: half, borderColor: color, borderWidth: 1.2, borderDashArray: [2, 1.6] });
			return;
		case 'slash':
			ring(page, x, y, half, color);
			page.drawLine({
				start: { x: x - half * 0.7, y: y - half * 0.7 },
				end: { x: x + half * 0.7, y: y + half * 0.7 },
				thickness: 1.2,
				color
			});
			return;
		case 'clock':
			ring(page, x, y, half, color);
			page.drawLine({ start: { x, y }, end: { x, y: y + half * 0.6 }, thickness: 1.2, color });
			page.drawLine({ start: { x, y }, end: { x: x + half * 0.45, y: y - half * 0.25 }, thickness: 1.2, color });
			return;
		case 'info':
			ring(page, x, y, half, color);
			page.drawLine({ start: { x, y: y - half * 0.5 }, end: { x, y: y + half * 0.1 }, thickness: 1.2, color });
			page.drawLine({ start: { x, y: y + half * 0.35 }, end: { x, y: y + half * 0.45 }, thickness: 1.2, color });
			return;
		case 'ring':
			ring(page, x, y, half, color);
	}
}
