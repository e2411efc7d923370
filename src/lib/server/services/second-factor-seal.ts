/**
 * Sealing TOTP secrets at rest: AES-256-GCM (node:crypto) under a key derived from AUTH_SECRET with
 * HKDF-SHA-256 (RFC 5869), a fresh 96-bit nonce per seal, and the user id as additional
 * authenticated data, so a sealed secret copied onto another person's row does not open. A copy of
 * the database alone does not give anyone the secrets: the key lives only in the app's environment.
 *
 * Format: `v1.<base64url(nonce ‖ tag ‖ ciphertext)>`. Changing AUTH_SECRET makes every stored secret
 * unreadable: people then enrol again (the sign-in code step refuses them until an administrator
 * clears the row). Pure: the caller passes AUTH_SECRET in, which keeps this module testable.
 */
import { createCipheriv, createDecipheriv, hkdfSync, randomBytes } from 'node:crypto';

const VERSION = 'v1';
const NONCE_BYTES = 12;
const TAG_BYTES = 16;
/** Fixed salt and purpose label: the same AUTH_SECRET yields unrelated keys for other purposes. */
const HKDF_SALT = 'restvolt';
const HKDF_INFO = 'restvolt second-factor secret v1';

function sealKey(authSecret: string): Buffer {
	if (!authSecret) throw new Error('AUTH_SECRET is not set: second-factor secrets cannot be sealed');
	return Buffer.from(hkdfSync('sha256', authSecret, HKDF_SALT, HKDF_INFO, 32));
}

/** Seal `plain` (the base32 secret) for `userId`. */
export function sealSecret(plain: string, userId: string, authSecret: string): string {
	const nonce = randomBytes(NONCE_BYTES);
	const cipher = createCipheriv('aes-256-gcm', sealKey(authSecret), nonce);
	cipher.setAAD(Buffer.from(userId, 'utf8'));
	const body = Buffer.concat([cipher.update(plain, 'utf8'), cipher.final()]);
	return `${VERSION}.${Buffer.concat([nonce, cipher.getAuthTag(), body]).toString('base64url')}`;
}

/** Open a sealed secret; throws when it was altered, belongs to someone else or another key sealed it. */
export function openSecret(sealed: string, userId: string, authSecret: string): string {
	const [version, payload] = sealed.split('.');
	if (version !== VERSION || !payload) throw new Error('Not a sealed second-factor secret');
	const bytes = Buffer.from(payload, 'base64url');
	if (bytes.length <= NONCE_BYTES + TAG_BYTES) throw new Error('Sealed second-factor secret is too short');
	const decipher = createDecipheriv('aes-256-gcm', sealKey(authSecret), bytes.subarray(0, NONCE_BYTES));
	decipher.setAAD(Buffer.from(userId, 'utf8'));
	decipher.setAuthTag(bytes.subarray(NONCE_BYTES, NONCE_BYTES + TAG_BYTES));
	return Buffer.concat([decipher.update(bytes.subarray(NONCE_BYTES + TAG_BYTES)), decipher.final()]).toString('utf8');
}
