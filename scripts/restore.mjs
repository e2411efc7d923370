#!/usr/bin/env node
// `npm run restore -- FILE`: replaces the app database's contents with a backup made by `npm run backup`.
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { projectDatabaseUrl } from './lib/database-url.mjs';
import { findPgBin } from './lib/pg.mjs';
import { run } from './lib/proc.mjs';
import { grantAppRole, OWNER_ROLE, roleExists } from './lib/roles.mjs';

const root = resolve(import.meta.dirname, '..');
const file = process.argv[2];
if (!file || !existsSync(file)) {
	console.error('usage: npm run restore -- FILE   (a file written by npm run backup)');
	process.exit(2);
}
const bin = findPgBin();
if (!bin) throw new Error('pg_restore not found: install the Debian package postgresql-client');
const url = projectDatabaseUrl(root);
// The restored tables belong to the owner role (scripts/lib/roles.mjs), as migrations made them.
const asOwner = (await roleExists(url, OWNER_ROLE)) ? [`--role=${OWNER_ROLE}`] : [];
// --clean --if-exists drops what the dump contains before recreating it, in one transaction.
run(`${bin}/pg_restore`, [
	'--clean',
	'--if-exists',
	'--no-owner',
	...asOwner,
	'--single-transaction',
	'--exit-on-error',
	'--dbname',
	url,
	resolve(file)
]);
// A backup from before the app role existed carries no grants for it.
await grantAppRole(url);
console.log(`restored ${resolve(file)}`);
