/** Number and date formatting shared by the documents; a missing value is shown as an em dash. */
export const MISSING = '—';

export function fixed(value: number | null | undefined, decimals: number): string {
	if (value === null || value === undefined || !Number.isFinite(value)) return MISSING;
	return value.toFixed(decimals).replace(/^-(0\.0*)$/, '$1');
}

/** SOC values travel as fractions (0–1); documents show percent. */
export function percent(fraction: number | null | undefined, decimals = 0): string {
	if (fraction === null || fraction === undefined || !Number.isFinite(fraction)) return MISSING;
	return `${fixed(fraction * 100, decimals)} %`;
}

export function millivolts(volts: number | null | undefined, decimals = 1): string {
	if (volts === null || volts === undefined || !Number.isFinite(volts)) return MISSING;
	return fixed(volts * 1000, decimals);
}

/** ISO timestamps shown in UTC so a report reads the same wherever it is opened. */
export function dateTime(iso: string | null | undefined): string {
	if (!iso) return MISSING;
	const date = new Date(iso);
	if (Number.isNaN(date.getTime())) return iso;
	return `${date.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

export function dateOnly(iso: string | null | undefined): string {
	if (!iso) return MISSING;
	const date = new Date(iso);
	return Number.isNaN(date.getTime()) ? iso : date.toISOString().slice(0, 10);
}

export const STATUS_WORDS = { pending: 'PENDING', accept: 'ACCEPT', hold: 'HOLD', reject: 'REJECT' } as const;

export const TRANSPORT_WORDS = { air: 'air', sea: 'sea', road: 'road', rail: 'rail' } as const;
