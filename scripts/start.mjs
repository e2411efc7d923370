#!/usr/bin/env node
// `npm start`: install what is missing, start PostgreSQL and the local mail peer, migrate, seed the
// demo scenario, build and serve Restvolt on http://127.0.0.1:$PORT. Ctrl-C stops everything.
import { spawn } from 'node:child_process';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { ensureKitSync, ensureNodeModules } from './lib/deps.mjs';
import { firstFreePort, runInherit, waitForHttp } from './lib/proc.mjs';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const dataRoot = join(root, '.data');
process.chdir(root);
await ensureNodeModules(root);
await ensureKitSync(root);

const { ensurePostgres } = await import('./lib/pg.mjs');
const { ownedDatabase } = await import('./lib/roles.mjs');
const { startMailPeer } = await import('./lib/mail-peer.mjs');
const { migrateDatabase } = await import('./lib/migrate.mjs');
const { ensureBuild } = await import('./lib/build.mjs');
const { appEnv, authSecret } = await import('./lib/env.mjs');

const cleanups = [];
// Least privilege (scripts/lib/roles.mjs): migrations and the seed run as the owner role, the app
// as a role that cannot change tables or the audit trail. With your own DATABASE_URL, that role
// migrates, and APP_DATABASE_URL (when set) is what the app connects with.
let databaseUrl = process.env.DATABASE_URL;
let appDatabaseUrl = process.env.APP_DATABASE_URL ?? databaseUrl;
if (!databaseUrl) {
	const pg = await ensurePostgres({ dataDir: join(dataRoot, 'pg'), preferredPort: Number(process.env.PGPORT ?? 5432) });
	if (!pg.reused) cleanups.push(pg.stop);
	({ ownerUrl: databaseUrl, appUrl: appDatabaseUrl } = await ownedDatabase(pg.url, 'restvolt'));
}

let smtpPort = null;
let mailHttpPort = null;
if (!process.env.SMTP_URL) {
	smtpPort = await firstFreePort(Number(process.env.SMTP_PORT ?? 2525));
	mailHttpPort = await firstFreePort(Number(process.env.MAIL_HTTP_PORT ?? 8025));
	const peer = await startMailPeer({ smtpPort, httpPort: mailHttpPort, dir: join(dataRoot, 'mail') });
	cleanups.unshift(peer.stop);
}

const port = await firstFreePort(Number(process.env.PORT ?? 3000));
const env = appEnv({ port, databaseUrl: appDatabaseUrl, smtpPort, mailHttpPort, secret: authSecret(dataRoot) });

await migrateDatabase(databaseUrl, root);
// The seed decides demo lots, which writes supplier notices with portal links: give it the app's origin.
const seedCode = await runInherit('npx', ['tsx', 'seed/index.ts'], { env: { ...process.env, DATABASE_URL: databaseUrl, ORIGIN: env.ORIGIN } });
if (seedCode !== 0) throw new Error('seeding the demo scenario failed');
await ensureBuild(root);
const app = spawn(process.execPath, ['build'], { env, stdio: 'inherit' });
cleanups.unshift(() => new Promise((r) => (app.exitCode !== null ? r() : (app.once('exit', r), app.kill('SIGTERM')))));
await waitForHttp(`http://127.0.0.1:${port}/api/v1/health`, { timeoutMs: 60_000 });

console.log(`
  Restvolt is running at ${env.ORIGIN}
  Demo sign-ins (invented demo data; the password is for demo staff only):
    buyer@kestrel-mobility.example · inspector@kestrel-mobility.example · quality@kestrel-mobility.example
    admin@kestrel-mobility.example — password restvolt-demo-2026
    suppliers sign in by e-mailed link, e.g. supplier@voltaria-cells.example (read the link in the mail below)
  Sent mail: ${mailHttpPort ? `http://127.0.0.1:${mailHttpPort}/` : env.SMTP_URL}
  Ctrl-C stops the app, the mail peer and PostgreSQL.
`);

let stopping = false;
async function shutdown(code = 0) {
	if (stopping) return;
	stopping = true;
	for (const cleanup of cleanups) await cleanup().catch((e) => console.error(e));
	process.exit(code);
}
process.on('SIGINT', () => shutdown(0));
process.on('SIGTERM', () => shutdown(0));
app.on('exit', (code) => shutdown(code ?? 1));
