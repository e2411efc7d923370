// The evaluate response can hold 10,000 results, so it is written by hand: one pass, numbers
// rounded to 1e-6 (1 µV, 0.0001 % SOC — far below any meter's resolution), which also shrinks the
// body by about a quarter compared with JSON.stringify of full doubles.
import type { UnitResult } from '$lib/electrochem';

const SCALE = 1e6;

function num(x: number | null): string {
	if (x === null || !Number.isFinite(x)) return 'null';
	return String(Math.round(x * SCALE) / SCALE);
}

function flags(list: readonly string[]): string {
	return list.length === 0 ? '[]' : `["${list.join('","')}"]`;
}

export function serialiseResults(results: readonly UnitResult[]): string {
	const parts = new Array<string>(results.length);
	for (let i = 0; i < results.length; i++) {
		const u = results[i];
		parts[i] =
			`{"soc":${num(u.soc)},"soc_sigma":${num(u.soc_sigma)},"soc_low":${num(u.soc_low)},"soc_high":${num(u.soc_high)}` +
			`,"determinate":${u.determinate},"ocv_cell_v":${num(u.ocv_cell_v)},"ocv_at_25c_v":${num(u.ocv_at_25c_v)}` +
			`,"expected_ocv_v":${num(u.expected_ocv_v)},"residual_v":${num(u.residual_v)},"flags":${flags(u.flags)}}`;
	}
	return `{"results":[${parts.join(',')}]}`;
}
