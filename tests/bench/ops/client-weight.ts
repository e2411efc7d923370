/**
 * (6) Client weight: the JavaScript the inspection page (/lots/{id}/inspect) loads, gzipped. The
 * page is fetched signed in; every module it references (modulepreload links and the entry
 * imports of its start script) is fetched and gzipped at level 9, as adapter-node precompresses.
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

function scriptUrls(html: string): string[] {
	const urls = new Set<string>();
	for (const m of html.matchAll(/<link[^>]+rel="modulepreload"[^>]*href="([^"]+)"/g)) urls.add(m[1]);
	for (const m of html.matchAll(/<link[^>]+href="([^"]+)"[^>]*rel="modulepreload"/g)) urls.add(m[1]);
	for (const m of html.matchAll(/import\(\s*"([^"]+\.js)"\s*\)/g)) urls.add(m[1]);
	for (const m of html.matchAll(/<script[^>]+src="([^"]+)"/g)) urls.add(m[1]);
	return [...urls];
}

async function pageJs(pageUrl: string, cookie?: string): Promise<Array<{ path: string; gzipBytes: number }>> {
	const response = await fetch(pageUrl, { headers: cookie ? { cookie } : {}, redirect: 'manual' });
	const html = await response.text();
	if (response.status !== 200) throw new Error(`${new URL(pageUrl).pathname} answered ${response.status}`);
	const files = [];
	for (const ref of scriptUrls(html)) {
		const url = new URL(ref, pageUrl);
		const asset = await fetch(url);
		if (asset.status !== 200) throw new Error(`${url.pathname} answered ${asset.status}`);
		const bytes = Buffer.from(await asset.arrayBuffer());
		files.push({ path: url.pathname, gzipBytes: gzipSync(bytes, { level: 9 }).length });
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
