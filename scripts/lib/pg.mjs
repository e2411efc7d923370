// A PostgreSQL cluster owned by the project: initdb'd into a folder of its own, listening on
// 127.0.0.1 only, run as the `postgres` system user when we are root (initdb refuses root).
import { spawnSync } from 'node:child_process';
import { chownSync, existsSync, mkdirSync, readdirSync, readFileSync, realpathSync, writeFileSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { dirname, join } from 'node:path';
import { ensureDebianPackages } from './deps.mjs';
import { firstFreePort, isRoot, run } from './proc.mjs';

export function findPgBin() {
	const found = spawnSync('sh', ['-c', 'command -v pg_ctl'], { encoding: 'utf8' });
	// Follow links (e.g. /usr/local/bin/pg_ctl -> /usr/lib/postgresql/15/bin) to find pg_dump and friends too.
	if (found.status === 0) return dirname(realpathSync(found.stdout.trim()));
	const base = '/usr/lib/postgresql';
	if (!existsSync(base)) return null;
	const versions = readdirSync(base).filter((v) => existsSync(join(base, v, 'bin', 'pg_ctl')));
	versions.sort((a, b) => Number(b) - Number(a));
	return versions.length ? join(base, versions[0], 'bin') : null;
}

function pgBinOrInstall() {
	let bin = findPgBin();
	if (!bin) {
		ensureDebianPackages(['postgresql'], ['no-such-command-restvolt-pg']);
		bin = findPgBin();
	}
	if (!bin) throw new Error('PostgreSQL server binaries not found; install the Debian package postgresql');
	return bin;
}

/** Run a PG binary, as `postgres` when we are root. */
function pgRun(bin, tool, args) {
	const cmd = join(bin, tool);
	return isRoot() ? run('runuser', ['-u', 'postgres', '--', cmd, ...args]) : run(cmd, args);
}

/** postgres must be able to reach the folder; otherwise use a folder under /var/tmp keyed by path. */
export function usableDataDir(preferred) {
	if (!isRoot()) return preferred;
	mkdirSync(dirname(preferred), { recursive: true });
	const ok = spawnSync('runuser', ['-u', 'postgres', '--', 'test', '-x', dirname(preferred)]).status === 0;
	if (ok) return preferred;
	const key = createHash('sha256').update(preferred).digest('hex').slice(0, 12);
	return join('/var/tmp', `restvolt-${key}`, 'pg');
}

function isRunning(bin, dataDir) {
	if (!existsSync(join(dataDir, 'postmaster.pid'))) return false;
	const cmd = join(bin, 'pg_ctl');
	const args = ['-D', dataDir, 'status'];
	const res = isRoot() ? spawnSync('runuser', ['-u', 'postgres', '--', cmd, ...args]) : spawnSync(cmd, args);
	return res.status === 0;
}

/**
 * Start (or reuse) the cluster in `dataDir`. Returns { url, port, dataDir, bin, reused, stop }.
 * `throwaway` trades durability for speed (tests only).
 */
export async function ensurePostgres({ dataDir, preferredPort = 5432, throwaway = false, log = console.log }) {
	const bin = pgBinOrInstall();
	dataDir = usableDataDir(dataDir);
	const portFile = join(dataDir, 'restvolt.port');
	const url = (port) => `postgres://postgres@127.0.0.1:${port}`;
	if (isRunning(bin, dataDir) && existsSync(portFile)) {
		const port = Number(readFileSync(portFile, 'utf8'));
		log(`[restvolt] reusing PostgreSQL on 127.0.0.1:${port} (${dataDir})`);
		return { url: url(port), port, dataDir, bin, reused: true, stop: async () => {} };
	}
	mkdirSync(dirname(dataDir), { recursive: true, mode: 0o755 });
	mkdirSync(dataDir, { recursive: true, mode: 0o700 });
	if (isRoot()) chownPostgres(dataDir);
	if (!existsSync(join(dataDir, 'PG_VERSION'))) {
		log(`[restvolt] creating PostgreSQL cluster in ${dataDir}`);
		pgRun(bin, 'initdb', ['-D', dataDir, '-U', 'postgres', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
	}
	const port = await firstFreePort(preferredPort);
	const options = [`-c listen_addresses=127.0.0.1`, `-p ${port}`, `-k ${socketDir(dataDir)}`];
	if (throwaway) options.push('-c fsync=off', '-c synchronous_commit=off', '-c full_page_writes=off');
	pgRun(bin, 'pg_ctl', ['-D', dataDir, '-l', join(dataDir, 'server.log'), '-w', '-t', '30', '-o', options.join(' '), 'start']);
	writeFileSync(portFile, String(port));
	if (isRoot()) chownPostgres(portFile);
	log(`[restvolt] PostgreSQL listening on 127.0.0.1:${port}`);
	const stop = async () => stopPostgres({ bin, dataDir });
	return { url: url(port), port, dataDir, bin, reused: false, stop };
}

export function stopPostgres({ bin, dataDir }) {
	if (!isRunning(bin, dataDir)) return;
	pgRun(bin, 'pg_ctl', ['-D', dataDir, '-m', 'fast', '-w', 'stop']);
}

/**
 * Restart with the same options (used by the fault tests). The log file matters: without `-l` the
 * new postmaster inherits pg_ctl's stdout, and the synchronous run() would wait for it to exit.
 */
export function restartPostgres({ bin, dataDir }) {
	pgRun(bin, 'pg_ctl', ['-D', dataDir, '-l', join(dataDir, 'server.log'), '-m', 'fast', '-w', '-t', '30', 'restart']);
}

function socketDir(dataDir) {
	// Unix socket paths are limited to ~107 bytes; the data folder is the natural place when short.
	return dataDir.length < 80 ? dataDir : '/tmp';
}

function chownPostgres(path) {
	const uid = Number(run('id', ['-u', 'postgres']).trim());
	const gid = Number(run('id', ['-g', 'postgres']).trim());
	chownSync(path, uid, gid);
}

/**
 * Create a database if it does not exist yet (optionally from a template, optionally owned by a
 * role: scripts/lib/roles.mjs's OWNER_ROLE). Returns its superuser URL.
 */
export async function ensureDatabase(serverUrl, name, template, { owner } = {}) {
	const { default: pg } = await import('pg');
	const client = new pg.Client({ connectionString: `${serverUrl}/postgres` });
	await client.connect();
	try {
		const { rowCount } = await client.query('select 1 from pg_database where datname = $1', [name]);
		if (rowCount === 0) {
			const ident = (s) => `"${s.replaceAll('"', '""')}"`;
			await client.query(
				`create database ${ident(name)}${template ? ` template ${ident(template)}` : ''}${owner ? ` owner ${ident(owner)}` : ''}`
			);
		}
	} finally {
		await client.end();
	}
	return `${serverUrl}/${name}`;
}
