/**
 * Opening the inspection page computes at most one lot evaluation (issue 19): its load reads the
 * evaluation cached at the lot's revision (services/evaluation-cache.ts) and computes only when that
 * is stale; the evaluation the page then fetches after a save is the cached one. Counted from the
 * app's log line per computation (LOG_EVALUATIONS=on, services/evaluation.ts).
 */
import { afterAll, beforeAll, expect, it } from 'vitest';
import { startApp, type RunningApp } from '../helpers/app';
import { signInApi, tokenFor } from '../helpers/auth';
import { freshDatabase } from '../helpers/db';
import { PART } from './decisions-fixtures';
import { call, createLot, modelReadings, type Caller } from './readings-fixtures';

let app: RunningApp;
let db: Awaited<ReturnType<typeof freshDatabase>>;
let buyer: Caller, inspector: Caller;
let cookie: string;

beforeAll(async () => {
	db = await freshDatabase('inspect_page_evaluations', { demo: false });
	app = await startApp({ databaseUrl: db.url, env: { LOG_EVALUATIONS: 'on' } });
	buyer = { base: app.url, token: await tokenFor(db.url, 'buyer@kestrel-mobility.example') };
	inspector = { base: app.url, token: await tokenFor(db.url, 'inspector@kestrel-mobility.example') };
	cookie = await signInApi(app.url, 'inspector@kestrel-mobility.example');
});

afterAll(async () => {
	await app?.stop();
	await db?.drop();
});

const computed = (lotId: string) => app.output().split(`[evaluation] computed lot=${lotId}`).length - 1;
const page = async (path: string) => {
	const res = await fetch(`${app.url}${path}`, { headers: { cookie }, redirect: 'manual' });
	expect(res.status).toBe(200);
	return res.text();
};

it('computes one evaluation for a visit and none for a second visit or the fetch after it', async () => {
	const lot = await createLot(buyer, { partNumber: PART, quantity: 100, declaredSoc: 0.3, documents: ['coc'] });
	const readings = modelReadings('NMC', 3, 0.3, { prefix: 'EV' });
	expect((await call(inspector, `/api/v1/lots/${lot.id}/readings`, { body: { readings } })).status).toBe(201);
	const before = computed(lot.id);

	await page(`/lots/${lot.id}/inspect`); // the cache is stale after the readings: one computation
	await page(`/lots/${lot.id}/inspect`); // same revision: from the cache
	await page(`/api/v1/lots/${lot.id}/evaluation`); // what the page fetches after a save: cached too
	// A computation for another lot marks the end: once its log line is there, every earlier line is
	// too (one pipe, in order), so the count says what the visits computed.
	const marker = await createLot(buyer, { partNumber: PART, quantity: 100, declaredSoc: 0.3, documents: ['coc'] });
	await page(`/api/v1/lots/${marker.id}/evaluation`);
	await expect.poll(() => computed(marker.id)).toBe(1);
	expect(computed(lot.id) - before).toBe(1);
});
