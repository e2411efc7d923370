/**
 * Seeds the invented demo scenario. Idempotent: every row is found by its natural key first,
 * so running it twice changes nothing. Refuses to run with NODE_ENV=production (demo passwords).
 */
import { closeDb, getDb } from '../src/lib/server/db';
import { seedPeople } from './people';
import { seedModelsAndParts } from './parts';
import { seedLots } from './lots';

if (process.env.NODE_ENV === 'production' && process.env.RESTVOLT_ALLOW_DEMO_SEED !== 'yes') {
	console.error('[seed] refusing to seed demo users with demo passwords when NODE_ENV=production');
	process.exit(1);
}

const db = getDb();
try {
	const people = await seedPeople(db);
	const parts = await seedModelsAndParts(db, people);
	// SEED_LOTS=off gives people, models and parts only: the tests' clean starting point.
	const lots = process.env.SEED_LOTS === 'off' ? 0 : await seedLots(db, people, parts);
	console.log(`[seed] demo scenario ready: ${people.suppliers.size} suppliers, ${parts.size} parts, ${lots} lots`);
} finally {
	await closeDb();
}
