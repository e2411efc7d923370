#!/usr/bin/env node
// `npm start`: install what is missing, start PostgreSQL and the local mail peer, migrate, seed the
// demo scenario, build and serve Restvolt on http://127.0.0.1:$PORT. Ctrl-C stops everything.
// Quiet by design: one line per step; the output of npm, the seed and the build goes to
// .data/logs/ and is shown only when that step fails. A failing step stops what was started.
import { spawn } from 'node:child_process';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { ensureKitSync, ensureNodeModules } from './lib/deps.mjs';
import { firstFreePort, runLogged, waitForHttp } from './lib/proc.mjs';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const dataRoot = join(root, '.data');
const logs = join(dataRoot, 'logs');
process.chdir(root);

const cleanups = [];
let stopping = false;
async function shutdown(code = 0) {
	if (stopping) return;
	stopping = true;
	for (const cleanup of cleanups) await cleanup().catch((e) => console.error(e));
	process.exit(code);
}
process.on('SIGINT', () => shutdown(0));
process.on('SIGTERM', () => shutdown(0));

/**
 * The first line of an error and of its causes, joined: a failed query's own message names only the
 * statement, its cause says why (e.g. "connect ECONNREFUSED 127.0.0.1:5432").
 */
function oneLineReason(error) {
	const parts = [];
	for (let e = error; e !== undefined && e !== null && parts.length < 3; e = e instanceof Error ? e.cause : undefined) {
		const text = e instanceof Error ? e.message || e.code || e.name : String(e);
		const line = String(text).split('\n')[0].trim();
		if (line) parts.push(line);
	}
	return parts.join(': ');
}

/** One step: a line saying what happens, the work, and on failure a one-line reason and a clean stop. */
async function step(what, work) {
	console.log(`[restvolt] ${what}…`);
	try {
		return await work();
	} catch (error) {
		console.error(`[restvolt] ${what} failed: ${oneLineReason(error)}`);
		await shutdown(1);
	}
}

const quiet = () => {}; // the helpers' own progress lines; the step line says it already

await step('checking npm packages', async () => {
	await ensureNodeModules(root, { logFile: join(logs, 'npm-ci.log') });
	await ensureKitSync(root, { logFile: join(logs, 'kit-sync.log') });
});

const { ensurePostgres } = await import('./lib/pg.mjs');
const { ownedDatabase } = await import('./lib/roles.mjs');
const { startMailPeer } = await import('./lib/mail-peer.mjs');
const { migrateDatabase } = await import('./lib/migrate.mjs');
const { ensureBuild } = await import('./lib/build.mjs');
const { appEnv, authSecret } = await import('./lib/env.mjs');

// Least privilege (scripts/lib/roles.mjs): migrations and the seed run as the owner role, the app
// as a role that cannot change tables or the audit trail. With your own DATABASE_URL, that role
// migrates, and APP_DATABASE_URL (when set) is what the app connects with.
let databaseUrl = process.env.DATABASE_URL;
let appDatabaseUrl = process.env.APP_DATABASE_URL ?? databaseUrl;
if (!databaseUrl) {
	await step('starting PostgreSQL', async () => {
		const pg = await ensurePostgres({ dataDir: join(dataRoot, 'pg'), preferredPort: Number(process.env.PGPORT ?? 5432), log: quiet });
		if (!pg.reused) cleanups.push(pg.stop);
		({ ownerUrl: databaseUrl, appUrl: appDatabaseUrl } = await ownedDatabase(pg.url, 'restvolt'));
	});
}

let smtpPort = null;
let mailHttpPort = null;
if (!process.env.SMTP_URL) {
	await step('starting the local mail peer', async () => {
		smtpPort = await firstFreePort(Number(process.env.SMTP_PORT ?? 2525));
		mailHttpPort = await firstFreePort(Number(process.env.MAIL_HTTP_PORT ?? 8025));
		const peer = await startMailPeer({ smtpPort, httpPort: mailHttpPort, dir: join(dataRoot, 'mail'), log: quiet });
		cleanups.unshift(peer.stop);
	});
}

const port = await firstFreePort(Number(process.env.PORT ?? 3000));
const env = appEnv({ port, databaseUrl: appDatabaseUrl, smtpPort, mailHttpPort, secret: authSecret(dataRoot) });

await step('migrating the database', () => migrateDatabase(databaseUrl, root));
await step('seeding the demo scenario', async () => {
	// The seed decides demo lots, which writes supplier notices with portal links: give it the app's origin.
	const seedEnv = { ...process.env, DATABASE_URL: databaseUrl, ORIGIN: env.ORIGIN };
	const code = await runLogged('npx', ['tsx', 'seed/index.ts'], { env: seedEnv, logFile: join(logs, 'seed.log') });
	if (code !== 0) throw new Error(`the seed exited with ${code} (see ${join(logs, 'seed.log')})`);
});
await step('checking the build', () => ensureBuild(root, { logFile: join(logs, 'build.log'), log: quiet }));

await step('starting the app', async () => {
	const child = spawn(process.execPath, ['build'], { env, stdio: 'inherit' });
	cleanups.unshift(() => new Promise((r) => (child.exitCode !== null ? r() : (child.once('exit', r), child.kill('SIGTERM')))));
	child.on('exit', (code) => shutdown(code ?? 1));
	await waitForHttp(`http://127.0.0.1:${port}/api/v1/health`, { timeoutMs: 60_000 });
});

console.log(`
  Restvolt is running at ${env.ORIGIN}
  Demo sign-ins (invented demo data; the password is for demo staff only):
    buyer@kestrel-mobility.example · inspector@kestrel-mobility.example · quality@kestrel-mobility.example
    admin@kestrel-mobility.example — password restvolt-demo-2026
    suppliers sign in by e-mailed link, e.g. supplier@voltaria-cells.example (read the link in the mail below)
  Sent mail: ${mailHttpPort ? `http://127.0.0.1:${mailHttpPort}/` : env.SMTP_URL}
  Logs of the start-up steps: ${logs}
  Ctrl-C stops the app, the mail peer and PostgreSQL (when this command started them).
`);
