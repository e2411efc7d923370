/**
 * npm run token -- --email <email> [--label <text>]
 * Creates an API token for an existing, active user and prints it alone on the last line
 * (shown once; only its hash is stored). Uses DATABASE_URL, else the cluster `npm start` runs.
 */
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import { projectDatabaseUrl } from './lib/database-url.mjs';
import { closeDb } from '../src/lib/server/db';
import { createTokenForEmail, UnknownUserError } from '../src/lib/server/services/tokens';

const { values } = parseArgs({ options: { email: { type: 'string' }, label: { type: 'string' } } });

if (!values.email) {
	console.error('Usage: npm run token -- --email <email> [--label <text>]');
	process.exit(2);
}

try {
	process.env.DATABASE_URL = projectDatabaseUrl(resolve(dirname(fileURLToPath(import.meta.url)), '..'));
	const created = await createTokenForEmail(values.email, values.label ?? 'command line');
	console.error(`Token ${created.prefix}… created for ${values.email}. Store it now: it is not shown again.`);
	console.log(created.token);
} catch (error) {
	console.error(error instanceof UnknownUserError ? error.message : error);
	process.exitCode = 1;
} finally {
	await closeDb();
}
