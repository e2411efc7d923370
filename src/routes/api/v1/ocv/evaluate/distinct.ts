// Identical readings (same voltage and temperature) give identical results, and real lots repeat
// readings often (meters resolve 0.1 mV, thermometers 0.1 °C): evaluate each distinct one once.
// Keyed by the two numbers' bits in an open-addressing table: a Map of Maps keyed by doubles took
// about 2 ms of the 10,000-reading call (npm run bench, ocv-evaluate-10000), this about a tenth.
import type { ReadingInput } from '$lib/electrochem';

/** 32-bit hash of two doubles' bit patterns (murmur3-style mixing of the four words). */
function hashPair(words: Uint32Array): number {
	let h = 0x9e3779b9;
	for (let i = 0; i < 4; i++) {
		h = Math.imul(h ^ words[i], 0x85ebca6b);
		h ^= h >>> 13;
	}
	h = Math.imul(h ^ (h >>> 16), 0xc2b2ae35);
	return (h ^ (h >>> 16)) >>> 0;
}

export function distinctReadings(readings: readonly ReadingInput[]): { unique: ReadingInput[]; order: Int32Array } {
	const bits = new Float64Array(2);
	const words = new Uint32Array(bits.buffer);
	let size = 16;
	while (size < readings.length * 2) size *= 2;
	const slots = new Int32Array(size).fill(-1); // index into `unique`, or -1
	const mask = size - 1;
	const unique: ReadingInput[] = [];
	const order = new Int32Array(readings.length);
	for (let i = 0; i < readings.length; i++) {
		const ocv_v = readings[i].ocv_v + 0; // -0 and 0 are the same reading
		const temperature_c = readings[i].temperature_c + 0;
		bits[0] = ocv_v;
		bits[1] = temperature_c;
		let slot = hashPair(words) & mask;
		let k = slots[slot];
		while (k !== -1 && (unique[k].ocv_v !== ocv_v || unique[k].temperature_c !== temperature_c)) {
			slot = (slot + 1) & mask;
			k = slots[slot];
		}
		if (k === -1) {
			k = unique.length;
			slots[slot] = k;
			unique.push({ ocv_v, temperature_c });
		}
		order[i] = k;
	}
	return { unique, order };
}
