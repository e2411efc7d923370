// The tabulated OCV form: a monotone, shape-preserving cubic Hermite interpolant through a
// supplier's (soc, ocv) points, after M. Steffen, "A simple method for monotonic interpolation in
// one dimension", Astronomy and Astrophysics 239 (1990) 443–450. Knot slopes come from the
// neighbouring secants (eqs. 11 and 26–27 of the paper), so the curve never overshoots the data
// and stays increasing where the points increase. Outside the points' SOC range the curve goes on
// along its end tangent; the fit reports that range so nobody mistakes it for data.
import type { FormFunctions } from './forms';

export interface TabulatedParams {
	/** Strictly increasing SOC knots in [0, 1]. */
	soc: number[];
	/** OCV per cell at 25 °C at each knot, strictly increasing, V. */
	ocv_v: number[];
}

const sign = (x: number) => (x > 0 ? 1 : x < 0 ? -1 : 0);

/** Steffen's end slope (eq. 26–27), kept at no less than half the end secant so the curve stays strictly increasing. */
function endSlope(hNear: number, hFar: number, sNear: number, sFar: number): number {
	const p = (1 + hNear / (hNear + hFar)) * sNear - (hNear / (hNear + hFar)) * sFar;
	let d = p * sNear <= 0 ? 0 : Math.abs(p) > 2 * Math.abs(sNear) ? 2 * sNear : p;
	// Our choice, not the paper's: a zero end slope would make the inversion flat there; any slope
	// in (0, 3·secant] keeps a cubic Hermite segment monotone (Fritsch & Carlson 1980).
	if (sNear > 0 && d < 0.5 * sNear) d = 0.5 * sNear;
	return d;
}

/** Knot slopes dE/dz for the given knots (at least 2). */
export function steffenSlopes(x: readonly number[], y: readonly number[]): number[] {
	const n = x.length;
	const h = Array.from({ length: n - 1 }, (_, i) => x[i + 1] - x[i]);
	const s = h.map((hi, i) => (y[i + 1] - y[i]) / hi);
	if (n === 2) return [s[0], s[0]];
	const d = new Array<number>(n);
	for (let i = 1; i < n - 1; i++) {
		const p = (s[i - 1] * h[i] + s[i] * h[i - 1]) / (h[i - 1] + h[i]);
		d[i] = (sign(s[i - 1]) + sign(s[i])) * Math.min(Math.abs(s[i - 1]), Math.abs(s[i]), 0.5 * Math.abs(p));
	}
	d[0] = endSlope(h[0], h[1], s[0], s[1]);
	d[n - 1] = endSlope(h[n - 2], h[n - 3], s[n - 2], s[n - 3]);
	return d;
}

/** Largest i with x[i] <= z, within [0, n − 2]. */
function segmentOf(x: readonly number[], z: number): number {
	let lo = 0;
	let hi = x.length - 1;
	while (hi - lo > 1) {
		const mid = (lo + hi) >> 1;
		if (x[mid] <= z) lo = mid;
		else hi = mid;
	}
	return lo;
}

/** Value and slope of the interpolant; the knots must be strictly increasing in soc. */
export function tabulatedFunctions(p: TabulatedParams): FormFunctions {
	const x = p.soc;
	const y = p.ocv_v;
	const d = steffenSlopes(x, y);
	const last = x.length - 1;
	return {
		value(z) {
			if (z <= x[0]) return y[0] + d[0] * (z - x[0]);
			if (z >= x[last]) return y[last] + d[last] * (z - x[last]);
			const i = segmentOf(x, z);
			const h = x[i + 1] - x[i];
			const t = (z - x[i]) / h;
			const t2 = t * t;
			const t3 = t2 * t;
			return (2 * t3 - 3 * t2 + 1) * y[i] + (t3 - 2 * t2 + t) * h * d[i] + (-2 * t3 + 3 * t2) * y[i + 1] + (t3 - t2) * h * d[i + 1];
		},
		slope(z) {
			if (z <= x[0]) return d[0];
			if (z >= x[last]) return d[last];
			const i = segmentOf(x, z);
			const h = x[i + 1] - x[i];
			const t = (z - x[i]) / h;
			const t2 = t * t;
			return ((6 * t2 - 6 * t) * y[i]) / h + (3 * t2 - 4 * t + 1) * d[i] + ((-6 * t2 + 6 * t) * y[i + 1]) / h + (3 * t2 - 2 * t) * d[i + 1];
		}
	};
}

/** Indices i (of points sorted by soc) where ocv_v[i] does not rise above ocv_v[i − 1]. */
export function nonIncreasingAt(points: ReadonlyArray<{ soc: number; ocv_v: number }>): number[] {
	const out: number[] = [];
	for (let i = 1; i < points.length; i++) if (!(points[i].ocv_v > points[i - 1].ocv_v)) out.push(i);
	return out;
}

/**
 * Isotonic regression by pool-adjacent-violators (Barlow et al., "Statistical inference under
 * order restrictions", 1972): each block of points that had to be pooled becomes one point at
 * its mean soc and mean ocv, so the result is strictly increasing. Points sorted by soc.
 */
export function poolAdjacentViolators(points: ReadonlyArray<{ soc: number; ocv_v: number }>): Array<{ soc: number; ocv_v: number }> {
	const blocks: Array<{ socSum: number; ocvSum: number; n: number }> = [];
	for (const p of points) {
		blocks.push({ socSum: p.soc, ocvSum: p.ocv_v, n: 1 });
		while (blocks.length > 1) {
			const b = blocks[blocks.length - 1];
			const a = blocks[blocks.length - 2];
			if (b.ocvSum / b.n > a.ocvSum / a.n) break;
			blocks.splice(blocks.length - 2, 2, { socSum: a.socSum + b.socSum, ocvSum: a.ocvSum + b.ocvSum, n: a.n + b.n });
		}
	}
	return blocks.map((b) => ({ soc: b.socSum / b.n, ocv_v: b.ocvSum / b.n }));
}
