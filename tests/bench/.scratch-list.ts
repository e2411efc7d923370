import { drizzle } from 'drizzle-orm/node-postgres';
import { getPool, schema, closeDb } from '$lib/server/db';
import { listLots } from '$lib/server/services/lots';
import { findUserByEmail, toSessionUser } from '$lib/server/services/users';
const pool = getPool();
const buyer = toSessionUser((await findUserByEmail('buyer@kestrel-mobility.example'))!);
const captured: any[] = [];
const logged = drizzle(pool, { schema, logger: { logQuery: (query, params) => captured.push({ query, params }) } });
await listLots(logged, buyer, { limit: 50 });
const { query, params } = captured.at(-1);
console.log(query);
const db = drizzle(pool, { schema });
const time = async (name: string, fn: () => Promise<unknown>) => {
  for (let i = 0; i < 50; i++) await fn();
  const xs: number[] = [];
  for (let r = 0; r < 15; r++) { const t = performance.now(); for (let i = 0; i < 20; i++) await fn(); xs.push((performance.now() - t) / 20); }
  xs.sort((a, b) => a - b); console.log(name, xs[7].toFixed(3));
};
for (let k = 0; k < 2; k++) {
await time('listLots', () => listLots(db, buyer, { limit: 50 }));
await time('same SQL raw pg', () => pool.query(query, params));
await time('same SQL raw pg rowMode array', () => pool.query({ text: query, values: params, rowMode: 'array' }));
await time('bare', () => pool.query('select * from lots order by created_at desc limit 50'));
await time('bare 51 rows + joins no lot cols', () => pool.query('select lots.id, organisations.name, parts.part_number from lots join organisations on organisations.id = lots.supplier_id join parts on parts.id = lots.part_id order by lots.created_at desc, lots.id desc limit 51'));
}
await closeDb();
