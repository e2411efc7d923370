/** Screenshots saved as test artefacts (tests/artifacts/screens/<spec>/<step>.png). */
import type { Page } from '@playwright/test';
import { mkdirSync } from 'node:fs';
import { join, resolve } from 'node:path';

export function screens(spec: string) {
	const dir = resolve(import.meta.dirname, '../artifacts/screens', spec);
	mkdirSync(dir, { recursive: true });
	let step = 0;
	return async (page: Page, name: string) => {
		step += 1;
		await page.screenshot({ path: join(dir, `${String(step).padStart(2, '0')}-${name}.png`), fullPage: true });
	};
}
