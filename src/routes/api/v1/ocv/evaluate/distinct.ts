// Identical readings (same voltage and temperature) give identical results, and real lots repeat
// readings often (meters resolve 0.1 mV, thermometers 0.1 °C): evaluate each distinct one once.
import type { ReadingInput } from '$lib/electrochem';

export function distinctReadings(readings: readonly ReadingInput[]): { unique: ReadingInput[]; order: Int32Array } {
	const seen = new Map<number, Map<number, number>>();
	const unique: ReadingInput[] = [];
	const order = new Int32Array(readings.length);
	for (let i = 0; i < readings.length; i++) {
		const { ocv_v, temperature_c } = readings[i];
		let byTemperature = seen.get(ocv_v);
		if (!byTemperature) seen.set(ocv_v, (byTemperature = new Map()));
		let k = byTemperature.get(temperature_c);
		if (k === undefined) {
			k = unique.length;
			byTemperature.set(temperature_c, k);
			unique.push({ ocv_v, temperature_c });
		}
		order[i] = k;
	}
	return { unique, order };
}
