/**
 * The app's public origin, from the configured ORIGIN only. Every link that leaves the app (e-mails,
 * PDFs, QR codes) is built from it and never from the request's Host or X-Forwarded-Host headers:
 * a forged header must not be able to point a sign-in link at someone else's server.
 */
export function appOrigin(): string {
	const origin = process.env.ORIGIN;
	if (origin) return new URL(origin).origin;
	if (process.env.NODE_ENV === 'production') throw new Error('ORIGIN is not set: links in e-mails cannot be built');
	return 'http://localhost:5173'; // vite dev's default address
}

/** The same path and query on the app's own origin (for URLs a library built from request headers). */
export function onAppOrigin(url: string): string {
	const parsed = new URL(url);
	return new URL(parsed.pathname + parsed.search, appOrigin()).toString();
}
