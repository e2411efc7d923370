import { getDb, closeDb } from '$lib/server/db';
import { evaluateLotNow, computeEvaluation } from '$lib/server/services/evaluation';
import { currentSeverity } from '$lib/server/services/switching';
const id = process.argv[2];
const db = getDb();
for (let i = 0; i < 5; i++) {
  let t = performance.now();
  const e = await evaluateLotNow(db, id);
  const a = performance.now() - t;
  t = performance.now();
  computeEvaluation(e.inputs);
  const b = performance.now() - t;
  t = performance.now();
  await currentSeverity(db, e.inputs.lot ? (await db.query.lots.findFirst({ where: (l, { eq }) => eq(l.id, id) }))!.supplierId : '', e.inputs.part.id, { excludeLotId: id, before: null });
  const c = performance.now() - t;
  console.log({ total: a, compute: b, severity: c, bytes: JSON.stringify(e).length });
}
await closeDb();
