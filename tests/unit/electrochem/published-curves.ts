// Full-cell OCV curves of published cells, for the fit tests: the cells of the calibration set
// (src/lib/electrochem/calibration/published-cells.ts, each typed from an open parameter set with its
// source named there), over each cell's own SOC between its published cut-offs.
import { PUBLISHED_CELLS, publishedCurve } from '../../../src/lib/electrochem/calibration/published-cells';

const cell = (id: string) => publishedCurve(PUBLISHED_CELLS.find((c) => c.id === id)!);

/** C.-H. Chen et al., J. Electrochem. Soc. 167 (2020) 080534: LG M50 21700, NMC 811 / graphite–SiOx, 2.5–4.2 V. */
export const chen2020Nmc811 = cell('chen2020-nmc811');

/** P. Ramadass et al., J. Electrochem. Soc. 151 (2004) A196: LiCoO₂ / carbon, 2.8–4.2 V. */
export const ramadass2004Lco = cell('ramadass2004-lco');

/** Every published cell as [id, chemistry, OCV over its own SOC]. */
export const ALL_PUBLISHED = PUBLISHED_CELLS.map((c) => [c.id, c.chemistry, publishedCurve(c)] as const);

/** n evenly spaced points from 0 to 1, as a datasheet table gives them. */
export const sampled = (f: (z: number) => number, n = 21) =>
	Array.from({ length: n }, (_, i) => ({ soc: i / (n - 1), ocv_v: f(i / (n - 1)) }));
