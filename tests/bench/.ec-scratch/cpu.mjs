import { readFileSync, writeFileSync } from 'node:fs';
import { execSync } from 'node:child_process';
const token = readFileSync('/tmp/ec/token', 'utf8').trim();
const base = 'http://127.0.0.1:39990';
const pid = execSync('pgrep -f "node  *build-ec"').toString().trim().split('\n')[0];
const ticks = () => { const f = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' '); return (+f[11] + +f[12]) * 10; }; // ms (CLK_TCK=100)
const sets = {
  repeating: Array.from({ length: 10000 }, (_, i) => ({ ocv_v: 3.3 + (i % 900) / 1000, temperature_c: 15 + (i % 20) })),
  meter: Array.from({ length: 10000 }, () => ({ ocv_v: Math.round((3.60 + Math.random() * 0.05) * 1e4) / 1e4, temperature_c: Math.round((22 + Math.random() * 2) * 10) / 10 })),
  random: Array.from({ length: 10000 }, () => ({ ocv_v: 3.3 + Math.random() * 0.9, temperature_c: 15 + Math.random() * 20 })),
};
async function cpuPer(fn, n = 40) { await fn(); await fn(); const t0 = ticks(); for (let i = 0; i < n; i++) await fn(); return (ticks() - t0) / n; }
for (const [name, readings] of Object.entries(sets)) {
  const body = JSON.stringify({ chemistry: 'NMC', declared_soc: 0.3, readings });
  const evalCall = async () => (await fetch(base + '/api/v1/ocv/evaluate', { method: 'POST', headers: { authorization: 'Bearer ' + token, 'content-type': 'application/json' }, body })).arrayBuffer();
  const size = (await evalCall()).byteLength;
  // writeFileSync(`/work/main/build-ec/client/bench-${name}.json`, 'x'.repeat(size));
  const staticCall = async () => (await fetch(`${base}/bench-${name}.json`)).arrayBuffer();
  const s = await cpuPer(staticCall); const e = await cpuPer(evalCall);
  console.log(name, { server_cpu_static_ms: s.toFixed(1), server_cpu_evaluate_ms: e.toFixed(1), ratio: (e / s).toFixed(2) });
}
