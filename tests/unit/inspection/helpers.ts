// Seeded random data for the inspection tests (deterministic on every run).
import { mulberry32, standardNormal } from '../../../seed/random';

export function normalSample(seed: number, n: number, mean: number, sd: number): number[] {
	const r = mulberry32(seed);
	return Array.from({ length: n }, () => mean + sd * standardNormal(r));
}
