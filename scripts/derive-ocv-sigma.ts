// Prints each calibrated chemistry's sigma_model_soc_curve, recomputed from the published cells
// (src/lib/electrochem/calibration). Run: npx tsx scripts/derive-ocv-sigma.ts
import { CALIBRATED_CHEMISTRIES, deriveSocSigmaCurve } from '../src/lib/electrochem/calibration/derive';
import { PUBLISHED_CELLS } from '../src/lib/electrochem/calibration/published-cells';
import { getLibraryModel } from '../src/lib/electrochem';

for (const code of CALIBRATED_CHEMISTRIES) {
	const cells = PUBLISHED_CELLS.filter((c) => c.chemistry === code);
	console.log(`${code} (${cells.map((c) => c.id).join(', ')}): ${JSON.stringify(deriveSocSigmaCurve(getLibraryModel(code), cells))}`);
}
