import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	server: { host: '127.0.0.1' },
	test: {
		expect: { requireAssertions: true },
		projects: [
			{
				extends: true,
				test: {
					name: 'unit',
					environment: 'node',
					include: ['tests/unit/**/*.test.ts', 'src/lib/**/*.test.ts']
				}
			},
			{
				// Service functions against a real PostgreSQL, without a build or HTTP (tests/helpers/service-db.ts).
				extends: true,
				test: {
					name: 'services',
					environment: 'node',
					include: ['tests/services/**/*.test.ts'],
					testTimeout: 60_000,
					hookTimeout: 120_000,
					pool: 'forks'
				}
			},
			{
				extends: true,
				test: {
					name: 'integration',
					environment: 'node',
					include: ['tests/integration/**/*.test.ts'],
					testTimeout: 60_000,
					hookTimeout: 120_000,
					pool: 'forks',
					poolOptions: { forks: { singleFork: true } }
				}
			}
		]
	}
});
