// The one rule book for incoming files: content sniffing, name cleaning and the per-use checks.
// Signatures are those of the file formats' own specifications (PDF: ISO 32000-1 7.5.2; PNG spec
// 5.2; JPEG: ITU-T T.81 B.1; ZIP: PKWARE APPNOTE 4.3.7; XLSX: ECMA-376 Part 2); markup detection
// follows the WHATWG MIME Sniffing standard's leading-tag list. Real workbooks come from
// xlsx-populate, an outside writer.
import { describe, expect, it } from 'vitest';
import XlsxPopulate from 'xlsx-populate';
import { cleanFileName, extensionOf, MAX_FILE_NAME_LENGTH } from '../../../src/lib/uploads/file-name';
import { checkUpload, UPLOAD_USES, type UploadVerdict } from '../../../src/lib/uploads/rules';
import { sniff } from '../../../src/lib/uploads/sniff';

const text = (s: string) => new TextEncoder().encode(s);
const bytes = (...b: number[]) => new Uint8Array(b);
const PDF = text('%PDF-1.7\n%âãÏÓ\n1 0 obj\n<<>>\nendobj\n%%EOF\n');
const PNG = bytes(0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52);
const JPEG = bytes(0xff, 0xd8, 0xff, 0xe0, 0, 16, 0x4a, 0x46, 0x49, 0x46, 0);
const HTML = text('\uFEFF  \n<!DOCTYPE html><html><script>alert(document.cookie)</script></html>');
const CSV = text('serial;ocv_v;temp\nA-1;3,712;25\n');

async function workbook(): Promise<Uint8Array> {
	const book = await XlsxPopulate.fromBlankAsync();
	book.sheet(0)!.cell('A1').value('serial');
	return new Uint8Array((await book.outputAsync()) as Buffer);
}

/** A ZIP whose only entry is a Word part: "PK\3\4", version, flags, method, times, sizes, name. */
function wordZip(): Uint8Array {
	const name = text('word/document.xml');
	const header = new Uint8Array(30);
	header.set([0x50, 0x4b, 0x03, 0x04, 20, 0]);
	header[26] = name.length;
	return new Uint8Array([...header, ...name]);
}

const refusal = (v: UploadVerdict) => (v.ok ? null : v.refusal);

describe('sniff', () => {
	it('recognises PDF, PNG, JPEG and an XLSX workbook by their signatures', async () => {
		expect(sniff(PDF)).toBe('pdf');
		expect(sniff(PNG)).toBe('png');
		expect(sniff(JPEG)).toBe('jpeg');
		expect(sniff(await workbook())).toBe('xlsx');
	});

	it('tells a ZIP that is not a workbook apart, and takes no truncated signature for the real thing', () => {
		expect(sniff(wordZip())).toBe('zip');
		expect(sniff(text('%PD'))).toBe('text');
		expect(sniff(bytes(0xff, 0xd8))).not.toBe('jpeg');
		expect(sniff(bytes(0x89, 0x50, 0x4e, 0x47))).not.toBe('png');
	});

	it('reads HTML as HTML even after a BOM and white space, whatever tag opens it', () => {
		expect(sniff(HTML)).toBe('html');
		for (const opening of [
			'<html>',
			'<HEAD>',
			'<script src=x>',
			'<iframe ',
			'<p>',
			'<a href=x>',
			'<!-- x -->',
			'<body>',
			'<br>',
			'<TITLE>'
		]) {
			expect(sniff(text(`  ${opening}hello`)), opening).toBe('html');
		}
		expect(sniff(text('<?xml version="1.0"?><svg/>'))).toBe('xml');
		expect(sniff(text('<svg xmlns="http://www.w3.org/2000/svg"></svg>'))).toBe('xml');
	});

	it('takes plain text and CSV (also 8-bit code pages) as text, but not UTF-16 or control bytes', () => {
		expect(sniff(CSV)).toBe('text');
		expect(sniff(bytes(0x54, 0x65, 0x6d, 0x70, 0x20, 0xb0, 0x43, 0x0d, 0x0a))).toBe('text'); // "Temp °C" in Windows-1252
		expect(sniff(text('a <b> is not a tag at the start'))).toBe('text');
		expect(sniff(bytes(0xff, 0xfe, 0x41, 0x00, 0x42, 0x00))).toBe('binary'); // UTF-16LE "AB"
		expect(sniff(text('serial\u0000,ocv'))).toBe('binary');
		expect(sniff(new Uint8Array())).toBe('empty');
	});
});

