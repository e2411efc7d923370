import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		// Separate output folders let several builds run side by side (e.g. parallel developer sessions).
		adapter: adapter({ out: process.env.RESTVOLT_BUILD_DIR || 'build' }),
		outDir: process.env.RESTVOLT_KIT_DIR || '.svelte-kit',
		// The origin check runs in src/lib/server/csrf.ts (hooks) instead, so that bearer-token API
		// uploads are not refused; it is otherwise the same check.
		csrf: { trustedOrigins: ['*'] },
		csp: {
			mode: 'hash',
			directives: {
				'default-src': ['self'],
				'script-src': ['self'],
				'style-src': ['self', 'unsafe-inline'],
				'img-src': ['self', 'data:', 'blob:'],
				'font-src': ['self'],
				'connect-src': ['self'],
				'frame-ancestors': ['none'],
				'form-action': ['self'],
				'base-uri': ['self'],
				'object-src': ['none']
			}
		}
	}
};

export default config;
