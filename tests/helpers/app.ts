/**
 * Starts the built app (`node build`, the same artefact `npm start` serves) against a given
 * database and SMTP port, on a free port, and waits for its health endpoint. The app connects as
 * the least-privileged app role (scripts/lib/roles.mjs), as `npm start` runs it, whatever role the
 * given URL names.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { resolve } from 'node:path';
import { freePort, waitForHttp } from '../../scripts/lib/proc.mjs';
import { APP_ROLE, urlAs } from '../../scripts/lib/roles.mjs';
import { testEnv } from './env';

export interface RunningApp {
	url: string;
	port: number;
	process: ChildProcess;
	output: () => string;
	stop: () => Promise<void>;
	kill: () => Promise<void>;
}

export const TEST_AUTH_SECRET = 'test-secret-for-restvolt-tests-only-0123456789';

export async function startApp(opts: { databaseUrl: string; smtpPort?: number; env?: Record<string, string> }): Promise<RunningApp> {
	const port: number = await freePort();
	const root = resolve(import.meta.dirname, '../..');
	let output = '';
	const child = spawn(process.execPath, [process.env.RESTVOLT_BUILD_DIR ?? 'build'], {
		cwd: root,
		env: {
			...process.env,
			NODE_ENV: 'production',
			HOST: '127.0.0.1',
			PORT: String(port),
			ORIGIN: `http://127.0.0.1:${port}`,
			DATABASE_URL: urlAs(opts.databaseUrl, APP_ROLE),
			SMTP_URL: `smtp://127.0.0.1:${opts.smtpPort ?? testEnv().smtpPort}`,
			MAIL_FROM: 'Restvolt <no-reply@restvolt.test>',
			AUTH_SECRET: TEST_AUTH_SECRET,
			AUTH_TRUST_HOST: 'true',
			BODY_SIZE_LIMIT: String(40 * 1024 * 1024),
			OUTBOX_POLL_MS: '200',
			...opts.env
		},
		stdio: ['ignore', 'pipe', 'pipe']
	});
	child.stdout!.on('data', (d) => (output += d));
	child.stderr!.on('data', (d) => (output += d));
	const url = `http://127.0.0.1:${port}`;
	try {
		await waitForHttp(`${url}/api/v1/health`, { timeoutMs: 30_000 });
	} catch (error) {
		child.kill('SIGKILL');
		throw new Error(`app did not start: ${String(error)}\n${output}`);
	}
	const ended = new Promise<void>((r) => child.once('exit', () => r()));
	const end = async (signal: NodeJS.Signals) => {
		if (child.exitCode === null && child.signalCode === null) child.kill(signal);
		await ended;
	};
	return { url, port, process: child, output: () => output, stop: () => end('SIGTERM'), kill: () => end('SIGKILL') };
}
