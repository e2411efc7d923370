// Small process helpers shared by the start, test and bench scripts (node built-ins only).
import { spawn, spawnSync } from 'node:child_process';
import { closeSync, mkdirSync, openSync, readFileSync } from 'node:fs';
import { dirname } from 'node:path';
import net from 'node:net';

export const isRoot = () => typeof process.getuid === 'function' && process.getuid() === 0;

/** Run a command to completion; throws with its output when it fails. */
export function run(cmd, args, opts = {}) {
	const res = spawnSync(cmd, args, { encoding: 'utf8', ...opts });
	if (res.status !== 0) {
		const out = `${res.stdout ?? ''}${res.stderr ?? ''}`.trim();
		throw new Error(`${cmd} ${args.join(' ')} failed (${res.status ?? res.signal}): ${out}`);
	}
	return res.stdout ?? '';
}

/** Run a command with inherited stdio and resolve with its exit code. */
export function runInherit(cmd, args, opts = {}) {
	return new Promise((resolve) => {
		const child = spawn(cmd, args, { stdio: 'inherit', ...opts });
		child.on('exit', (code, signal) => resolve(code ?? (signal ? 1 : 0)));
	});
}

/**
 * Run a command with its output going to `logFile` only (for `npm start`, which stays quiet).
 * Resolves with the exit code; on failure the last lines of the log are printed, with its path.
 */
export function runLogged(cmd, args, { logFile, ...opts }) {
	mkdirSync(dirname(logFile), { recursive: true });
	const out = openSync(logFile, 'w');
	return new Promise((resolve) => {
		const child = spawn(cmd, args, { ...opts, stdio: ['ignore', out, out] });
		child.on('exit', (code, signal) => {
			closeSync(out);
			const status = code ?? (signal ? 1 : 0);
			if (status !== 0) printTail(logFile);
			resolve(status);
		});
	});
}

/** The log's last lines, stack frames left out: a failed build ends in rollup's frames, its reason comes before them. */
function printTail(logFile, lines = 30) {
	const tail = readFileSync(logFile, 'utf8')
		.trimEnd()
		.split('\n')
		.filter((line) => !/^\s+at /.test(line))
		.slice(-lines);
	console.error(`--- last ${tail.length} lines of ${logFile} ---\n${tail.join('\n')}\n---`);
}

export function commandExists(cmd) {
	return spawnSync('sh', ['-c', `command -v ${cmd}`], { encoding: 'utf8' }).status === 0;
}

/** Is something listening on 127.0.0.1:port? */
export function portInUse(port) {
	return new Promise((resolve) => {
		const socket = net.connect({ host: '127.0.0.1', port });
		socket.once('connect', () => (socket.destroy(), resolve(true)));
		socket.once('error', () => resolve(false));
	});
}

/** A port the OS says is free right now. */
export function freePort() {
	return new Promise((resolve, reject) => {
		const server = net.createServer();
		server.unref();
		server.on('error', reject);
		server.listen(0, '127.0.0.1', () => {
			const { port } = server.address();
			server.close(() => resolve(port));
		});
	});
}

/** The first port from `preferred` upwards that nobody listens on. */
export async function firstFreePort(preferred) {
	for (let port = preferred; port < preferred + 100; port++) {
		if (!(await portInUse(port))) return port;
	}
	return freePort();
}

export async function waitFor(check, { timeoutMs = 30_000, intervalMs = 200, what = 'condition' } = {}) {
	const deadline = Date.now() + timeoutMs;
	while (Date.now() < deadline) {
		if (await check()) return;
		await new Promise((r) => setTimeout(r, intervalMs));
	}
	throw new Error(`timed out waiting for ${what}`);
}

export async function waitForHttp(url, opts = {}) {
	await waitFor(
		async () => {
			try {
				const res = await fetch(url);
				return res.ok;
			} catch {
				return false;
			}
		},
		{ what: url, ...opts }
	);
}
