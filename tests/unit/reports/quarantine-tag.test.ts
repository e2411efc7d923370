import QRCode from 'qrcode';
import { describe, expect, it } from 'vitest';
import { QUIET_MODULES, qrRuns } from '../../../src/lib/server/reports/qr';
import { A6_LANDSCAPE, renderQuarantineTag } from '../../../src/lib/server/reports/quarantine-tag';
import { makeTag } from './fixtures';
import { pdfInfo, pdfText, rasterGrey, writeTemp } from './poppler';

// Tag fixtures are invented; poppler-utils reads the PDF back independently.
describe('renderQuarantineTag', () => {
	it('prints the status, lot, PO and reason as extractable text on an A6 landscape page', async () => {
		const tag = makeTag();
		const file = writeTemp('tag.pdf', await renderQuarantineTag(tag));
		const info = pdfInfo(file);
		// ISO 216: A6 is 105 × 148 mm = 297.64 × 419.53 pt; landscape puts the long side across.
		expect(info['Page size']).toMatch(/^419\.53 x 297\.64 pts/);
		expect(info.Pages).toBe('1');
		const text = pdfText(file);
		expect(text).toContain('QUARANTINE — REJECTED');
		expect(text).toContain(tag.lot_code);
		expect(text).toContain(tag.po_number);
		expect(text).toContain('do not charge');
	});

	it('says ON HOLD and gives the general caution when no safety issue is recorded', async () => {
		const file = writeTemp('tag.pdf', await renderQuarantineTag(makeTag({ status: 'on_hold', safety: false })));
		const text = pdfText(file);
		expect(text).toContain('QUARANTINE — ON HOLD');
		expect(text).not.toContain('do not charge');
		expect(text).toContain('site procedure');
		expect(text.replace(/\s+/g, ' ')).toContain('until quality releases it');
	});

	it('never promises a release for a rejected lot', async () => {
		const file = writeTemp('tag.pdf', await renderQuarantineTag(makeTag({ status: 'rejected', safety: false })));
		const text = pdfText(file).replace(/\s+/g, ' ');
		expect(text).toContain('QUARANTINE — REJECTED');
		expect(text).not.toContain('releases');
		expect(text).toContain('returned or disposed of');
	});

	it('draws the QR modules where a scanner expects them', async () => {
		const tag = makeTag();
		const file = writeTemp('tag.pdf', await renderQuarantineTag(tag));
		const { modules } = QRCode.create(tag.url, { errorCorrectionLevel: 'M' });
		// ISO/IEC 18004: a version-v symbol is 4v + 17 modules wide.
		expect((modules.size - 17) % 4).toBe(0);
		const dpi = 300;
		const raster = rasterGrey(file, dpi);
		const scale = dpi / 72;
		// Geometry from quarantine-tag.ts: QR square of 104 pt, 18 pt from the right edge, 10 pt under the 46 pt band.
		const side = 104;
		const left = A6_LANDSCAPE[0] - 18 - side;
		const top = 46 + 10;
		const module = side / (modules.size + 2 * QUIET_MODULES);
		let mismatches = 0;
		for (let row = 0; row < modules.size; row++) {
			for (let col = 0; col < modules.size; col++) {
				const x = Math.round((left + (QUIET_MODULES + col + 0.5) * module) * scale);
				const y = Math.round((top + (QUIET_MODULES + row + 0.5) * module) * scale);
				const dark = raster.pixel(x, y) < 128;
				if (dark !== Boolean(modules.get(row, col))) mismatches++;
			}
		}
		expect(mismatches).toBe(0);
	});

	it('merges dark modules into runs that cover exactly the dark modules', () => {
		const url = 'https://restvolt.example/lots/abc';
		const { modules } = QRCode.create(url, { errorCorrectionLevel: 'M' });
		const { size, runs } = qrRuns(url);
		expect(size).toBe(modules.size);
		const covered = new Set(runs.flatMap((r) => Array.from({ length: r.length }, (_, k) => r.row * size + r.col + k)));
		let dark = 0;
		for (let i = 0; i < size * size; i++) if (modules.data[i]) dark++;
		expect(covered.size).toBe(dark);
		for (const index of covered) expect(modules.data[index]).toBe(1);
		// ISO/IEC 18004 finder pattern: the top-left 7 × 7 corner starts with a full dark row of 7.
		expect(runs[0]).toEqual({ row: 0, col: 0, length: 7 });
	});
});
