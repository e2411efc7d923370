/**
 * The benchmark proper (started by scripts/bench.mjs, which owns PostgreSQL and the build): prints
 * the machine, loads the synthetic data set, starts the app and prints one line per operation.
 * An operation whose endpoint or service is missing prints an honest "missed (not available: …)".
 */
import { cpus, totalmem } from 'node:os';
import { closeDb } from '$lib/server/db';
import { startBenchApp, type BenchApp } from './lib/app';
import { bearerFor } from './lib/auth';
import type { BenchContext } from './lib/context';
import { benchPart, createBenchLot, insertReadings, loadScaleData, settleDatabase, syntheticReadings, withClient } from './lib/data';
import { formatLine, formatUnavailable, isMet, type BenchLine } from './lib/measure';
import { benchEvaluateLot } from './ops/evaluate-lot';
import { benchOcvEvaluate } from './ops/ocv-evaluate';
import { benchImportXlsx } from './ops/import-xlsx';
import { benchEvaluationLoad } from './ops/evaluation-load';
import { benchLotList, type ListResult } from './ops/lot-list';
import { benchSerialTrace } from './ops/serial-trace';
import { benchScorecard } from './ops/scorecard';
import { benchEvaluationsPerSave } from './ops/evaluations-per-save';
import { benchClientWeight } from './ops/client-weight';
import { placement, placeSelf } from './lib/cpus';

const need = (name: string) => {
	const value = process.env[name];
	if (!value) throw new Error(`${name} is not set: run the benchmark with \`npm run bench\``);
	return value;
};

const log = (text: string) => console.log(`[bench] ${text}`);
const seconds = (since: number) => `${((performance.now() - since) / 1000).toFixed(1)} s`;

async function printMachine(databaseUrl: string) {
	const pgVersion = await withClient(databaseUrl, async (c) => (await c.query('show server_version')).rows[0].server_version as string);
	const cpu = cpus();
	console.log(
		`machine cores=${cpu.length} cpu="${cpu[0]?.model.trim() ?? 'unknown'}" memory=${(totalmem() / 1024 ** 3).toFixed(1)}GB node=${process.version} postgres=${pgVersion} platform=${process.platform}-${process.arch} cpus=${placement()}`
	);
}

/** Lines that were measured; `false` entries mark operations that could not run. */
const outcomes: boolean[] = [];

function report(line: BenchLine) {
	console.log(formatLine(line));
	outcomes.push(isMet(line));
}

/** BENCH_ONLY=import,lot-list runs only the operations whose names start with one of these. */
const only = (process.env.BENCH_ONLY ?? '').split(',').filter(Boolean);

/**
 * Run one operation on a settled database (the one before may have left rows for autovacuum and
 * dirty pages for the checkpointer), with this process on the app's core for in-process operations
 * ('app') or beside the load generator when it is an HTTP client ('load'). A missing
 * endpoint/service or a failure becomes an honest missed line.
 */
async function attempt(names: string[], role: 'app' | 'load', fn: () => Promise<void>) {
	if (only.length > 0 && !names.some((n) => only.some((o) => n.startsWith(o)))) return;
	await settleDatabase(need('BENCH_SUPER_DATABASE_URL'));
	placeSelf(role);
	const started = performance.now();
	try {
		await fn();
	} catch (error) {
		const reason = (error instanceof Error ? error.message : String(error)).split('\n')[0].slice(0, 200);
		for (const name of names) {
			console.log(formatUnavailable(name, reason));
			outcomes.push(false);
		}
	}
	log(`${names[0]} took ${seconds(started)}`);
}

async function prepare(databaseUrl: string) {
	const prepared = await withClient(databaseUrl, async (client) => {
		const part = await benchPart(client);
		let t = performance.now();
		const scale = await loadScaleData(client, (text) => log(`data set: ${text} (${seconds(t)})`));
		log(
			`data set: ${scale.lots.toLocaleString('en')} lots, ${scale.readings.toLocaleString('en')} readings (${seconds(t)}${scale.reused ? ', already loaded' : ''})`
		);
		t = performance.now();
		const bigLotId = await createBenchLot(client, part, 1_000_000, 'EVAL2000');
		await insertReadings(client, bigLotId, syntheticReadings(2000, 1));
		const sampleLotId = await createBenchLot(client, part, 5000, 'SAMPLE200');
		await insertReadings(client, sampleLotId, syntheticReadings(200, 4));
		log(`bench lots ready (${seconds(t)})`);
		return { part, bigLotId, sampleLotId };
	});
	const t = performance.now();
	await settleDatabase(need('BENCH_SUPER_DATABASE_URL'));
	log(`database settled: VACUUM (ANALYZE), CHECKPOINT (${seconds(t)})`);
	return prepared;
}

async function main() {
	const started = performance.now();
	const databaseUrl = need('DATABASE_URL');
	await printMachine(databaseUrl);
	const { part, bigLotId, sampleLotId } = await prepare(databaseUrl);
	const token = await bearerFor();
	const buildDir = need('BENCH_BUILD_DIR');
	let app: BenchApp | undefined;
	try {
		app = await startBenchApp(databaseUrl, buildDir);
		const ctx: BenchContext = {
			app,
			databaseUrl,
			pgBin: need('BENCH_PG_BIN'),
			scratch: need('BENCH_SCRATCH'),
			part,
			token,
			bigLotId,
			sampleLotId
		};

		await attempt(['evaluate-lot-2000'], 'app', async () => report(await benchEvaluateLot(ctx)));
		await attempt(['ocv-evaluate-10000'], 'load', async () => report(await benchOcvEvaluate(ctx)));
		await attempt(['import-xlsx-10000'], 'load', async () => report(await benchImportXlsx(ctx)));
		await attempt(['evaluation-api-load', 'evaluation-api-p99'], 'load', async () => {
			const result = await benchEvaluationLoad(ctx);
			result.lines.forEach(report);
			result.notes.forEach((note) => console.log(note));
		});
		await attempt(['evaluations-per-save'], 'load', async () => report(await benchEvaluationsPerSave(ctx)));
		const withPlan = async (run: () => Promise<ListResult>) => {
			const result = await run();
			report(result.line);
			console.log(`explain ${result.line.name} (index used: ${result.usesIndex ? 'yes' : 'NO'}):\n${result.explain.replace(/^/gm, '  ')}`);
		};
		await attempt(['lot-list'], 'app', () => withPlan(benchLotList));
		await attempt(['serial-trace'], 'app', () => withPlan(benchSerialTrace));
		await attempt(['scorecard'], 'app', async () => report(await benchScorecard(ctx)));
		await attempt(['inspect-page-js'], 'load', async () => {
			const result = await benchClientWeight(ctx);
			report(result.line);
			const top = result.files.slice(0, 6).map((f) => `${f.path.split('/').pop()}=${(f.gzipBytes / 1024).toFixed(1)}KB`);
			console.log(`files inspect-page-js: ${result.files.length} modules, largest ${top.join(' ')}`);
		});
	} finally {
		await app?.stop();
		await closeDb();
	}
	const met = outcomes.filter(Boolean).length;
	console.log(`summary met=${met} missed=${outcomes.length - met} total=${seconds(started)}`);
}

await main();
