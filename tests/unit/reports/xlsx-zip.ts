import JSZip from 'jszip';

/** Reads cells straight from the XLSX zip (ECMA-376 SpreadsheetML), independent of xlsx-populate's reader. */
export interface RawCell {
	type: 'number' | 'string' | 'other';
	value: string;
}

const decode = (xml: string): string =>
	xml
		.replace(/&lt;/g, '<')
		.replace(/&gt;/g, '>')
		.replace(/&quot;/g, '"')
		.replace(/&apos;/g, "'")
		.replace(/&amp;/g, '&');

function sharedStrings(xml: string): string[] {
	return [...xml.matchAll(/<si>([\s\S]*?)<\/si>/g)].map(([, si]) =>
		decode([...si.matchAll(/<t(?:\s[^>]*)?>([\s\S]*?)<\/t>/g)].map((m) => m[1]).join(''))
	);
}

/** Sheet names in workbook order, paired with their part paths through the relationships file. */
export async function readZipSheets(bytes: Uint8Array): Promise<Map<string, Map<string, RawCell>>> {
	const zip = await JSZip.loadAsync(bytes);
	const text = async (path: string) => (await zip.file(path)?.async('string')) ?? '';
	const strings = sharedStrings(await text('xl/sharedStrings.xml'));
	const rels = await text('xl/_rels/workbook.xml.rels');
	const targets = new Map([...rels.matchAll(/<Relationship [^>]*?Id="([^"]+)"[^>]*?Target="([^"]+)"/g)].map((m) => [m[1], m[2]]));
	const workbook = await text('xl/workbook.xml');
	const sheets = new Map<string, Map<string, RawCell>>();
	for (const [, name, rid] of workbook.matchAll(/<sheet [^>]*?name="([^"]+)"[^>]*?r:id="([^"]+)"/g)) {
		const target = (targets.get(rid) ?? '').replace(/^\/?xl\//, '');
		sheets.set(decode(name), parseCells(await text(`xl/${target}`), strings));
	}
	return sheets;
}

function parseCells(xml: string, strings: string[]): Map<string, RawCell> {
	const cells = new Map<string, RawCell>();
	for (const [, ref, attrs, body] of xml.matchAll(/<c r="([A-Z]+\d+)"([^>]*?)(?:\/>|>([\s\S]*?)<\/c>)/g)) {
		const v = body?.match(/<v>([\s\S]*?)<\/v>/)?.[1];
		const type = attrs.match(/t="([^"]+)"/)?.[1];
		if (type === 's' && v !== undefined) cells.set(ref, { type: 'string', value: strings[Number(v)] });
		else if (type === 'inlineStr') cells.set(ref, { type: 'string', value: decode(body?.match(/<t[^>]*>([\s\S]*?)<\/t>/)?.[1] ?? '') });
		else if (type === 'str') cells.set(ref, { type: 'string', value: decode(v ?? '') });
		else if (v !== undefined && (type === undefined || type === 'n')) cells.set(ref, { type: 'number', value: v });
		else if (v !== undefined) cells.set(ref, { type: 'other', value: v });
	}
	return cells;
}
