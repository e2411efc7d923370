// The direct XLSX reader against xlsx-populate (the outside reference, and the reader the import
// used before): the same table of strings for generated workbooks, plus hand-written workbook XML
// for what xlsx-populate cannot write (inline strings, cells without references, stored entries).
import { crc32, deflateRawSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import XlsxPopulate from 'xlsx-populate';
import { cellRef, decodeXml, readXlsxTable, XlsxReadError } from '../../../src/lib/server/services/xlsx-reader';

interface RichTextLike {
	add(text: string, styles?: Record<string, unknown>): RichTextLike;
}
const RichText = (XlsxPopulate as unknown as { RichText: new () => RichTextLike }).RichText;

/** The import's conversion of xlsx-populate values before the direct reader (kept as the reference). */
function referenceText(value: unknown): string {
	if (value === null || value === undefined) return '';
	if (value instanceof Date) return value.toISOString();
	if (typeof value === 'object' && 'text' in (value as object)) return String((value as { text: () => string }).text());
	return String(value);
}

async function referenceTable(bytes: Buffer): Promise<string[][]> {
	const workbook = await XlsxPopulate.fromDataAsync(bytes);
	const values = (workbook.sheets()[0]?.usedRange()?.value() ?? []) as unknown[][];
	return values.map((row) => row.map(referenceText));
}

async function workbookWith(fill: (wb: Awaited<ReturnType<typeof XlsxPopulate.fromBlankAsync>>) => void): Promise<Buffer> {
	const wb = await XlsxPopulate.fromBlankAsync();
	fill(wb);
	return (await wb.outputAsync()) as Buffer;
}

/** A minimal zip writer (deflate or stored) for hand-written workbook parts. */
function zip(files: Record<string, string>, store = false): Buffer {
	const locals: Buffer[] = [];
	const centrals: Buffer[] = [];
	let offset = 0;
	for (const [name, text] of Object.entries(files)) {
		const raw = Buffer.from(text, 'utf8');
		const data = store ? raw : deflateRawSync(raw);
		const nameBytes = Buffer.from(name, 'utf8');
		const local = Buffer.alloc(30);
		local.writeUInt32LE(0x04034b50, 0);
		local.writeUInt16LE(20, 4);
		local.writeUInt16LE(store ? 0 : 8, 8);
		local.writeUInt32LE(crc32(raw), 14);
		local.writeUInt32LE(data.length, 18);
		local.writeUInt32LE(raw.length, 22);
		local.writeUInt16LE(nameBytes.length, 26);
		const central = Buffer.alloc(46);
		central.writeUInt32LE(0x02014b50, 0);
		central.writeUInt16LE(20, 4);
		central.writeUInt16LE(20, 6);
		central.writeUInt16LE(store ? 0 : 8, 10);
		central.writeUInt32LE(crc32(raw), 16);
		central.writeUInt32LE(data.length, 20);
		central.writeUInt32LE(raw.length, 24);
		central.writeUInt16LE(nameBytes.length, 28);
		central.writeUInt32LE(offset, 42);
		locals.push(local, nameBytes, data);
		centrals.push(central, nameBytes);
		offset += 30 + nameBytes.length + data.length;
	}
	const directory = Buffer.concat(centrals);
	const end = Buffer.alloc(22);
	end.writeUInt32LE(0x06054b50, 0);
	end.writeUInt16LE(Object.keys(files).length, 8);
	end.writeUInt16LE(Object.keys(files).length, 10);
	end.writeUInt32LE(directory.length, 12);
	end.writeUInt32LE(offset, 16);
	return Buffer.concat([...locals, directory, end]);
}

const NS = 'xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships"';
const REL = 'http://schemas.openxmlformats.org/officeDocument/2006/relationships';

/** A workbook whose first sheet (in workbook order) is `sheet2.xml`, to prove order comes from workbook.xml. */
function handWrittenWorkbook(sheetData: string, sharedStrings?: string, store = false): Buffer {
	return zip(
		{
			'_rels/.rels': `<?xml version="1.0"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="${REL}/officeDocument" Target="xl/workbook.xml"/></Relationships>`,
			'xl/workbook.xml': `<?xml version="1.0"?><workbook ${NS}><sheets><sheet name="Readings" sheetId="2" r:id="rId7"/><sheet name="Other" sheetId="1" r:id="rId1"/></sheets></workbook>`,
			'xl/_rels/workbook.xml.rels': `<?xml version="1.0"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="${REL}/worksheet" Target="worksheets/sheet1.xml"/><Relationship Id="rId7" Type="${REL}/worksheet" Target="/xl/worksheets/sheet2.xml"/>${sharedStrings ? `<Relationship Id="rId9" Type="${REL}/sharedStrings" Target="sharedStrings.xml"/>` : ''}</Relationships>`,
			'xl/worksheets/sheet1.xml': `<?xml version="1.0"?><worksheet ${NS}><sheetData><row r="1"><c r="A1" t="inlineStr"><is><t>wrong sheet</t></is></c></row></sheetData></worksheet>`,
			'xl/worksheets/sheet2.xml': `<?xml version="1.0"?><worksheet ${NS}><sheetData>${sheetData}</sheetData></worksheet>`,
			...(sharedStrings ? { 'xl/sharedStrings.xml': `<?xml version="1.0"?><sst ${NS}>${sharedStrings}</sst>` } : {})
		},
		store
	);
}

describe('readXlsxTable vs xlsx-populate on generated workbooks', () => {
	it('reads a meter sheet with strings, numbers, booleans, empties and a serial-number date the same', async () => {
		expect.hasAssertions();
		const bytes = await workbookWith((wb) => {
			const s = wb.sheet(0)!;
			s.range('A1:F1').value([['Serial', 'OCV (V)', 'Temperature (°C)', 'Measured at', 'OK', 'Note']]);
			s.range('A2:F4').value([
				['VC-0001', 3.6512, 23.4, 46082.35, true, 'Cells & packs <fine>'],
				['00042', -0.0015, 25, 46082.5, false, 'quote " and apostrophe \''],
				['VC-0003', 1e-7, 1234567.891, undefined, undefined, '  spaced  ']
			]);
			s.cell('D5').value(new Date(Date.UTC(2026, 2, 2, 8, 30))).style('numberFormat', 'yyyy-mm-dd hh:mm'); // stored as a serial number
		});
		const table = readXlsxTable(bytes);
		expect(table).toEqual(await referenceTable(bytes));
		expect(table[1][5]).toBe('Cells & packs <fine>');
		expect(table[2][0]).toBe('00042'); // text stays text: leading zeros kept
		expect(table[3][3]).toBe('');
	});

	it('starts the table at the first used row and column and handles columns past Z (AA, AB)', async () => {
		expect.hasAssertions();
		const bytes = await workbookWith((wb) => {
			const s = wb.sheet(0)!;
			s.cell('C4').value('first');
			s.cell('AA6').value(3.7);
			s.cell('AB7').value('last & least');
		});
		const table = readXlsxTable(bytes);
		expect(table).toEqual(await referenceTable(bytes));
		expect(table.length).toBe(4); // rows 4..7
		expect(table[0].length).toBe(26); // columns C..AB
		expect(table[3][25]).toBe('last & least');
	});

	it('joins rich-text runs of a shared string', async () => {
		expect.hasAssertions();
		const bytes = await workbookWith((wb) => {
			const rich = new RichText();
			rich.add('Cell ', { bold: true }).add('A&B', { italic: true }).add(' <ok>');
			wb.sheet(0)!.cell('A1').value(rich as unknown as string); // the project's typings know no RichText
			wb.sheet(0)!.cell('B1').value('plain');
		});
		const table = readXlsxTable(bytes);
		expect(table).toEqual(await referenceTable(bytes));
		expect(table[0][0]).toBe('Cell A&B <ok>');
	});

	it('reads the first sheet when the workbook has several', async () => {
		expect.hasAssertions();
		const bytes = await workbookWith((wb) => {
			wb.sheet(0)!.cell('A1').value('first sheet');
			wb.addSheet('Second').cell('A1').value('second sheet');
		});
		expect(readXlsxTable(bytes)).toEqual(await referenceTable(bytes));
		expect(readXlsxTable(bytes)).toEqual([['first sheet']]);
	});

	it('gives an empty table for an empty sheet, like the previous reader', async () => {
		expect.hasAssertions();
		const bytes = await workbookWith(() => undefined);
		expect(readXlsxTable(bytes)).toEqual(await referenceTable(bytes));
	});

	it('reads a 2,000-row generated meter file identically', async () => {
		expect.hasAssertions();
		const rows = Array.from({ length: 2000 }, (_, i) => [`S-${String(i).padStart(5, '0')}`, 3.6 + (i % 97) / 1000, 20 + (i % 7) * 0.5, 46082 + i / 1440]);
		const bytes = await workbookWith((wb) => wb.sheet(0)!.range(1, 1, rows.length, 4).value(rows));
		expect(readXlsxTable(bytes)).toEqual(await referenceTable(bytes));
	});
});

describe('readXlsxTable on hand-written workbook XML', () => {
	it('reads inline strings, formula strings, errors, entities and implied cell positions', () => {
		expect.hasAssertions();
		const bytes = handWrittenWorkbook(
			'<row r="2"><c r="B2" t="inlineStr"><is><t>inline &amp; &#x3A9; &#937;</t></is></c><c r="C2" t="s"><v>1</v></c><c r="D2" t="str"><f>A1&amp;"x"</f><v>calc</v></c></row>' +
				'<row><c t="n"><v>3.7100</v></c><c t="e"><v>#N/A</v></c><c s="3"/></row>',
			'<si><t>zero</t></si><si><r><t>one </t></r><r><rPr><b/></rPr><t xml:space="preserve"> run</t></r><rPh sb="0" eb="1"><t>PHON</t></rPh></si>'
		);
		expect(readXlsxTable(bytes)).toEqual([
			['', 'inline & Ω Ω', 'one  run', 'calc'], // row 2 starts at B; the unreferenced row 3 at A
			['3.71', '#N/A', '', '']
		]);
	});

	it('reads stored (uncompressed) zip entries too', () => {
		expect.hasAssertions();
		const bytes = handWrittenWorkbook('<row r="1"><c r="A1"><v>1</v></c><c r="B1" t="b"><v>1</v></c></row>', undefined, true);
		expect(readXlsxTable(bytes)).toEqual([['1', 'true']]);
	});

	it('refuses bytes that are not a workbook', () => {
		expect.hasAssertions();
		expect(() => readXlsxTable(Buffer.from('PK\u0003\u0004 not really a zip'))).toThrow(XlsxReadError);
		expect(() => readXlsxTable(zip({ 'hello.txt': 'no workbook here' }))).toThrow(XlsxReadError);
	});
});

describe('helpers', () => {
	it('converts cell references with multi-letter columns', () => {
		expect.hasAssertions();
		expect(cellRef('A1')).toEqual({ column: 1, row: 1 });
		expect(cellRef('Z9')).toEqual({ column: 26, row: 9 });
		expect(cellRef('AA10')).toEqual({ column: 27, row: 10 });
		expect(cellRef('XFD1048576')).toEqual({ column: 16384, row: 1048576 }); // the last cell of a sheet
		expect(cellRef('1A')).toBeNull();
	});

	it('decodes the XML entities', () => {
		expect.hasAssertions();
		expect(decodeXml('a &lt;b&gt; &quot;c&quot; &apos;d&apos; &amp;amp; &#65;&#x42;')).toBe('a <b> "c" \'d\' &amp; AB');
	});
});
