/**
 * (3) Import a 10,000-row XLSX meter file into a lot through POST /api/v1/lots/{id}/imports
 * (upload, unzip/parse, map, validate, store in one transaction) vs. psql's \copy of the same rows
 * from CSV into the readings table. Both measured as rows per second; each run gets a fresh lot.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import XlsxPopulate from 'xlsx-populate';
import { createBenchLot, syntheticReadings, withClient, type SyntheticReading } from '../lib/data';
import type { BenchContext } from '../lib/context';
import { interleaved, timeMs, type BenchLine } from '../lib/measure';

const ROWS = 10_000;

async function meterWorkbook(readings: SyntheticReading[], times: string[]): Promise<Buffer> {
	const workbook = await XlsxPopulate.fromBlankAsync();
	const rows = [
		['Serial', 'OCV (V)', 'Temperature (°C)', 'Measured at'],
		...readings.map((r, i) => [r.serial, r.ocv_v, r.temperature_c, times[i]])
	];
	workbook.sheet(0)!.range(1, 1, rows.length, 4).value(rows);
	return (await workbook.outputAsync()) as Buffer;
}

export function psqlPath(pgBin: string): string {
	const own = join(pgBin, 'psql');
	return existsSync(own) ? own : '/usr/bin/psql';
}

export async function benchImportXlsx(ctx: BenchContext): Promise<BenchLine> {
	const readings = syntheticReadings(ROWS, 3);
	const start = Date.parse('2026-03-02T08:00:00Z');
	const times = readings.map((_, i) => new Date(start + i * 3000).toISOString());
	const xlsx = await meterWorkbook(readings, times);
	const mapping = JSON.stringify({ serial: 0, ocv: 1, ocv_unit: 'V', temperature: 2, time: 3, first_row: 1 });
	const csvFile = join(ctx.scratch, 'bench-copy.csv');
	const psql = psqlPath(ctx.pgBin);

	const importOnce = async () => {
		const lotId = await withClient(ctx.databaseUrl, (c) => createBenchLot(c, ctx.part, 100_000, 'IMP'));
		const form = new FormData();
		form.set(
			'file',
			new Blob([new Uint8Array(xlsx)], { type: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet' }),
			'meter.xlsx'
		);
		form.set('mapping', mapping);
		const ms = await timeMs(async () => {
			const response = await fetch(`${ctx.app.url}/api/v1/lots/${lotId}/imports`, {
				method: 'POST',
				body: form,
				// SvelteKit refuses multipart POSTs without a same-site Origin (its CSRF check), even with a
				// bearer token; a browser sends this header, so the bench does too.
				headers: { authorization: `Bearer ${ctx.token}`, origin: ctx.app.url }
			});
			const text = await response.text();
			if (response.status !== 201) throw new Error(`import answered ${response.status}: ${text.slice(0, 300)}`);
			const inserted = (JSON.parse(text) as { inserted?: number }).inserted;
			if (inserted !== ROWS) throw new Error(`import stored ${inserted} of ${ROWS} rows`);
		});
		return ROWS / (ms / 1000);
	};

	const copyOnce = async () => {
		const lotId = await withClient(ctx.databaseUrl, (c) => createBenchLot(c, ctx.part, 100_000, 'CPY'));
		const lines = readings.map((r, i) => `${lotId},${r.serial},${r.ocv_v},${r.temperature_c},${times[i]},import`);
		writeFileSync(csvFile, lines.join('\n') + '\n');
		const command = `\\copy readings(lot_id, serial, ocv_v, temperature_c, measured_at, source) from '${csvFile}' with (format csv)`;
		const ms = await timeMs(() => {
			const res = spawnSync(psql, ['-X', '-q', '-v', 'ON_ERROR_STOP=1', '-d', ctx.databaseUrl, '-c', command], { encoding: 'utf8' });
			if (res.status !== 0) throw new Error(`psql \\copy failed: ${res.stderr}`);
		});
		return ROWS / (ms / 1000);
	};

	const result = await interleaved(importOnce, copyOnce, { warmup: 1, rounds: 5 });
	return { name: 'import-xlsx-10000', value: result.op, floor: result.floor, unit: 'rows/s', target: { op: '>=', value: 0.25 } };
}
