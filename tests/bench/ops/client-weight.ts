/**
 * (6) Client weight: the JavaScript the inspection page (/lots/{id}/inspect) loads, gzipped. The
 * page is fetched signed in; every module it references (the modulepreload entries SvelteKit puts in
 * the Link header and the HTML, the entry imports of its start script, and their static imports,
 * followed transitively) is fetched once and gzipped at level 9, as adapter-node precompresses.
 * Floor: the same sum for the sign-in page, the lightest page of the app (mostly the framework).
 */
import { gzipSync } from 'node:zlib';
import { signInCookie } from '../lib/auth';
import type { BenchContext } from '../lib/context';
import type { BenchLine } from '../lib/measure';

export interface WeightResult {
	line: BenchLine;
	files: Array<{ path: string; gzipBytes: number }>;
}

function scriptUrls(html: string, linkHeader: string | null): string[] {
	const urls = new Set<string>();
	for (const m of (linkHeader ?? '').matchAll(/<([^>]+)>;\s*rel="modulepreload"/g)) urls.add(m[1]);
	for (const m of html.matchAll(/<link[^>]+rel="modulepreload"[^>]*href="([^"]+)"/g)) urls.add(m[1]);
	for (const m of html.matchAll(/<link[^>]+href="([^"]+)"[^>]*rel="modulepreload"/g)) urls.add(m[1]);
	for (const m of html.matchAll(/import\(\s*"([^"]+\.js)"\s*\)/g)) urls.add(m[1]);
	for (const m of html.matchAll(/<script[^>]+src="([^"]+)"/g)) urls.add(m[1]);
	return [...urls];
}

/** `import … from "./x.js"`, `import "./x.js"`, `export … from "./x.js"` — not lazy `import("…")`. */
function staticImports(code: string): string[] {
	return [...code.matchAll(/\b(?:import|export)\s*(?:[\w$*{}\s,]*?\s*from\s*)?["'](\.{1,2}\/[^"']+\.js)["']/g)].map((m) => m[1]);
}

async function pageJs(pageUrl: string, cookie?: string): Promise<Array<{ path: string; gzipBytes: number }>> {
	const response = await fetch(pageUrl, { headers: cookie ? { cookie } : {}, redirect: 'manual' });
	const html = await response.text();
	if (response.status !== 200) throw new Error(`${new URL(pageUrl).pathname} answered ${response.status}`);
	const files = [];
	const queue = scriptUrls(html, response.headers.get('link')).map((ref) => new URL(ref, pageUrl).href);
	const seen = new Set(queue);
	while (queue.length > 0) {
		const url = new URL(queue.shift()!);
		const asset = await fetch(url);
		if (asset.status !== 200) throw new Error(`${url.pathname} answered ${asset.status}`);
		const bytes = Buffer.from(await asset.arrayBuffer());
		files.push({ path: url.pathname, gzipBytes: gzipSync(bytes, { level: 9 }).length });
		for (const ref of staticImports(bytes.toString('utf8'))) {
			const next = new URL(ref, url).href;
			if (!seen.has(next)) {
				seen.add(next);
				queue.push(next);
			}
		}
	}
	if (files.length === 0) throw new Error(`${new URL(pageUrl).pathname} references no JavaScript`);
	return files;
}

const kb = (bytes: number) => bytes / 1024;

export async function benchClientWeight(ctx: BenchContext): Promise<WeightResult> {
	const cookie = await signInCookie(ctx.app.url);
	const files = await pageJs(`${ctx.app.url}/lots/${ctx.sampleLotId}/inspect`, cookie);
	const floorFiles = await pageJs(`${ctx.app.url}/signin`);
	const sum = (list: Array<{ gzipBytes: number }>) => list.reduce((n, f) => n + f.gzipBytes, 0);
	return {
		line: {
			name: 'inspect-page-js',
			value: kb(sum(files)),
			floor: kb(sum(floorFiles)),
			unit: 'KB',
			target: { on: 'value', op: '<=', value: 150, unit: 'KB' }
		},
		files: files.sort((a, b) => b.gzipBytes - a.gzipBytes)
	};
}
