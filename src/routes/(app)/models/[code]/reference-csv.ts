/**
 * Reads a reference curve pasted or uploaded as text: one "soc,ocv_v" pair a line. Pure, so the
 * browser preview and the save action read the text the same way.
 *   - separators: comma, semicolon, tab or spaces; with ";" or tab a decimal comma is accepted;
 *   - lines that hold no numbers (headers, notes, blank) are skipped; "#" starts a comment;
 *   - SOC in % or as a fraction: if any SOC is above 1 the whole column is read as %.
 */
export interface ParsedCurve {
	points: Array<{ soc: number; ocv_v: number }>;
	socUnit: 'percent' | 'fraction' | null;
	errors: string[];
}

const MAX_ERRORS = 8;
const NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

function splitLine(line: string): string[] {
	const text = line.replace(/#.*$/, '').trim();
	if (text === '') return [];
	if (/[;\t]/.test(text)) return text.split(/\s*[;\t]\s*/).map((f) => f.replace(',', '.'));
	return text.split(/\s*,\s*|\s+/);
}

const hasDigit = (fields: string[]) => fields.some((f) => /\d/.test(f));

export function parseReferenceCsv(text: string): ParsedCurve {
	const raw: Array<{ soc: number; ocv_v: number }> = [];
	const errors: string[] = [];
	text.split(/\r?\n/).forEach((line, i) => {
		const fields = splitLine(line).filter((f) => f !== '');
		if (fields.length === 0) return;
		const [soc, ocv] = fields;
		if (fields.length < 2 || !NUMBER.test(soc) || !NUMBER.test(ocv)) {
			// a header or a note is fine; a line with numbers we cannot read is reported
			if (raw.length > 0 && hasDigit(fields)) errors.push(`line ${i + 1}: expected two numbers "soc,ocv_v"`);
			return;
		}
		raw.push({ soc: Number(soc), ocv_v: Number(ocv) });
	});
	if (raw.length === 0) return { points: [], socUnit: null, errors: errors.slice(0, MAX_ERRORS) };

	const percent = raw.some((p) => p.soc > 1);
	const points = raw.map((p) => ({ soc: percent ? p.soc / 100 : p.soc, ocv_v: p.ocv_v }));
	points.forEach((p, i) => {
		if (!(p.soc >= 0 && p.soc <= 1)) errors.push(`point ${i + 1}: SOC must be within 0–100 % (or 0–1)`);
		if (!(p.ocv_v > 0)) errors.push(`point ${i + 1}: OCV must be a positive voltage`);
	});
	points.sort((a, b) => a.soc - b.soc);
	return { points, socUnit: percent ? 'percent' : 'fraction', errors: errors.slice(0, MAX_ERRORS) };
}
