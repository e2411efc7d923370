import { readFileSync } from 'node:fs';
const token = readFileSync('/tmp/ec/token', 'utf8').trim();
const base = 'http://127.0.0.1:39990';
const readings = Array.from({ length: 10000 }, (_, i) => ({ ocv_v: 3.3 + (i % 900) / 1000, temperature_c: 15 + (i % 20) }));
const body = JSON.stringify({ chemistry: 'NMC', declared_soc: 0.3, readings });
async function time(fn, n = 20) {
  const ts = [];
  for (let i = 0; i < n; i++) { const t = performance.now(); await fn(); ts.push(performance.now() - t); }
  ts.sort((a, b) => a - b); return ts[Math.floor(n / 2)].toFixed(1);
}
const evalCall = async () => { const r = await fetch(base + '/api/v1/ocv/evaluate', { method: 'POST', headers: { authorization: 'Bearer ' + token, 'content-type': 'application/json' }, body }); await r.arrayBuffer(); };
const staticCall = async () => { const r = await fetch(base + '/bench-static.json'); await r.arrayBuffer(); };
const chemCall = async () => { const r = await fetch(base + '/api/v1/chemistries', { headers: { authorization: 'Bearer ' + token } }); await r.arrayBuffer(); };
const smallEval = async () => { const r = await fetch(base + '/api/v1/ocv/evaluate', { method: 'POST', headers: { authorization: 'Bearer ' + token, 'content-type': 'application/json' }, body: JSON.stringify({chemistry:'NMC', readings: readings.slice(0,1)}) }); await r.arrayBuffer(); };
for (let round = 0; round < 2; round++) {
  console.log({ static: await time(staticCall), evaluate: await time(evalCall), chemistries: await time(chemCall), smallEval: await time(smallEval) });
}
