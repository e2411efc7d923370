#!/usr/bin/env node
// `npm test`: install what is missing, start a throw-away PostgreSQL cluster and mail peer on free
// ports, run svelte-check, the unit and services tests (vitest; no build needed), build the app,
// then the integration tests (vitest) and the browser tests (Playwright + Debian's Chromium).
// Stops everything; non-zero exit on any failure.
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { ensureDebianPackages, ensureKitSync, ensureNodeModules } from './lib/deps.mjs';
import { freePort, runInherit } from './lib/proc.mjs';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
process.chdir(root);
// e.g. `npm test -- unit integration`; other words filter the files of the test stages
// (`npm test -- integration e2e access-matrix journey` runs those files only).
const STAGES = ['check', 'lint', 'unit', 'services', 'integration', 'e2e'];
const only = process.argv.slice(2).filter((a) => STAGES.includes(a));
const fileFilters = process.argv.slice(2).filter((a) => !STAGES.includes(a));
const wants = (stage) => only.length === 0 || only.includes(stage);

await ensureNodeModules(root);
await ensureKitSync(root);
ensureDebianPackages(['chromium', 'poppler-utils'], ['chromium', 'pdftotext', 'pdfinfo', 'pdftoppm']);

const { ensurePostgres } = await import('./lib/pg.mjs');
const { ownedDatabase } = await import('./lib/roles.mjs');
const { startMailPeer } = await import('./lib/mail-peer.mjs');
const { migrateDatabase } = await import('./lib/migrate.mjs');
const { ensureBuild } = await import('./lib/build.mjs');

const scratch = mkdtempSync(join(tmpdir(), 'restvolt-test-'));
chmodSync(scratch, 0o755); // the postgres user must be able to enter it
const pg = await ensurePostgres({ dataDir: join(scratch, 'pg'), preferredPort: await freePort(), throwaway: true });
const smtpPort = await freePort();
const mailHttpPort = await freePort();
const peer = await startMailPeer({ smtpPort, httpPort: mailHttpPort, dir: join(scratch, 'mail') });

/**
 * Two templates: the full demo scenario, and its people, models and parts without any lots.
 * Migrated and seeded as the owner role (scripts/lib/roles.mjs); copies keep owner and grants.
 */
async function prepareTemplates(serverUrl) {
	for (const [name, seedLots] of [
		['restvolt_template', 'on'],
		['restvolt_base', 'off']
	]) {
		const { ownerUrl } = await ownedDatabase(serverUrl, name);
		await migrateDatabase(ownerUrl, root);
		const code = await runInherit('npx', ['tsx', 'seed/index.ts'], {
			env: { ...process.env, DATABASE_URL: ownerUrl, SEED_LOTS: seedLots }
		});
		if (code !== 0) throw new Error(`seeding the ${name} database failed`);
	}
}

const failures = [];
try {
	await prepareTemplates(pg.url);

	const env = {
		...process.env,
		TEST_PG_URL: pg.url,
		TEST_PG_BIN: pg.bin,
		TEST_PG_DATA: pg.dataDir,
		TEST_TEMPLATE_DB: 'restvolt_template',
		TEST_BASE_DB: 'restvolt_base',
		TEST_SMTP_PORT: String(smtpPort),
		TEST_MAIL_HTTP_URL: `http://127.0.0.1:${mailHttpPort}`,
		TEST_SCRATCH: scratch,
		DATABASE_URL: (await ownedDatabase(pg.url, 'restvolt_test', 'restvolt_template')).superUrl
	};
	const stages = [
		['check', 'npx', ['svelte-kit', 'sync']],
		['check', 'npx', ['svelte-check', '--tsconfig', './tsconfig.json', '--fail-on-warnings']],
		// Prettier's formatting and ESLint's rules (eslint.config.js), no warnings allowed.
		['lint', 'npm', ['run', '--silent', 'lint']],
		// The benchmark runs under tsx, which does not type-check; keep it compiling against the services.
		['check', 'npx', ['tsc', '-p', 'tests/bench/tsconfig.json']],
		['unit', 'npx', ['vitest', 'run', '--project', 'unit']],
		// Service functions on the real PostgreSQL need no build: they run before it, and fail fast.
		['services', 'npx', ['vitest', 'run', '--project', 'services']],
		['build'],
		['integration', 'npx', ['vitest', 'run', '--project', 'integration']],
		['e2e', 'npx', ['playwright', 'test']]
	];
	for (const [stage, cmd, args] of stages) {
		if (stage === 'build') {
			if (wants('e2e') || wants('integration')) await ensureBuild(root);
			continue;
		}
		if (!wants(stage)) continue;
		console.log(`\n[restvolt] ── ${stage}: ${cmd} ${args.join(' ')}`);
		const filtered = ['unit', 'services', 'integration', 'e2e'].includes(stage) ? [...args, ...fileFilters] : args;
		const code = await runInherit(cmd, filtered, { env });
		if (code !== 0) failures.push(stage);
	}
} catch (error) {
	console.error(error);
	failures.push('setup');
} finally {
	await peer.stop();
	await pg.stop();
	rmSync(scratch, { recursive: true, force: true });
}

if (failures.length) {
	console.error(`\n[restvolt] FAILED: ${[...new Set(failures)].join(', ')}`);
	process.exit(1);
}
console.log('\n[restvolt] all tests passed');
