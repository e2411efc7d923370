/**
 * Evaluations computed per bench save: what the inspection page makes the server do when an
 * inspector saves a reading. Per save, as the page does it (routes/(app)/lots/[id]/inspect): POST
 * the row to /api/v1/lots/{id}/readings; when the lot was still awaiting arrival, reload the page
 * data (invalidate); then GET the evaluation (in full: the grid shows each unit's flags from it). The
 * page's load reads the cached evaluation, so opening it computes at most one. The app logs one line per evaluation it
 * computes (LOG_EVALUATIONS=on, services/evaluation.ts); the lines naming the lot are counted.
 * Each round is a fresh lot awaiting arrival, opened once (not counted), then SAVES saves; the value
 * is the median over rounds of computations ÷ saves. Floor: the one computation a save needs.
 */
import { randomUUID } from 'node:crypto';
import { setTimeout as sleep } from 'node:timers/promises';
import { signInCookie } from '../lib/auth';
import type { BenchContext } from '../lib/context';
import { createBenchLot, syntheticReadings, withClient } from '../lib/data';
import { median, type BenchLine } from '../lib/measure';

const ROUNDS = 5;
const SAVES = 5;

/** The page's own requests, with its session cookie (and Origin on writes, as a browser sends it). */
function pageClient(baseUrl: string, cookie: string) {
	const request = async (path: string, init: RequestInit = {}) => {
		const response = await fetch(`${baseUrl}${path}`, {
			...init,
			redirect: 'manual',
			headers: { cookie, origin: baseUrl, ...init.headers }
		});
		const text = await response.text();
		if (!response.ok) throw new Error(`${init.method ?? 'GET'} ${path} answered ${response.status}: ${text.slice(0, 200)}`);
		return text;
	};
	return {
		openPage: (lotId: string) => request(`/lots/${lotId}/inspect`),
		reloadPageData: (lotId: string) => request(`/lots/${lotId}/inspect/__data.json`),
		evaluation: (lotId: string) => request(`/api/v1/lots/${lotId}/evaluation`),
		saveReading: (lotId: string, reading: { serial: string; ocv_v: number; temperature_c: number }) =>
			request(`/api/v1/lots/${lotId}/readings`, {
				method: 'POST',
				headers: { 'content-type': 'application/json' },
				body: JSON.stringify({ readings: [{ ...reading, measured_at: new Date().toISOString(), client_key: randomUUID() }] })
			})
	};
}

export async function benchEvaluationsPerSave(ctx: BenchContext): Promise<BenchLine> {
	const page = pageClient(ctx.app.url, await signInCookie(ctx.app.url));
	const computations = async (lotId: string) => {
		await sleep(100); // the app's log lines reach this process through a pipe
		return ctx.app.output().split(`[evaluation] computed lot=${lotId}`).length - 1;
	};
	const perSave: number[] = [];
	for (let round = 0; round < ROUNDS; round++) {
		const lotId = await withClient(ctx.databaseUrl, (c) => createBenchLot(c, ctx.part, 5000, 'SAVE', 'awaiting_arrival'));
		await page.openPage(lotId);
		const before = await computations(lotId);
		let status = 'awaiting_arrival';
		for (const reading of syntheticReadings(SAVES, 10 + round)) {
			await page.saveReading(lotId, reading);
			if (status === 'awaiting_arrival') await page.reloadPageData(lotId);
			await page.evaluation(lotId);
			status = 'in_inspection';
		}
		perSave.push(((await computations(lotId)) - before) / SAVES);
	}
	return { name: 'evaluations-per-save', value: median(perSave), floor: 1, unit: '', target: { on: 'value', op: '<=', value: 1 } };
}
