// Builds the app when build/ is missing or older than the sources.
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { runInherit } from './proc.mjs';

function newestMtime(path) {
	const st = statSync(path);
	if (!st.isDirectory()) return st.mtimeMs;
	return readdirSync(path).reduce((max, name) => Math.max(max, newestMtime(join(path, name))), st.mtimeMs);
}

export async function ensureBuild(root, { force = false } = {}) {
	const handler = join(root, 'build', 'handler.js');
	const inputs = ['src', 'static', 'svelte.config.js', 'vite.config.ts', 'tailwind.config.ts', 'package-lock.json'];
	const sourcesTime = Math.max(...inputs.map((p) => join(root, p)).filter(existsSync).map(newestMtime));
	if (!force && existsSync(handler) && statSync(handler).mtimeMs > sourcesTime) return;
	console.log('[restvolt] building the app (vite build)…');
	const code = await runInherit('npx', ['vite', 'build', '--logLevel', 'warn'], { cwd: root });
	if (code !== 0) throw new Error('vite build failed');
}
