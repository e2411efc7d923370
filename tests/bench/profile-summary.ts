/**
 * Summarise a V8 CPU profile (from `node --cpu-prof`, e.g. BENCH_PROFILE_DIR=… npm run bench):
 * the functions with the most self time.   Usage: npx tsx tests/bench/profile-summary.ts FILE [N]
 */
import { readFileSync } from 'node:fs';

interface ProfileNode {
	id: number;
	callFrame: { functionName: string; url: string; lineNumber: number };
	hitCount?: number;
}
interface Profile {
	nodes: ProfileNode[];
	samples: number[];
	timeDeltas: number[];
}

const [file, count = '25'] = process.argv.slice(2);
const profile = JSON.parse(readFileSync(file, 'utf8')) as Profile;
const selfUs = new Map<number, number>();
profile.samples.forEach((id, i) => selfUs.set(id, (selfUs.get(id) ?? 0) + (profile.timeDeltas[i] ?? 0)));
const byFunction = new Map<string, number>();
for (const node of profile.nodes) {
	const { functionName, url, lineNumber } = node.callFrame;
	const key = `${functionName || '(anonymous)'} ${url.replace(/^.*\/(node_modules|build[^/]*|src)\//, '$1/')}:${lineNumber + 1}`;
	byFunction.set(key, (byFunction.get(key) ?? 0) + (selfUs.get(node.id) ?? 0));
}
const total = [...byFunction.values()].reduce((a, b) => a + b, 0);
for (const [key, us] of [...byFunction].sort((a, b) => b[1] - a[1]).slice(0, Number(count))) {
	console.log(`${((us / total) * 100).toFixed(1).padStart(5)}%  ${(us / 1000).toFixed(0).padStart(6)} ms  ${key}`);
}

// Busy time by package (or app chunk), to see which layer a slow request spends its time in.
const byPackage = new Map<string, number>();
for (const [key, us] of byFunction) {
	if (key.startsWith('(idle)') || key.startsWith('(program)')) continue;
	const where = key.split(' ').at(-1) ?? '';
	const pkg =
		/node_modules\/((@[^/]+\/)?[^/]+)/.exec(where)?.[1] ??
		(where.startsWith('node:') ? 'node' : where.startsWith('build') ? 'app' : where.startsWith(':') ? key.split(' ')[0] : 'other');
	byPackage.set(pkg, (byPackage.get(pkg) ?? 0) + us);
}
const busy = [...byPackage.values()].reduce((a, b) => a + b, 0);
console.log(`\nbusy ${(busy / 1000).toFixed(0)} ms by package:`);
for (const [pkg, us] of [...byPackage].sort((a, b) => b[1] - a[1]).slice(0, 15)) {
	console.log(`${((us / busy) * 100).toFixed(1).padStart(5)}%  ${(us / 1000).toFixed(0).padStart(6)} ms  ${pkg}`);
}
