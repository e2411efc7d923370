// Builds the app when its output folder is missing or older than the sources.
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { runInherit, runLogged } from './proc.mjs';

function newestMtime(path) {
	const st = statSync(path);
	if (!st.isDirectory()) return st.mtimeMs;
	return readdirSync(path).reduce((max, name) => Math.max(max, newestMtime(join(path, name))), st.mtimeMs);
}

/**
 * `logFile`: send vite's output there (shown only when the build fails) instead of the terminal.
 * `dir`: the output folder, the one svelte.config.js builds into (RESTVOLT_BUILD_DIR, default build/).
 */
export async function ensureBuild(
	root,
	{ force = false, logFile, log = console.log, dir = process.env.RESTVOLT_BUILD_DIR || 'build' } = {}
) {
	const handler = join(root, dir, 'handler.js');
	const inputs = ['src', 'static', 'svelte.config.js', 'vite.config.ts', 'package-lock.json'];
	const sourcesTime = Math.max(
		...inputs
			.map((p) => join(root, p))
			.filter(existsSync)
			.map(newestMtime)
	);
	if (!force && existsSync(handler) && statSync(handler).mtimeMs > sourcesTime) return;
	log(`[restvolt] building the app into ${dir}/ (vite build, about a minute)…`);
	const args = ['vite', 'build', '--logLevel', 'warn'];
	const code = logFile ? await runLogged('npx', args, { cwd: root, logFile }) : await runInherit('npx', args, { cwd: root });
	if (code !== 0) throw new Error('vite build failed');
}
