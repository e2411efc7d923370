import { startBenchApp } from './lib/app';
import { bearerFor } from './lib/auth';
import { syntheticReadings } from './lib/data';
import { closeDb } from '$lib/server/db';
const app = await startBenchApp(process.env.DATABASE_URL!, 'build-bench');
const token = await bearerFor();
const what = process.argv[2];
if (what === 'ocv') {
  const readings = syntheticReadings(10_000, 2).map(({ ocv_v, temperature_c }) => ({ ocv_v, temperature_c }));
  const body = JSON.stringify({ chemistry: 'NMC', declared_soc: 0.3, readings });
  for (let i = 0; i < 60; i++) {
    const t = performance.now();
    const r = await fetch(`${app.url}/api/v1/ocv/evaluate`, { method: 'POST', body, headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' } });
    await r.text();
    if (i % 10 === 0) console.log(r.status, performance.now() - t);
  }
} else {
  for (let i = 0; i < 40; i++) {
    const t = performance.now();
    const r = await fetch(`${app.url}/api/v1/lots/${process.argv[3]}/evaluation`, { headers: { authorization: `Bearer ${token}` } });
    await r.text();
    if (i % 10 === 0) console.log(r.status, performance.now() - t);
  }
}
await app.stop();
await closeDb();
