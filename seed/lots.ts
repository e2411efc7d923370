import type { Database } from '../src/lib/server/db';
import type { SeededPeople } from './people';
import type { SeededPart } from './parts';

// Filled in once the lot, reading and decision services exist.
export async function seedLots(_db: Database, _people: SeededPeople, _parts: Map<string, SeededPart>): Promise<number> {
	return 0;
}
