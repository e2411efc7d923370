import { evaluateReadings, getLibraryModel } from '../../../src/lib/electrochem/index';
const readings = Array.from({ length: 10000 }, (_, i) => ({ ocv_v: 3.5 + (i % 70) / 100, temperature_c: 20 + (i % 10) }));
const r6 = (x: number) => Math.round(x * 1e6) / 1e6;
const num = (x: number | null) => (x === null || !Number.isFinite(x) ? 'null' : String(Math.round(x * 1e6) / 1e6));
function hand(res: any[]) {
  let s = '{"results":[';
  for (let i = 0; i < res.length; i++) {
    const u = res[i];
    if (i) s += ',';
    s += '{"soc":' + num(u.soc) + ',"soc_sigma":' + num(u.soc_sigma) + ',"soc_low":' + num(u.soc_low) + ',"soc_high":' + num(u.soc_high) +
      ',"determinate":' + u.determinate + ',"ocv_cell_v":' + num(u.ocv_cell_v) + ',"ocv_at_25c_v":' + num(u.ocv_at_25c_v) +
      ',"expected_ocv_v":' + num(u.expected_ocv_v) + ',"residual_v":' + num(u.residual_v) + ',"flags":' + (u.flags.length ? JSON.stringify(u.flags) : '[]') + '}';
  }
  return s + ']}';
}
for (let k = 0; k < 6; k++) {
  const res = evaluateReadings(getLibraryModel('NMC'), readings, { declared_soc: 0.3 });
  let t = performance.now(); const a = JSON.stringify({ results: res.map((u) => ({ ...u, soc: r6(u.soc), soc_sigma: r6(u.soc_sigma), soc_low: r6(u.soc_low), soc_high: r6(u.soc_high), ocv_cell_v: r6(u.ocv_cell_v), ocv_at_25c_v: r6(u.ocv_at_25c_v), expected_ocv_v: u.expected_ocv_v===null?null:r6(u.expected_ocv_v), residual_v: u.residual_v===null?null:r6(u.residual_v) })) }); const tA = performance.now() - t;
  t = performance.now(); const b = hand(res); const tB = performance.now() - t;
  console.log({ tA, aLen: a.length, tB, bLen: b.length, same: JSON.stringify(JSON.parse(a)) === JSON.stringify(JSON.parse(b)) });
}