describe('cleanFileName', () => {
	it('keeps only the last segment of a path, and the extension of the real type', () => {
		expect(cleanFileName('../../x.pdf', 'pdf')).toBe('x.pdf');
		expect(cleanFileName('C:\\Users\\me\\CoC.PDF', 'pdf')).toBe('CoC.pdf');
		expect(cleanFileName('a/b\\c.png', 'png')).toBe('c.png');
		expect(cleanFileName('../../x.html', 'pdf')).toBe('x.html.pdf');
		expect(cleanFileName('photo.JPEG', 'jpeg')).toBe('photo.jpeg');
		expect(cleanFileName('summary', 'pdf')).toBe('summary.pdf');
	});

	it('drops control, bidirectional and zero-width characters, "..", leading dots and reserved characters', () => {
		expect(cleanFileName('a\u0000b\u001f\u007f.pdf', 'pdf')).toBe('ab.pdf');
		expect(cleanFileName('invoice\u202Efdp.exe', 'pdf')).toBe('invoicefdp.exe.pdf');
		expect(cleanFileName('report..final...pdf', 'pdf')).toBe('report.final.pdf');
		expect(cleanFileName('  .hidden.pdf ', 'pdf')).toBe('hidden.pdf');
		expect(cleanFileName('a"b<c>|d?.pdf', 'pdf')).toBe('a_b_c__d_.pdf');
		expect(cleanFileName('x;filename=evil.pdf', 'pdf')).toBe('x_filename=evil.pdf');
	});

	it('falls back to a plain name and bounds the length without splitting a character', () => {
		expect(cleanFileName('', 'pdf', 'document')).toBe('document.pdf');
		expect(cleanFileName('../..', 'png')).toBe('file.png');
		const long = cleanFileName(`${'é'.repeat(500)}.pdf`, 'pdf');
		expect(Array.from(long).length).toBeLessThanOrEqual(MAX_FILE_NAME_LENGTH);
		expect(long.endsWith('.pdf')).toBe(true);
		const emoji = cleanFileName(`${'😀'.repeat(200)}.pdf`, 'pdf');
		expect(emoji).not.toMatch(/[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/);
		expect(Array.from(emoji).length).toBeLessThanOrEqual(MAX_FILE_NAME_LENGTH);
	});

	it('reads the extension of the last segment only', () => {
		expect(extensionOf('../a.b/c')).toBe('');
		expect(extensionOf('meter.CSV')).toBe('csv');
	});
});

describe('checkUpload', () => {
	it('refuses the HTML page named ../../x.html as a lot document and as a reply, naming what it is', () => {
		for (const use of ['lot_document', 'supplier_reply'] as const) {
			const r = refusal(checkUpload(use, { name: '../../x.html', declaredType: 'text/html', bytes: HTML }));
			expect(r?.status, use).toBe(415);
			expect(r?.code).toBe('unsupported_type');
			expect(r?.message).toContain('“x.html” is an HTML page');
		}
	});

	it('refuses a file named for a type its content is not, and a declared type that disagrees', () => {
		const pdfAsHtml = refusal(checkUpload('lot_document', { name: '../../x.html', declaredType: '', bytes: PDF }));
		expect(pdfAsHtml).toMatchObject({ status: 415, code: 'type_mismatch' });
		const htmlAsPdf = refusal(checkUpload('lot_document', { name: 'coc.pdf', declaredType: 'application/pdf', bytes: HTML }));
		expect(htmlAsPdf).toMatchObject({ status: 415, code: 'unsupported_type' });
		expect(htmlAsPdf?.message).toContain('“coc.pdf” is named .pdf but is an HTML page');
		const declaredHtml = refusal(checkUpload('lot_document', { name: 'coc.pdf', declaredType: 'text/html', bytes: PDF }));
		expect(declaredHtml).toMatchObject({ status: 415, code: 'type_mismatch' });
		expect(declaredHtml?.message).toContain('text/html');
		const pngAsJpeg = refusal(checkUpload('lot_document', { name: 'scan.jpg', declaredType: 'image/jpeg', bytes: PNG }));
		expect(pngAsJpeg).toMatchObject({ status: 415, code: 'type_mismatch' });
	});

	it('refuses empty and oversized files before looking at the content', () => {
		expect(refusal(checkUpload('lot_document', { name: 'a.pdf', declaredType: '', bytes: new Uint8Array() }))).toMatchObject({
			status: 400,
			code: 'empty_file'
		});
		const big = new Uint8Array(UPLOAD_USES.lot_document.maxBytes + 1);
		big.set(PDF);
		const r = refusal(checkUpload('lot_document', { name: 'big.pdf', declaredType: 'application/pdf', bytes: big }));
		expect(r).toMatchObject({ status: 413, code: 'file_too_large' });
		expect(r?.message).toContain('the limit is 20.0\u00a0MB'); // $lib/format joins number and unit with a no-break space
	});

	it('accepts what each use allows, with the stored type and a cleaned name', async () => {
		const doc = checkUpload('lot_document', { name: '../CoC 2031.PDF', declaredType: 'application/octet-stream', bytes: PDF });
		expect(doc).toMatchObject({ ok: true, file: { type: 'pdf', mime: 'application/pdf', fileName: 'CoC 2031.pdf' } });
		const csv = checkUpload('supplier_reply', { name: '8D.csv', declaredType: 'application/vnd.ms-excel', bytes: CSV });
		expect(csv).toMatchObject({ ok: true, file: { type: 'csv', mime: 'text/csv', fileName: '8D.csv' } });
		const notes = checkUpload('supplier_reply', { name: 'notes', declaredType: '', bytes: text('Containment done on 3 May.') });
		expect(notes).toMatchObject({ ok: true, file: { type: 'txt', mime: 'text/plain', fileName: 'notes.txt' } });
		const book = checkUpload('supplier_reply', { name: 'actions.xlsx', declaredType: '', bytes: await workbook() });
		expect(book).toMatchObject({ ok: true, file: { type: 'xlsx' } });
		const meter = checkUpload('meter_file', { name: 'bench.txt', declaredType: 'text/plain', bytes: CSV });
		expect(meter).toMatchObject({ ok: true, file: { type: 'csv' } });
	});

	it('keeps each use to its own allow-list', async () => {
		expect(refusal(checkUpload('lot_document', { name: 'a.csv', declaredType: 'text/csv', bytes: CSV }))).toMatchObject({
			status: 415,
			code: 'unsupported_type'
		});
		expect(refusal(checkUpload('meter_file', { name: 'a.png', declaredType: 'image/png', bytes: PNG }))).toMatchObject({
			status: 415,
			code: 'unsupported_type'
		});
		expect(refusal(checkUpload('supplier_reply', { name: 'a.docx', declaredType: '', bytes: wordZip() }))).toMatchObject({
			status: 415,
			code: 'unsupported_type'
		});
		expect(refusal(checkUpload('meter_file', { name: 'meter.csv', declaredType: 'text/csv', bytes: await workbook() }))).toMatchObject({
			status: 415,
			code: 'type_mismatch'
		});
	});
});
