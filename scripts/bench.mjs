#!/usr/bin/env node
// `npm run bench`: a throw-away PostgreSQL cluster (migrated, demo-seeded), the built app (built
// here when older than the sources; RESTVOLT_BUILD_DIR chooses the folder, default build/), then
// the benchmark itself (tests/bench/run.ts, run with tsx). Stops everything and removes the scratch
// folder at the end. Not part of `npm test`: no test asserts a time.
import { chmodSync, existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { ensurePostgres } from './lib/pg.mjs';
import { ownedDatabase } from './lib/roles.mjs';
import { migrateDatabase } from './lib/migrate.mjs';
import { ensureBuild } from './lib/build.mjs';
import { freePort, runInherit } from './lib/proc.mjs';
import { cpuPlan, pinPostgres } from './lib/cpus.mjs';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
process.chdir(root);
const buildDir = process.env.RESTVOLT_BUILD_DIR ?? 'build';

/** Build into `dir` when it is older than the sources, unless BENCH_SKIP_BUILD=1 asks to measure the build as it is. */
async function ensureBuildIn(dir) {
	if (process.env.BENCH_SKIP_BUILD === '1' && existsSync(join(root, dir, 'handler.js'))) return;
	await ensureBuild(root, { dir, log: console.log });
}

// Ctrl-C reaches the benchmark too; wait for it to end so the cleanup below still runs.
process.on('SIGINT', () => {});
process.on('SIGTERM', () => {});

const scratch = mkdtempSync(join(tmpdir(), 'restvolt-bench-'));
chmodSync(scratch, 0o755); // the postgres user must be able to enter it
const quiet = () => {};
let pg;
let exitCode = 1;
try {
	pg = await ensurePostgres({ dataDir: join(scratch, 'pg'), preferredPort: await freePort(), throwaway: true, log: quiet });
	const cpus = cpuPlan();
	if (cpus) pinPostgres(pg.dataDir, cpus.rest);
	// Owner role for migrations, the seed and the bench's own setup; the app connects as the app role (tests/bench/lib/app.ts).
	const { ownerUrl: databaseUrl, superUrl } = await ownedDatabase(pg.url, 'restvolt_bench');
	await migrateDatabase(databaseUrl, root);
	const { NODE_ENV: _production, ...seedEnv } = process.env; // the demo seed refuses NODE_ENV=production
	const seeded = await runInherit('npx', ['tsx', 'seed/index.ts'], {
		env: { ...seedEnv, DATABASE_URL: databaseUrl, NODE_OPTIONS: '--no-deprecation' },
		stdio: ['ignore', 'ignore', 'inherit']
	});
	if (seeded !== 0) throw new Error('seeding the bench database failed');
	await ensureBuildIn(buildDir);
	// run.ts places itself before each operation (tests/bench/lib/cpus.ts, placeSelf).
	exitCode = await runInherit('npx', ['tsx', '--tsconfig', 'tests/bench/tsconfig.json', 'tests/bench/run.ts'], {
		env: {
			...process.env,
			DATABASE_URL: databaseUrl,
			BENCH_PG_URL: pg.url,
			// VACUUM of every table and CHECKPOINT before each operation need the superuser.
			BENCH_SUPER_DATABASE_URL: superUrl,
			BENCH_PG_BIN: pg.bin,
			BENCH_BUILD_DIR: buildDir,
			BENCH_SCRATCH: scratch,
			BENCH_APP_CPUS: cpus?.app ?? '',
			BENCH_REST_CPUS: cpus?.rest ?? ''
		}
	});
} catch (error) {
	console.error('[bench] setup failed:', error);
} finally {
	await pg?.stop();
	rmSync(scratch, { recursive: true, force: true });
}
process.exit(exitCode);
