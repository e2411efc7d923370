/**
 * Is this error PostgreSQL being unreachable (stopped, restarting, network) rather than a bug?
 * Such errors answer 503 `database_unavailable` (hooks' databaseUnavailable, http.ts' api()), and a
 * failed connect is retried once (db/index.ts).
 */
const UNAVAILABLE_CODES = new Set([
	'57P01', // admin_shutdown: the server is stopping and ended this session
	'57P02', // crash_shutdown
	'57P03', // cannot_connect_now: starting up or shutting down
	'08000', // connection_exception
	'08001', // sqlclient_unable_to_establish_sqlconnection
	'08003', // connection_does_not_exist
	'08006', // connection_failure
	'ECONNREFUSED',
	'ECONNRESET',
	'EPIPE',
	'ETIMEDOUT',
	'EHOSTUNREACH'
]);
const UNAVAILABLE_MESSAGE =
	/Connection terminated|terminating connection due to administrator command|Client has encountered a connection error|the database system is (starting up|shutting down)/;

export function isDatabaseUnavailable(error: unknown): boolean {
	// Drizzle wraps the driver's error as `cause`, Auth.js as `cause.err`; a refused connect to
	// several addresses is an AggregateError.
	for (let e: unknown = error, depth = 0; e && typeof e === 'object' && depth < 6; depth++) {
		const { code, message, errors, err, cause } = e as {
			code?: unknown;
			message?: unknown;
			errors?: unknown;
			err?: unknown;
			cause?: unknown;
		};
		if (typeof code === 'string' && UNAVAILABLE_CODES.has(code)) return true;
		if (typeof message === 'string' && UNAVAILABLE_MESSAGE.test(message)) return true;
		e = cause ?? err ?? (Array.isArray(errors) ? errors[0] : undefined);
	}
	return false;
}
