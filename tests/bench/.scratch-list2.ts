import { drizzle } from 'drizzle-orm/node-postgres';
import { desc, eq, sql } from 'drizzle-orm';
import { getPool, schema, closeDb } from '$lib/server/db';
import { lots, organisations, parts } from '$lib/server/db/schema';
import { listLots } from '$lib/server/services/lots';
import { findUserByEmail, toSessionUser } from '$lib/server/services/users';
const pool = getPool();
const buyer = toSessionUser((await findUserByEmail('buyer@kestrel-mobility.example'))!);
const db = drizzle(pool, { schema });
const slim = () => db.select({ id: lots.id, lotCode: lots.lotCode, poNumber: lots.poNumber, supplierName: organisations.name, partNumber: parts.partNumber, chemistry: parts.chemistry, quantity: lots.quantity, declaredSoc: lots.declaredSoc, transport: lots.transport, status: lots.status, expectedArrival: lots.expectedArrival, createdAt: lots.createdAt, cursorAt: sql<string>`${lots.createdAt}::text` })
  .from(lots).innerJoin(organisations, eq(organisations.id, lots.supplierId)).innerJoin(parts, eq(parts.id, lots.partId)).orderBy(desc(lots.createdAt), desc(lots.id)).limit(51);
const prepared = slim().prepare('lot_list_first');
const time = async (name: string, fn: () => Promise<unknown>) => {
  for (let i = 0; i < 50; i++) await fn();
  const xs: number[] = [];
  for (let r = 0; r < 15; r++) { const t = performance.now(); for (let i = 0; i < 20; i++) await fn(); xs.push((performance.now() - t) / 20); }
  xs.sort((a, b) => a - b); console.log(name, xs[7].toFixed(3));
};
for (let k = 0; k < 2; k++) {
await time('listLots', () => listLots(db, buyer, { limit: 50 }));
await time('slim drizzle', () => slim());
await time('slim prepared', () => prepared.execute());
await time('bare', () => pool.query('select * from lots order by created_at desc limit 50'));
}
await closeDb();
