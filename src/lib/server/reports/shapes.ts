import type { PDFPage, RGB } from 'pdf-lib';

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

export function diamond(page: PDFPage, x: number, y: number, half: number, color: RGB): void {
	page.drawSvgPath(`M 0 ${-half} L ${half} 0 L 0 ${half} L ${-half} 0 Z`, { x, y, color });
}

export function ring(page: PDFPage, x: number, y: number, radius: number, color: RGB): void {
	page.drawCircle({ x, y, size: radius, borderColor: color, borderWidth: 1.2 });
}

export type StatusShape = 'accept' | 'hold' | 'reject' | 'pending';

/** One shape per disposition: accept a dot, hold a triangle, reject a cross, pending a ring. */
export function statusShape(page: PDFPage, status: StatusShape, x: number, y: number, half: number, color: RGB): void {
	if (status === 'accept') dot(page, x, y, half, color);
	else if (status === 'hold') triangle(page, x, y, half, color);
	else if (status === 'reject') cross(page, x, y, half * 0.8, color, half * 0.35);
	else ring(page, x, y, half, color);
}
