// Persistent per-checkout settings for `npm start` (kept in the git-ignored .data folder).
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import { join } from 'node:path';

/** AUTH_SECRET from the environment, else one generated once for this checkout. */
export function authSecret(dataRoot) {
	if (process.env.AUTH_SECRET) return process.env.AUTH_SECRET;
	const file = join(dataRoot, 'auth-secret');
	if (!existsSync(file)) {
		mkdirSync(dataRoot, { recursive: true });
		writeFileSync(file, randomBytes(32).toString('base64url'), { mode: 0o600 });
	}
	return readFileSync(file, 'utf8').trim();
}

/** The environment the built app runs with. */
export function appEnv({ port, databaseUrl, smtpPort, mailHttpPort, secret, extra = {} }) {
	return {
		...process.env,
		NODE_ENV: process.env.NODE_ENV ?? 'production',
		HOST: '127.0.0.1',
		PORT: String(port),
		ORIGIN: process.env.ORIGIN ?? `http://127.0.0.1:${port}`,
		DATABASE_URL: databaseUrl,
		SMTP_URL: process.env.SMTP_URL ?? `smtp://127.0.0.1:${smtpPort}`,
		MAIL_FROM: process.env.MAIL_FROM ?? 'Restvolt <no-reply@restvolt.local>',
		MAIL_READER_URL: mailHttpPort ? `http://127.0.0.1:${mailHttpPort}/` : (process.env.MAIL_READER_URL ?? ''),
		AUTH_SECRET: secret,
		AUTH_TRUST_HOST: 'true',
		BODY_SIZE_LIMIT: process.env.BODY_SIZE_LIMIT ?? String(40 * 1024 * 1024),
		...extra
	};
}
