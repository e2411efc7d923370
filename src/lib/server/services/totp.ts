/**
 * Time-based one-time codes (RFC 6238 TOTP over RFC 4226 HOTP) through the `otpauth` package, with
 * the settings every common authenticator app reads from a QR code: HMAC-SHA-1, 6 digits, 30-second
 * steps, a 160-bit secret (RFC 4226 §4 recommends 160 bits). Pure: no database, no clock of its own.
 */
import { Secret, TOTP } from 'otpauth';

export const TOTP_DIGITS = 6;
export const TOTP_PERIOD_SECONDS = 30;
/** One step either side: a phone clock up to ~30 s off, or a code typed just as it changed. */
export const TOTP_WINDOW = 1;
const ISSUER = 'Restvolt';

function totp(secretBase32: string, label = ''): TOTP {
	return new TOTP({
		issuer: ISSUER,
		label,
		algorithm: 'SHA1',
		digits: TOTP_DIGITS,
		period: TOTP_PERIOD_SECONDS,
		secret: Secret.fromBase32(secretBase32)
	});
}

/** A new random secret, base32 as authenticator apps take it. */
export function newTotpSecret(): string {
	return new Secret({ size: 20 }).base32;
}

/** The `otpauth://totp/…` address the QR code carries. */
export function totpUri(secretBase32: string, accountEmail: string): string {
	return totp(secretBase32, accountEmail).toString();
}

/** The secret in groups of four for typing by hand: "ABCD EFGH …". */
export function groupedForTyping(secretBase32: string): string {
	return secretBase32
		.replace(/=+$/, '')
		.match(/.{1,4}/g)!
		.join(' ');
}

/** The time step (30-second slot since 1970) of a moment. */
export function timeStep(atMs: number): number {
	return TOTP.counter({ period: TOTP_PERIOD_SECONDS, timestamp: atMs });
}

/**
 * The time step whose code `code` is, within ±TOTP_WINDOW steps of `atMs`, or null when it matches
 * none, or when that step is not newer than `lastStep` (the code, or an older one, was already used).
 */
export function acceptedStep(secretBase32: string, code: string, lastStep: number | null, atMs: number): number | null {
	if (!new RegExp(`^\\d{${TOTP_DIGITS}}$`).test(code)) return null;
	const delta = totp(secretBase32).validate({ token: code, timestamp: atMs, window: TOTP_WINDOW });
	if (delta === null) return null;
	const step = timeStep(atMs) + delta;
	return lastStep !== null && step <= lastStep ? null : step;
}
