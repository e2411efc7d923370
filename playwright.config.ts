import { defineConfig } from '@playwright/test';

// Debian's Chromium, never a downloaded browser. Each spec file starts its own app and database
// (tests/helpers/app.ts, db.ts), so specs stay independent.
export default defineConfig({
	testDir: 'tests/e2e',
	testMatch: '**/*.e2e.ts',
	outputDir: 'tests/artifacts/playwright',
	timeout: 120_000,
	// A password check (argon2) on a busy 2-core machine can take several seconds; assertions wait on
	// what the page shows, up to this long, rather than on any fixed sleep.
	expect: { timeout: 10_000 },
	workers: 1,
	reporter: [['list']],
	use: {
		browserName: 'chromium',
		screenshot: 'only-on-failure',
		trace: 'off',
		launchOptions: {
			executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
			headless: true,
			args: [
				'--no-sandbox',
				'--disable-gpu',
				'--disable-dev-shm-usage',
				'--disable-quic',
				'--no-first-run',
				'--disable-background-networking',
				'--disable-component-update',
				'--disable-sync'
			]
		}
	}
});
