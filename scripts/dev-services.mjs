#!/usr/bin/env node
// For developers running single test files: starts a throw-away PostgreSQL (with a migrated, seeded
// template database) and a mail peer, writes the TEST_* variables to FILE (default .data/test-env.sh)
// and keeps running until Ctrl-C.   Usage: node scripts/dev-services.mjs [FILE]
//   then: source .data/test-env.sh && npx vitest run --project integration tests/integration/x.test.ts
import { chmodSync, mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { ensurePostgres } from './lib/pg.mjs';
import { ownedDatabase } from './lib/roles.mjs';
import { startMailPeer } from './lib/mail-peer.mjs';
import { migrateDatabase } from './lib/migrate.mjs';
import { freePort, runInherit } from './lib/proc.mjs';
import { ensureKitSync } from './lib/deps.mjs';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const envFile = resolve(process.argv[2] ?? join(root, '.data', 'test-env.sh'));
await ensureKitSync(root);
const scratch = mkdtempSync(join(tmpdir(), 'restvolt-dev-'));
chmodSync(scratch, 0o755); // the postgres user must be able to enter it
const pg = await ensurePostgres({ dataDir: join(scratch, 'pg'), preferredPort: await freePort(), throwaway: true });
const smtpPort = await freePort();
const httpPort = await freePort();
const peer = await startMailPeer({ smtpPort, httpPort, dir: join(scratch, 'mail') });
for (const [name, seedLots] of [
	['restvolt_template', 'on'],
	['restvolt_base', 'off']
]) {
	// Migrated and seeded as the owner role; the app connects as the app role (scripts/lib/roles.mjs).
	const { ownerUrl } = await ownedDatabase(pg.url, name);
	await migrateDatabase(ownerUrl, root);
	const code = await runInherit('npx', ['tsx', 'seed/index.ts'], {
		cwd: root,
		env: { ...process.env, DATABASE_URL: ownerUrl, SEED_LOTS: seedLots }
	});
	if (code !== 0) console.error(`[dev-services] seeding ${name} failed`);
}
const dbUrl = (await ownedDatabase(pg.url, 'restvolt_test', 'restvolt_template')).superUrl;
const vars = {
	TEST_PG_URL: pg.url,
	TEST_PG_BIN: pg.bin,
	TEST_PG_DATA: pg.dataDir,
	TEST_TEMPLATE_DB: 'restvolt_template',
	TEST_BASE_DB: 'restvolt_base',
	TEST_SMTP_PORT: smtpPort,
	TEST_MAIL_HTTP_URL: `http://127.0.0.1:${httpPort}`,
	TEST_SCRATCH: scratch,
	DATABASE_URL: dbUrl
};
mkdirSync(dirname(envFile), { recursive: true });
writeFileSync(
	envFile,
	Object.entries(vars)
		.map(([k, v]) => `export ${k}='${v}'`)
		.join('\n') + '\n'
);
console.log(`[dev-services] ready; source ${envFile}`);
const stop = async () => {
	await peer.stop();
	await pg.stop();
	process.exit(0);
};
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
