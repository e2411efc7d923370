import { describe, expect, it } from 'vitest';
import { renderInspectionReport } from '../../../src/lib/server/reports/pdf';
import { formatSocInterval } from '../../../src/lib/format';
import { makeReport } from './fixtures';
import { pdfFonts, pdfInfo, pdfText, writeTemp } from './poppler';

// Fixture data is invented (see fixtures.ts); the checks read the PDF back with poppler-utils.
describe('renderInspectionReport', () => {
	it('writes a multi-page A4 report with Restvolt metadata', async () => {
		const data = makeReport();
		const file = writeTemp('report.pdf', await renderInspectionReport(data));
		const info = pdfInfo(file);
		expect(Number(info.Pages)).toBeGreaterThanOrEqual(2);
		// ISO 216: A4 is 210 × 297 mm = 595.28 × 841.89 pt at 72 pt per inch (25.4 mm).
		expect(info['Page size']).toMatch(/^595\.28 x 841\.89 pts/);
		expect(info.Author).toBe('Restvolt');
		expect(info.Title).toContain(data.lot.lot_code);
		expect(info.Subject).toContain(data.supplier.name);
	});

	it('keeps all text extractable, with the lot code and the disposition word', async () => {
		const data = makeReport();
		const file = writeTemp('report.pdf', await renderInspectionReport(data));
		const text = pdfText(file);
		expect(text).toContain(data.lot.lot_code);
		expect(text).toContain('REJECT');
		expect(text).toContain('SAFETY');
		expect(text).toContain('SOC (95 % interval)');
		// each reading's SOC is its interval, e.g. "38 % (31–45 %)", never "x ± σ"
		const spaced = (t: string) => t.replaceAll('\u00a0', ' ').replace(/\s+/g, ' ');
		for (const unit of data.units.slice(0, 5)) expect(spaced(text)).toContain(spaced(formatSocInterval(unit)));
		expect(text).toMatch(/no more than 30 % SOC/);
		expect(text).toContain('Sampling plan (ISO 2859-1:1999)');
	});

	it('lists every unit exactly once across the pages, the last one on the last page', async () => {
		const data = makeReport();
		const file = writeTemp('report.pdf', await renderInspectionReport(data));
		const pages = Number(pdfInfo(file).Pages);
		const text = pdfText(file);
		const named = new Set(data.disposition.reasons.flatMap((r) => r.units ?? []));
		for (const unit of data.units) {
			// once in the table, plus once where a reason names the unit
			expect(text.split(unit.serial).length - 1, unit.serial).toBe(named.has(unit.serial) ? 2 : 1);
		}
		const lastSerial = data.units.at(-1)!.serial;
		expect(pdfText(file, pages)).toContain(lastSerial);
	});

	it('names the model error in SOC for a chemistry calibrated against published cells, in mV otherwise', async () => {
		const base = makeReport({}, 10);
		const calibrated = { ...base, model: { ...base.model, sigma_model_v: null, sigma_model_soc_max: 0.109 } };
		const soc = pdfText(writeTemp('report-soc.pdf', await renderInspectionReport(calibrated))).replaceAll('\u00a0', ' ');
		expect(soc).toContain('up to 11 % SOC (published cells)');
		const fitted = { ...base, model: { ...base.model, sigma_model_v: 0.0021 } };
		expect(pdfText(writeTemp('report-mv.pdf', await renderInspectionReport(fitted))).replaceAll('\u00a0', ' ')).toContain('2.1 mV');
	}, 20_000);

	it('numbers every page as "page x of y"', async () => {
		const file = writeTemp('report.pdf', await renderInspectionReport(makeReport()));
		const pages = Number(pdfInfo(file).Pages);
		for (let page = 1; page <= pages; page++) expect(pdfText(file, page)).toContain(`page ${page} of ${pages}`);
	});

	it('embeds only the shipped Roboto Flex faces', async () => {
		const file = writeTemp('report.pdf', await renderInspectionReport(makeReport()));
		const rows = pdfFonts(file).split('\n').slice(2).filter(Boolean);
		expect(rows.length).toBeGreaterThan(0);
		for (const row of rows) {
			expect(row).toMatch(/^RobotoFlex/);
			expect(row).toMatch(/\byes\b/); // the "emb" column
		}
	});

	it('shows HOLD for a held lot and formats readings to the instrument precision', async () => {
		const data = makeReport(
			{
				disposition: {
					status: 'hold',
					safety: false,
					nonconforming: 0,
					reasons: [{ code: 'SOC_HIGH', severity: 'hold', message: 'Estimated SOC is above the declared value.' }]
				},
				decision: null
			},
			12
		);
		const file = writeTemp('hold.pdf', await renderInspectionReport(data));
		const text = pdfText(file);
		expect(text).toContain('HOLD');
		expect(text).not.toContain('REJECT');
		expect(text).toContain('no decision recorded yet');
		expect(text).toContain(data.units[0].ocv_v.toFixed(3)); // OCV to 1 mV
		expect(Number(pdfInfo(file).Pages)).toBeGreaterThanOrEqual(1);
	});

	it('renders a lot without readings, plan or statistics', async () => {
		const data = makeReport(
			{ plan: null, stats: null, variables: null, disposition: { status: 'pending', safety: false, nonconforming: 0, reasons: [] } },
			0
		);
		const file = writeTemp('empty.pdf', await renderInspectionReport(data));
		const text = pdfText(file);
		expect(text).toContain('SAMPLE INCOMPLETE'); // src/lib/status.ts: the verdict word for an incomplete sample
		expect(text).toContain('No readings recorded yet');
		expect(text).toContain('No sampling plan recorded');
	});

	it('writes states, transport, severity and decision kind as words, not as the API codes', async () => {
		const data = makeReport({ lot: { ...makeReport().lot, status: 'pending_decision', transport: 'sea' }, severity: 'tightened' }, 8);
		const text = pdfText(writeTemp('words.pdf', await renderInspectionReport(data)));
		expect(text).toContain('Awaiting decision'); // src/lib/status.ts
		expect(text).toContain('Sea');
		expect(text).toContain('Tightened');
		expect(text).toContain('By the rules');
		expect(text).not.toMatch(/pending_decision|\bsea\b|\btightened\b|\bautomatic\b/);
	});
	it('prints the e-signature manifest of a quality override, and none for the engine’s own decision', async () => {
		const hash = 'a3f1c09e5b7d2468' + '0'.repeat(48);
		const signature = {
			signer: 'Ines Varga <quality@kestrel-mobility.example>',
			meaning: 'release of a held lot',
			signed_at: '2031-05-15T10:05:00.000Z',
			revision: 9,
			content_sha256: hash,
			challenge_id: '5e0c2b7a-1f4d-4c3e-9b8a-7d6e5f4c3b2a'
		};
		const data = makeReport({
			decision: { by: 'Ines Varga', at: signature.signed_at, kind: 'override', reason: 'Summary received and checked', signature }
		});
		const text = pdfText(writeTemp('signed.pdf', await renderInspectionReport(data)));
		expect(text).toContain('Electronic signature of the quality decision');
		expect(text).toContain('Ines Varga');
		expect(text).toContain('<quality@kestrel-mobility.example>'); // the value column wraps after the name
		expect(text).toContain('release of a held lot');
		expect(text).toContain('2031-05-15 10:05 UTC');
		expect(text).toContain('a3f1c09e5b7d2468…');
		expect(text).not.toContain(hash); // a prefix, not the whole hash
		expect(text).toContain('5e0c2b7a…');
		const automatic = pdfText(writeTemp('automatic.pdf', await renderInspectionReport(makeReport())));
		expect(automatic).not.toContain('Electronic signature');
	});
});
