import { evenSample } from './layout';

export interface SocUnit {
	serial: string;
	/** SOC as a fraction 0–1, like soc_low and soc_high */
	soc: number;
	soc_low: number;
	soc_high: number;
	determinate: boolean;
}

export const ROW_LIMIT = 200;

export interface SocRow {
	unit: SocUnit;
	/** 1 = highest SOC in the whole lot, before sampling */
	rank: number;
}

/** Units ranked by SOC (highest first), evenly thinned to at most `limit` rows. */
export function socRows(units: SocUnit[], limit = ROW_LIMIT): SocRow[] {
	const ranked = [...units].sort((a, b) => b.soc - a.soc || a.serial.localeCompare(b.serial)).map((unit, i) => ({ unit, rank: i + 1 }));
	return evenSample(ranked, limit);
}

export function clamp01(value: number): number {
	return Math.min(1, Math.max(0, value));
}
