#!/usr/bin/env node
// `npm run backup [-- FILE]`: a pg_dump (custom format) of the app database.
import { resolve } from 'node:path';
import { projectDatabaseUrl } from './lib/database-url.mjs';
import { findPgBin } from './lib/pg.mjs';
import { run } from './lib/proc.mjs';

const root = resolve(import.meta.dirname, '..');
const stamp = new Date().toISOString().replace(/[:.]/g, '-');
const file = resolve(process.argv[2] ?? `restvolt-backup-${stamp}.dump`);
const bin = findPgBin();
if (!bin) throw new Error('pg_dump not found: install the Debian package postgresql-client');
run(`${bin}/pg_dump`, ['--format=custom', '--no-owner', '--file', file, projectDatabaseUrl(root)]);
console.log(file);
