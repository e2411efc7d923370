/**
 * Side-by-side timing: an operation and its floor run interleaved (A B B A …) after a warm-up, so
 * drift on a shared machine hits both alike; results are medians. Printing follows the one-line
 * format `bench <name> median=… floor=… ratio=… target=… met|missed`.
 */

export function median(values: number[]): number {
	if (values.length === 0) return Number.NaN;
	const sorted = [...values].sort((a, b) => a - b);
	const mid = sorted.length >> 1;
	return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

/** One run returns the measured value (ms for timings, a rate for throughputs). */
export type Sample = () => Promise<number> | number;

export interface PairOptions {
	warmup?: number;
	rounds: number;
	/**
	 * Runs of each side per turn (A×n B×n B×n A×n …). Above 1 when the operation leaves garbage the
	 * server collects during the next request: a floor run right after it would pay for the op's GC.
	 */
	block?: number;
}

/** Warm both up, then alternate op/floor order each round; returns all samples. */
export async function interleaved(op: Sample, floor: Sample, { warmup = 1, rounds, block = 1 }: PairOptions) {
	for (let i = 0; i < warmup; i++) {
		await op();
		await floor();
	}
	const ops: number[] = [];
	const floors: number[] = [];
	const turn = async (fn: Sample, into: number[]) => {
		for (let i = 0; i < block; i++) into.push(await fn());
	};
	for (let r = 0; r < rounds; r++) {
		if (r % 2 === 0) {
			await turn(op, ops);
			await turn(floor, floors);
		} else {
			await turn(floor, floors);
			await turn(op, ops);
		}
	}
	return { ops, floors, op: median(ops), floor: median(floors) };
}

/** Milliseconds one call takes. */
export async function timeMs(fn: () => unknown): Promise<number> {
	const start = performance.now();
	await fn();
	return performance.now() - start;
}

export type Comparison = '<=' | '>=';

export interface Target {
	/** What the target bounds: the op/floor ratio (default) or the measured value itself. */
	on?: 'ratio' | 'value';
	op: Comparison;
	value: number;
	unit?: string;
}

export interface BenchLine {
	name: string;
	value: number;
	floor: number;
	unit: string;
	target: Target;
}

function fmt(value: number): string {
	if (!Number.isFinite(value)) return String(value);
	const abs = Math.abs(value);
	const digits = abs >= 100 ? 0 : abs >= 10 ? 1 : abs >= 1 ? 2 : 3;
	return value.toFixed(digits);
}

export function isMet(line: BenchLine): boolean {
	const subject = line.target.on === 'value' ? line.value : line.value / line.floor;
	return line.target.op === '<=' ? subject <= line.target.value : subject >= line.target.value;
}

export function formatLine(line: BenchLine): string {
	const ratio = line.value / line.floor;
	const ratioText = ratio < 0.1 ? ratio.toFixed(3) : ratio.toFixed(2);
	const target = `${line.target.op}${line.target.value}${line.target.on === 'value' ? (line.target.unit ?? line.unit) : ''}`;
	return `bench ${line.name} median=${fmt(line.value)}${line.unit} floor=${fmt(line.floor)}${line.unit} ratio=${ratioText} target=${target} ${isMet(line) ? 'met' : 'missed'}`;
}

/** The honest line for an operation that could not run. */
export function formatUnavailable(name: string, reason: string): string {
	return `bench ${name} median=- floor=- ratio=- target=- missed (not available: ${reason})`;
}

export { fmt as formatNumber };
