import { evaluateReadings, getLibraryModel } from '$lib/electrochem';
import { serialiseResults } from '../../../src/routes/api/v1/ocv/evaluate/serialise';
import { distinctReadings } from '../../../src/routes/api/v1/ocv/evaluate/distinct';
const model = getLibraryModel('NMC');
const random = Array.from({ length: 10000 }, () => ({ ocv_v: 3.3 + Math.random() * 0.9, temperature_c: 15 + Math.random() * 20 }));
const meter = Array.from({ length: 10000 }, () => ({ ocv_v: Math.round((3.60 + Math.random() * 0.05) * 1e4) / 1e4, temperature_c: Math.round((22 + Math.random() * 2) * 10) / 10 }));
for (const [name, readings] of [['random', random], ['meter', meter]] as const) for (let k = 0; k < 4; k++) {
  let t = performance.now(); const { unique, order } = distinctReadings(readings); const tD = performance.now() - t;
  t = performance.now(); const res = evaluateReadings(model, unique, { declared_soc: 0.3 }); const tE = performance.now() - t;
  t = performance.now(); const bytes = serialiseResults(res, order); const tS = performance.now() - t;
  t = performance.now(); const js = JSON.stringify({ results: evaluateReadings(model, readings, { declared_soc: 0.3 }).map(u=>u) }); const tJ = performance.now() - t;
  const parsed = JSON.parse(new TextDecoder().decode(bytes));
  const full = evaluateReadings(model, readings, { declared_soc: 0.3 });
  let maxDiff = 0; full.forEach((u, i) => { for (const key of ['soc','soc_sigma','ocv_cell_v','residual_v'] as const) maxDiff = Math.max(maxDiff, Math.abs((u[key] as number) - parsed.results[i][key])); if (JSON.stringify(u.flags)!==JSON.stringify(parsed.results[i].flags)) maxDiff=99; });
  console.log(name, { unique: unique.length, tD: tD.toFixed(1), tE: tE.toFixed(1), tS: tS.toFixed(1), evalPlusStringify: tJ.toFixed(1), bytes: bytes.length, jsonBytes: js.length, maxDiff });
}
