import { startBenchApp } from './lib/app';
import { bearerFor } from './lib/auth';
import { benchPart, createBenchLot, insertReadings, syntheticReadings, withClient } from './lib/data';
import { benchEvaluationLoad } from './ops/evaluation-load';
import { formatLine } from './lib/measure';
import { closeDb } from '$lib/server/db';
const url = process.env.DATABASE_URL!;
const ids = await withClient(url, async (c) => {
  const part = await benchPart(c);
  const { rows } = await c.query(`insert into parts (supplier_id, part_number, description, chemistry, nominal_capacity_ah, ocv_min_cell_v, ocv_max_cell_v, aql, inspection_level)
    select supplier_id, 'BX-NOHIST-' || floor(random()*1e6)::text, description, chemistry, nominal_capacity_ah, ocv_min_cell_v, ocv_max_cell_v, aql, inspection_level from parts where id = $1 returning id`, [part.id]);
  const fresh = { ...part, id: rows[0].id };
  const withHistory = await createBenchLot(c, part, 5000, 'S200');
  await insertReadings(c, withHistory, syntheticReadings(200, 4));
  const noHistory = await createBenchLot(c, fresh, 5000, 'S200N');
  await insertReadings(c, noHistory, syntheticReadings(200, 4));
  return { part, withHistory, noHistory };
});
const app = await startBenchApp(url, 'build-bench');
const token = await bearerFor();
for (const [label, id] of [['no history', ids.noHistory], ['2,505 decided lots of history', ids.withHistory]] as const) {
  const lines = await benchEvaluationLoad({ app, databaseUrl: url, pgBin: '', scratch: '/tmp/bx', part: ids.part, token, bigLotId: '', sampleLotId: id });
  console.log(label); lines.forEach((l) => console.log(formatLine(l)));
}
await app.stop(); await closeDb();
