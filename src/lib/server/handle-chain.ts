/**
 * `chain(a, b, c)` runs hooks the way kit's `sequence` does (a's code before resolve runs first,
 * its code after resolve runs last), without the tracing span and request-store context that
 * `sequence` opens around each handle: per request, those cost more than the guards themselves
 * (measured by tests/bench, evaluation-api-load). getRequestEvent() still works: kit opens the
 * request store once around the whole `handle`.
 *
 * Resolve options pass through unchanged; a handle that sets them (transformPageChunk, preload,
 * filterSerializedResponseHeaders) must be the last one, as no two sets are merged here.
 */
import type { Handle, RequestEvent, ResolveOptions } from '@sveltejs/kit';

export function chain(...handles: Handle[]): Handle {
	return ({ event, resolve }) => {
		const step = (i: number, current: RequestEvent, options?: ResolveOptions): ReturnType<Handle> =>
			i === handles.length ? resolve(current, options) : handles[i]({ event: current, resolve: (next, nextOptions) => step(i + 1, next, nextOptions ?? options) });
		return step(0, event);
	};
}
