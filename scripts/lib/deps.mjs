// Installs what is missing: npm packages when node_modules is absent or older than the lock file,
// and (as root, from Debian) PostgreSQL, Chromium and poppler-utils. Node built-ins only.
import { existsSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { commandExists, isRoot, run, runInherit, runLogged } from './proc.mjs';

/** `logFile`: npm's output goes there (shown only when it fails). */
export async function ensureNodeModules(root, { logFile } = {}) {
	const marker = join(root, 'node_modules', '.package-lock.json');
	const lock = join(root, 'package-lock.json');
	const stale = !existsSync(marker) || statSync(lock).mtimeMs > statSync(marker).mtimeMs + 1000;
	if (!stale) return;
	console.log('[restvolt] installing npm packages (npm ci)…');
	const args = ['ci', '--no-audit', '--no-fund'];
	const code = logFile ? await runLogged('npm', args, { cwd: root, logFile }) : await runInherit('npm', args, { cwd: root });
	if (code !== 0) throw new Error('npm ci failed');
}

/** Ensure Debian packages that provide `commands`; install them with apt-get when root. */
export function ensureDebianPackages(packages, commands) {
	const missing = commands.filter((cmd) => !commandExists(cmd));
	if (missing.length === 0) return;
	if (!isRoot()) {
		throw new Error(`Missing ${missing.join(', ')}. Install the Debian packages: sudo apt-get install -y ${packages.join(' ')}`);
	}
	console.log(`[restvolt] installing Debian packages: ${packages.join(' ')}…`);
	run('apt-get', ['update', '-qq'], { stdio: 'ignore' });
	run('apt-get', ['install', '-y', '-qq', ...packages], {
		env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
		stdio: 'ignore'
	});
}

/** Generate .svelte-kit/ (tsconfig paths for $lib), which the seed and scripts run through tsx rely on. */
export async function ensureKitSync(root, { logFile } = {}) {
	const opts = { cwd: root, env: { ...process.env, RESTVOLT_KIT_DIR: '' } };
	const code = logFile
		? await runLogged('npx', ['svelte-kit', 'sync'], { ...opts, logFile })
		: await runInherit('npx', ['svelte-kit', 'sync'], opts);
	if (code !== 0) throw new Error('svelte-kit sync failed');
}
