/**
 * Lots brought to a chosen disposition through the real API: registered by the buyer, measured
 * with readings generated from the library OCV model, then submitted by the inspector.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { simpleParser, type ParsedMail } from 'mailparser';
import { rawMail, readMail, type ReceivedMail } from '../helpers/mail';
import { call, createLot, modelReadings, VC21_MODEL, type Caller } from './readings-fixtures';

export type Scenario = 'accept' | 'hold' | 'safety';
export const PART = 'VC-21700-50G'; // Voltaria NMC 21700 cell (seed/scenario.ts)
export const VOLTARIA_CONTACTS = ['supplier@voltaria-cells.example', 'quality-desk@voltaria-cells.example'];

/**
 * accept: the full sample at the declared 30 % SOC, both lithium documents present.
 * hold:   the same readings, but the UN 38.3 summary is missing (a documents hold).
 * safety: one unit at 2.00 V, well below the NMC minimum (deep discharge → safety reject).
 */
export async function measuredLot(buyer: Caller, inspector: Caller, scenario: Scenario) {
	// The hold scenario lacks only the UN 38.3 summary, so attaching it later can release the lot.
	const documents = scenario === 'hold' ? (['coc', 'sds'] as const) : (['coc', 'un38_3_summary', 'sds'] as const);
	const lot = await createLot(buyer, { partNumber: PART, quantity: 100, declaredSoc: 0.3, documents: [...documents] });
	const readings = modelReadings(VC21_MODEL, 1, 0.3, { prefix: 'P' });
	const first = await call(inspector, `/api/v1/lots/${lot.id}/readings`, { body: { readings } });
	if (first.status !== 201) throw new Error(`readings refused: ${first.status} ${JSON.stringify(first.json)}`);
	const summary = await call(inspector, `/api/v1/lots/${lot.id}/evaluation?detail=summary`);
	const n: number = summary.json.plan.sample_size;
	const rest = modelReadings(VC21_MODEL, n - 1, 0.3, { prefix: 'SN', halfWidth: 0.005 });
	if (scenario === 'safety') rest[0] = { ...rest[0], ocv_v: 2.0 };
	const second = await call(inspector, `/api/v1/lots/${lot.id}/readings`, { body: { readings: rest } });
	if (second.status !== 201) throw new Error(`readings refused: ${second.status} ${JSON.stringify(second.json)}`);
	return { ...lot, sampleSize: n };
}

/** The stored .eml of a received message, parsed with mailparser (attachments with content). */
export async function parsedMail(m: ReceivedMail, baseUrl?: string): Promise<ParsedMail> {
	return simpleParser(await rawMail(m.id, baseUrl));
}

/** Text of a PDF through poppler's pdftotext (Debian poppler-utils). */
export function pdfText(pdf: Buffer): string {
	const dir = mkdtempSync(join(tmpdir(), 'rv-pdf-'));
	const file = join(dir, 'doc.pdf');
	writeFileSync(file, pdf);
	execFileSync('pdfinfo', [file]); // throws when poppler cannot read the file
	return execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
}

/** Messages carrying one notice's deterministic Message-ID. */
export async function mailsForNotice(noticeId: string, baseUrl?: string): Promise<ReceivedMail[]> {
	return (await readMail(baseUrl)).filter((m) => m.messageId === `<notice-${noticeId}@restvolt.local>`);
}

export async function waitUntil<T>(probe: () => Promise<T | null | undefined | false>, timeoutMs = 20_000, what = 'condition'): Promise<T> {
	const deadline = Date.now() + timeoutMs;
	while (Date.now() < deadline) {
		const value = await probe();
		if (value) return value;
		await new Promise((r) => setTimeout(r, 150));
	}
	throw new Error(`timed out waiting for ${what}`);
}
