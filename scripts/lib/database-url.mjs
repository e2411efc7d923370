// The database the project's own commands talk to: DATABASE_URL, else the cluster `npm start` runs in .data/pg.
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { usableDataDir } from './pg.mjs';

export function projectDatabaseUrl(root) {
	if (process.env.DATABASE_URL) return process.env.DATABASE_URL;
	const portFile = join(usableDataDir(join(root, '.data', 'pg')), 'restvolt.port');
	if (!existsSync(portFile)) {
		throw new Error('No DATABASE_URL and no running local cluster: start the app with `npm start` first');
	}
	return `postgres://postgres@127.0.0.1:${readFileSync(portFile, 'utf8').trim()}/restvolt`;
}
