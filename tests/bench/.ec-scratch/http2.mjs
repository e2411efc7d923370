import { readFileSync, writeFileSync } from 'node:fs';
const token = readFileSync('/tmp/ec/token', 'utf8').trim();
const base = 'http://127.0.0.1:39990';
const sets = {
  repeating: Array.from({ length: 10000 }, (_, i) => ({ ocv_v: 3.3 + (i % 900) / 1000, temperature_c: 15 + (i % 20) })),
  meter: Array.from({ length: 10000 }, () => ({ ocv_v: Math.round((3.60 + Math.random() * 0.05) * 1e4) / 1e4, temperature_c: Math.round((22 + Math.random() * 2) * 10) / 10 })),
  random: Array.from({ length: 10000 }, () => ({ ocv_v: 3.3 + Math.random() * 0.9, temperature_c: 15 + Math.random() * 20 })),
};
async function median(fn, n = 15) { const ts = []; for (let i = 0; i < n; i++) { const t = performance.now(); await fn(); ts.push(performance.now() - t); } ts.sort((a, b) => a - b); return ts[n >> 1]; }
for (const [name, readings] of Object.entries(sets)) {
  const body = JSON.stringify({ chemistry: 'NMC', declared_soc: 0.3, readings });
  const evalCall = async () => { const r = await fetch(base + '/api/v1/ocv/evaluate', { method: 'POST', headers: { authorization: 'Bearer ' + token, 'content-type': 'application/json' }, body }); return r.arrayBuffer(); };
  const size = (await evalCall()).byteLength;
  writeFileSync(`/work/main/build-ec/client/bench-${name}.json`, 'x'.repeat(size));
  const staticCall = async () => (await fetch(`${base}/bench-${name}.json`)).arrayBuffer();
  await median(staticCall, 3);
  const s = await median(staticCall); const e = await median(evalCall);
  console.log(name, { bytes: size, static_ms: s.toFixed(1), evaluate_ms: e.toFixed(1), ratio: (e / s).toFixed(2) });
}
