/**
 * Restvolt's one way of writing numbers and times, for pages, charts, PDFs and e-mails alike.
 * Numbers keep their units, with fixed decimals that suit the instrument; a value and its unit are
 * joined by a no-break space so a line never breaks between them; negative numbers get a true minus
 * sign; a missing value is an em dash. Quantities in Restvolt travel in base units (V, °C, SOC as a
 * fraction 0–1, mΩ), so each function takes the stored value.
 * Times are written in one style, ISO 8601 date and minutes in UTC with the zone named
 * ("2031-05-15 10:05 UTC"), so a page, a report and an e-mail read the same wherever they are opened.
 */

export const MISSING = '—';
const MINUS = '\u2212';
const NBSP = '\u00a0';

type Maybe = number | null | undefined;

const known = (value: Maybe): value is number => value !== null && value !== undefined && Number.isFinite(value);

/** A number with fixed decimals, a true minus sign and never "−0.000"; no unit. */
export function fixed(value: Maybe, decimals: number): string {
	if (!known(value)) return MISSING;
	const text = value.toFixed(decimals);
	if (Number(text) === 0) return (0).toFixed(decimals);
	return text.replace('-', MINUS);
}

/** Like fixed(), with a plus sign on positive values: for differences such as residuals. */
export function signed(value: Maybe, decimals: number): string {
	if (!known(value)) return MISSING;
	const text = fixed(value, decimals);
	return value > 0 && Number(value.toFixed(decimals)) !== 0 ? `+${text}` : text;
}

const withUnit = (text: string, unit: string) => (text === MISSING ? MISSING : `${text}${NBSP}${unit}`);

/** Volts; 3 decimals (1 mV) by default, 4 (0.1 mV) where a cell meter resolves it. */
export const volts = (value: Maybe, decimals = 3) => withUnit(fixed(value, decimals), 'V');

/** Takes volts, writes millivolts: 1 V = 1000 mV (SI prefix milli = 10⁻³). */
export const millivolts = (volts: Maybe, decimals = 1) => withUnit(fixed(known(volts) ? volts * 1000 : volts, decimals), 'mV');

/** A difference in volts written in millivolts with its sign ("+1.2 mV", "−0.4 mV"). */
export const signedMillivolts = (volts: Maybe, decimals = 1) => withUnit(signed(known(volts) ? volts * 1000 : volts, decimals), 'mV');

export const celsius = (value: Maybe, decimals = 1) => withUnit(fixed(value, decimals), '°C');

/** Decimals for a value someone set (a limit, a reference temperature): none when it is whole, else `decimals`. */
export const settingDecimals = (value: Maybe, decimals = 1) => (known(value) && Number.isInteger(value) ? 0 : decimals);

/** A temperature someone chose (a model's reference, a range end): whole degrees unless it has a fraction. */
export const celsiusSetting = (value: Maybe) => celsius(value, settingDecimals(value));

export const milliohms = (value: Maybe, decimals = 1) => withUnit(fixed(value, decimals), 'mΩ');

/** A cell's or pack's rated capacity. */
export const ampereHours = (value: Maybe, decimals = 2) => withUnit(fixed(value, decimals), 'Ah');

/** Takes a fraction (0–1), writes percent. */
export const percent = (fraction: Maybe, decimals = 0) => withUnit(fixed(known(fraction) ? fraction * 100 : fraction, decimals), '%');

/** An SOC estimate with its interval, as the design notes ask: "31 % (22–40 %)". */
export function socInterval(soc: Maybe, low: Maybe, high: Maybe, decimals = 0): string {
	if (!known(soc)) return MISSING;
	if (!known(low) || !known(high)) return percent(soc, decimals);
	return `${percent(soc, decimals)} (${percentRange(low, high, decimals)})`;
}

/** A range of fractions in percent with one unit: "22–40 %". */
export function percentRange(low: Maybe, high: Maybe, decimals = 0): string {
	if (!known(low) || !known(high)) return MISSING;
	return withUnit(`${fixed(low * 100, decimals)}–${fixed(high * 100, decimals)}`, '%');
}

/** An SOC estimate with its standard uncertainty: "31 % ± 4 %". */
export function socSigma(soc: Maybe, sigma: Maybe, decimals = 0): string {
	if (!known(soc)) return MISSING;
	if (!known(sigma)) return percent(soc, decimals);
	return `${percent(soc, decimals)} ±${NBSP}${percent(sigma, decimals)}`;
}

const MEBIBYTE = 1024 * 1024;

/** Megabytes as uploads count them (1 MB = 1024 × 1024 bytes), to 0.1 MB. */
export const megabytes = (bytes: Maybe, decimals = 1) => withUnit(fixed(known(bytes) ? bytes / MEBIBYTE : bytes, decimals), 'MB');

/** A stored file's size: whole KB (at least 1) under 1 MB, else MB to 0.1. */
export function fileSize(bytes: Maybe): string {
	if (!known(bytes)) return MISSING;
	return bytes < MEBIBYTE ? withUnit(String(Math.max(1, Math.round(bytes / 1024))), 'KB') : megabytes(bytes);
}

const GROUPED = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 0 });

/** A whole count with thousands separators: 12500 → "12,500". */
export function count(value: Maybe): string {
	if (!known(value)) return MISSING;
	return GROUPED.format(Math.round(value)).replace('-', MINUS);
}

/** A count followed by its noun, singular for one: "1 unit", "1,200 units". */
export function quantity(value: Maybe, singular = 'unit', plural = `${singular}s`): string {
	if (!known(value)) return MISSING;
	return `${count(value)}${NBSP}${Math.round(value) === 1 ? singular : plural}`;
}

export const ppm = (value: Maybe) => withUnit(count(value), 'ppm');

type Instant = string | Date | null | undefined;

function dateOf(value: Instant): Date | null {
	if (value === null || value === undefined || value === '') return null;
	const date = value instanceof Date ? value : new Date(value);
	return Number.isNaN(date.getTime()) ? null : date;
}

/** "2031-05-15 10:05 UTC"; `seconds` adds them where an audit trail needs them. */
export function dateTime(value: Instant, options: { seconds?: boolean } = {}): string {
	const date = dateOf(value);
	if (!date) return MISSING;
	const iso = date.toISOString();
	return `${iso.slice(0, 10)} ${iso.slice(11, options.seconds ? 19 : 16)} UTC`;
}

/** "2031-05-15"; a plain calendar date ("2031-05-15") stays that date. */
export function dateOnly(value: Instant): string {
	const date = dateOf(value);
	return date ? date.toISOString().slice(0, 10) : MISSING;
}

/** "10:05 UTC", for "as of" stamps on the same day. */
export function timeOnly(value: Instant): string {
	const date = dateOf(value);
	return date ? `${date.toISOString().slice(11, 16)} UTC` : MISSING;
}

/**
 * An evaluated reading's SOC as an interval, e.g. "31 % (22–40 %)": the estimate and its 95 % bounds.
 * When the interval is too wide to place the cell (determinate false) the estimate is left out and the
 * text says so: "indeterminate 5–80 %".
 */
export function formatSocInterval(r: { soc: Maybe; soc_low: Maybe; soc_high: Maybe; determinate?: boolean | null }, decimals = 0): string {
	if (r.determinate === false && known(r.soc_low) && known(r.soc_high))
		return `indeterminate ${percentRange(r.soc_low, r.soc_high, decimals)}`;
	return socInterval(r.soc, r.soc_low, r.soc_high, decimals);
}
