// Numbers with their units, fixed decimals that suit a cell meter.
export const volts = (v: number | null | undefined, digits = 3) => (v == null || !Number.isFinite(v) ? '—' : `${v.toFixed(digits)} V`);
export const millivolts = (v: number | null | undefined, digits = 1) =>
	v == null || !Number.isFinite(v) ? '—' : `${(v * 1000).toFixed(digits)} mV`;
export const celsius = (t: number | null | undefined) => (t == null || !Number.isFinite(t) ? '—' : `${t.toFixed(t % 1 === 0 ? 0 : 1)} °C`);
export const percent = (z: number, digits = 1) => `${(z * 100).toFixed(digits)} %`;
export const dateTime = (iso: string) => new Date(iso).toISOString().slice(0, 16).replace('T', ' ') + ' UTC';
