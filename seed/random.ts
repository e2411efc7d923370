/**
 * Seeded pseudo-random numbers for the demo seed, test fixtures and the bench, so every run produces
 * the same data. mulberry32 (32-bit state) is small and fast; it is not for anything secret.
 */
export function mulberry32(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

/** A standard normal deviate from two uniform draws (Box–Muller, cosine branch). */
export function standardNormal(next: () => number): number {
	return Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next());
}
