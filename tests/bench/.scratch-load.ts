import { benchPart, createBenchLot, insertReadings, loadScaleData, syntheticReadings, withClient } from './lib/data';
const url = process.env.DATABASE_URL!;
await withClient(url, async (c) => {
  const part = await benchPart(c);
  let t = performance.now();
  await c.query('set maintenance_work_mem = \'256MB\'');
  const r = await loadScaleData(c);
  console.log(r, performance.now() - t);
  const big = await createBenchLot(c, part, 1_000_000, 'EVAL2000');
  await insertReadings(c, big, syntheticReadings(2000, 1));
  const sample = await createBenchLot(c, part, 5000, 'SAMPLE200');
  await insertReadings(c, sample, syntheticReadings(200, 4));
  console.log(JSON.stringify({ big, sample }));
});
