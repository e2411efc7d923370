import { evaluateReadings, getLibraryModel } from '$lib/electrochem';
import { serialiseResults } from '../../../src/routes/api/v1/ocv/evaluate/serialise';
import { distinctReadings } from '../../../src/routes/api/v1/ocv/evaluate/distinct';
const model = getLibraryModel('NMC');
const random = Array.from({ length: 10000 }, () => ({ ocv_v: 3.3 + Math.random() * 0.9, temperature_c: 15 + Math.random() * 20 }));
const r6 = (x: number | null) => (x === null ? null : Math.round(x * 1e6) / 1e6);
const min = (f: () => void, n = 25) => { let m = Infinity; for (let i = 0; i < n; i++) { const t = performance.now(); f(); m = Math.min(m, performance.now() - t); } return m.toFixed(2); };
const res = evaluateReadings(model, random, { declared_soc: 0.3 });
const order = Int32Array.from(res.keys());
console.log({
  distinct: min(() => distinctReadings(random)),
  evaluate: min(() => evaluateReadings(model, random, { declared_soc: 0.3 })),
  writer: min(() => serialiseResults(res, order)),
  stringifyRaw: min(() => JSON.stringify({ results: res })),
  stringifyRounded: min(() => JSON.stringify({ results: res.map((u) => ({ ...u, soc: r6(u.soc), soc_sigma: r6(u.soc_sigma), soc_low: r6(u.soc_low), soc_high: r6(u.soc_high), ocv_cell_v: r6(u.ocv_cell_v), ocv_at_25c_v: r6(u.ocv_at_25c_v), expected_ocv_v: r6(u.expected_ocv_v), residual_v: r6(u.residual_v) })) })),
});
