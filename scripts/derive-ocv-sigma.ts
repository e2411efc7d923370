// Prints each calibrated chemistry's sigma_model_soc_curve, recomputed from the published cells
// (src/lib/electrochem/calibration), and the interval's coverage of the true SOC (10–90 %, 25 °C) on
// each cell: with the stored curve (in sample, asserted ≥ 90 % by tests/unit/electrochem/calibration.test.ts)
// and with the cell left out of the derivation (with two cells per chemistry the σ then rests on one
// other cell; reported, not asserted). Run: npx tsx scripts/derive-ocv-sigma.ts
import { CALIBRATED_CHEMISTRIES, deriveSocSigmaCurve } from '../src/lib/electrochem/calibration/derive';
import { PUBLISHED_CELLS, type PublishedCell, publishedCurve } from '../src/lib/electrochem/calibration/published-cells';
import { evaluateReading, getLibraryModel, type OcvModel } from '../src/lib/electrochem';

const PROBES = Array.from({ length: 81 }, (_, i) => 0.1 + i * 0.01);

function coverage(model: OcvModel, cell: PublishedCell): string {
	const ocv = publishedCurve(cell);
	const results = PROBES.map((z) => ({ z, r: evaluateReading(model, { ocv_v: ocv(z), temperature_c: 25 }) }));
	const inside = results.filter(({ z, r }) => r.soc_low <= z && z <= r.soc_high).length;
	const halves = results.map(({ r }) => (r.soc_high - r.soc_low) / 2).sort((a, b) => a - b);
	return `${inside}/${results.length}, median half-width ${(halves[halves.length >> 1] * 100).toFixed(1)} SOC points`;
}

for (const code of CALIBRATED_CHEMISTRIES) {
	const model = getLibraryModel(code);
	const cells = PUBLISHED_CELLS.filter((c) => c.chemistry === code);
	console.log(`${code} (${cells.map((c) => c.id).join(', ')}): ${JSON.stringify(deriveSocSigmaCurve(model, cells))}`);
	for (const cell of cells) {
		const others = cells.filter((c) => c !== cell);
		const leftOut = { ...model, sigma_model_soc_curve: deriveSocSigmaCurve(model, others) };
		console.log(`  ${cell.id}: coverage ${coverage(model, cell)}; left out: ${coverage(leftOut, cell)}`);
	}
}
