// Seeded random data for the inspection tests (deterministic on every run).
/** mulberry32: small seeded PRNG so the data are the same on every run. */
function prng(seed: number) {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}
export function normalSample(seed: number, n: number, mean: number, sd: number): number[] {
	const r = prng(seed);
	return Array.from({ length: n }, () => mean + sd * Math.sqrt(-2 * Math.log(1 - r())) * Math.cos(2 * Math.PI * r()));
}
