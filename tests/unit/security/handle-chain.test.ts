import type { Handle, RequestEvent, ResolveOptions } from '@sveltejs/kit';
import { describe, expect, it } from 'vitest';
import { chain } from '../../../src/lib/server/handle-chain';

// The ordering contract is SvelteKit's own for `sequence` (documented with its hooks): the first
// handle's code before `resolve` runs first, its code after `resolve` runs last.
const eventNamed = (name: string) => ({ url: new URL(`http://127.0.0.1/${name}`) }) as unknown as RequestEvent;

function recorder(log: string[], name: string): Handle {
	return async ({ event, resolve }) => {
		log.push(`${name} before`);
		const response = await resolve(event);
		log.push(`${name} after`);
		return response;
	};
}

describe('chain', () => {
	it('runs the before-parts in order and the after-parts in reverse, around resolve', async () => {
		const log: string[] = [];
		const handle = chain(recorder(log, 'a'), recorder(log, 'b'), recorder(log, 'c'));
		await handle({ event: eventNamed('x'), resolve: async () => (log.push('route'), new Response('ok')) });
		expect(log).toEqual(['a before', 'b before', 'c before', 'route', 'c after', 'b after', 'a after']);
	});

	it('hands each handle the event the one before it resolved with', async () => {
		const seen: string[] = [];
		const swap: Handle = ({ resolve }) => resolve(eventNamed('swapped'));
		const look: Handle = ({ event, resolve }) => (seen.push(event.url.pathname), resolve(event));
		await chain(look, swap, look)({ event: eventNamed('first'), resolve: (event) => (seen.push(`route ${event.url.pathname}`), new Response()) });
		expect(seen).toEqual(['/first', '/swapped', 'route /swapped']);
	});

	it('stops when a handle answers without resolving', async () => {
		const log: string[] = [];
		const refuse: Handle = () => new Response('no', { status: 403 });
		const response = await chain(recorder(log, 'a'), refuse, recorder(log, 'c'))({ event: eventNamed('x'), resolve: () => (log.push('route'), new Response()) });
		expect(response.status).toBe(403);
		expect(log).toEqual(['a before', 'a after']);
	});

	it('passes resolve options through to the route', async () => {
		const options: ResolveOptions = { preload: () => false };
		const withOptions: Handle = ({ event, resolve }) => resolve(event, options);
		let received: ResolveOptions | undefined;
		await chain(withOptions, recorder([], 'b'))({ event: eventNamed('x'), resolve: (_event, opts) => ((received = opts), new Response()) });
		expect(received).toBe(options);
	});

	it('with no handles, resolves', async () => {
		const response = await chain()({ event: eventNamed('x'), resolve: () => new Response('direct') });
		expect(await response.text()).toBe('direct');
	});
});
