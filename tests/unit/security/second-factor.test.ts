/**
 * The second factor's pure parts: sealing the TOTP secret at rest (AES-256-GCM under an HKDF-SHA-256
 * key, checked against an independent WebCrypto decryption) and the code check (RFC 6238 Appendix B
 * test vectors, SHA-1 seed "12345678901234567890"; a 6-digit code is the 8-digit vector mod 10^6,
 * RFC 4226 §5.3).
 */
import { describe, expect, it } from 'vitest';
import { openSecret, sealSecret } from '../../../src/lib/server/services/second-factor-seal';
import { acceptedStep, groupedForTyping, newTotpSecret, timeStep, totpUri } from '../../../src/lib/server/services/totp';

const AUTH_SECRET = 'unit-test-auth-secret-0123456789abcdef';
const USER = 'f0c1a2b3-0000-4000-8000-000000000001';
const SECRET = 'JBSWY3DPEHPK3PXPJBSWY3DPEHPK3PXP';

/** Flip one bit of the sealed payload at `index` (counted in payload bytes). */
function flipByte(sealed: string, index: number): string {
	const [version, payload] = sealed.split('.');
	const bytes = Buffer.from(payload, 'base64url');
	bytes[index] ^= 0x01;
	return `${version}.${bytes.toString('base64url')}`;
}

describe('sealing the secret at rest', () => {
	it('opens to what was sealed, and two seals of the same secret differ (fresh nonce)', () => {
		const a = sealSecret(SECRET, USER, AUTH_SECRET);
		const b = sealSecret(SECRET, USER, AUTH_SECRET);
		expect(a).toMatch(/^v1\.[A-Za-z0-9_-]+$/);
		expect(a).not.toBe(b);
		expect(a).not.toContain(SECRET);
		expect(openSecret(a, USER, AUTH_SECRET)).toBe(SECRET);
		expect(openSecret(b, USER, AUTH_SECRET)).toBe(SECRET);
	});

	it('refuses an altered nonce, tag or ciphertext', () => {
		const sealed = sealSecret(SECRET, USER, AUTH_SECRET);
		for (const index of [0, 11, 12, 27, 28, 40]) {
			expect(() => openSecret(flipByte(sealed, index), USER, AUTH_SECRET), `byte ${index}`).toThrow();
		}
		expect(() => openSecret(sealed.slice(0, -4), USER, AUTH_SECRET)).toThrow();
		expect(() => openSecret('v2.' + sealed.slice(3), USER, AUTH_SECRET)).toThrow(/Not a sealed/);
	});

	it('does not open for another person (user id bound in) or under another AUTH_SECRET', () => {
		const sealed = sealSecret(SECRET, USER, AUTH_SECRET);
		expect(() => openSecret(sealed, 'someone-else', AUTH_SECRET)).toThrow();
		expect(() => openSecret(sealed, USER, AUTH_SECRET + 'x')).toThrow();
		expect(() => sealSecret(SECRET, USER, '')).toThrow(/AUTH_SECRET/);
	});

	it('is AES-256-GCM under HKDF-SHA-256(AUTH_SECRET, salt "restvolt"), as WebCrypto reads it independently', async () => {
		const sealed = sealSecret(SECRET, USER, AUTH_SECRET);
		const bytes = Buffer.from(sealed.split('.')[1], 'base64url');
		const [nonce, tag, body] = [bytes.subarray(0, 12), bytes.subarray(12, 28), bytes.subarray(28)];
		const material = await crypto.subtle.importKey('raw', new TextEncoder().encode(AUTH_SECRET), 'HKDF', false, ['deriveKey']);
		const key = await crypto.subtle.deriveKey(
			{
				name: 'HKDF',
				hash: 'SHA-256',
				salt: new TextEncoder().encode('restvolt'),
				info: new TextEncoder().encode('restvolt second-factor secret v1')
			},
			material,
			{ name: 'AES-GCM', length: 256 },
			false,
			['decrypt']
		);
		// WebCrypto takes the tag appended to the ciphertext.
		const plain = await crypto.subtle.decrypt(
			{ name: 'AES-GCM', iv: nonce, additionalData: new TextEncoder().encode(USER), tagLength: 128 },
			key,
			Buffer.concat([body, tag])
		);
		expect(new TextDecoder().decode(plain)).toBe(SECRET);
	});
});

describe('TOTP codes (RFC 6238 Appendix B, SHA-1, last 6 of the 8 digits)', () => {
	// base32 of the ASCII seed "12345678901234567890".
	const RFC_SEED = 'GEZDGNBVGY3TQOJQGEZDGNBVGY3TQOJQ';
	const VECTORS: Array<[seconds: number, code: string]> = [
		[59, '287082'],
		[1111111109, '081804'],
		[1111111111, '050471'],
		[1234567890, '005924'],
		[2000000000, '279037'],
		[20000000000, '353130']
	];

	it.each(VECTORS)('at T = %i s the code is %s', (seconds, code) => {
		expect(acceptedStep(RFC_SEED, code, null, seconds * 1000)).toBe(timeStep(seconds * 1000));
	});

	it('accepts the step before and after (±1 × 30 s) and nothing further', () => {
		// 287082 belongs to step 1 (30–59 s).
		expect(acceptedStep(RFC_SEED, '287082', null, 5_000)).toBe(1); // step 0: one step early
		expect(acceptedStep(RFC_SEED, '287082', null, 89_000)).toBe(1); // step 2: one step late
		expect(acceptedStep(RFC_SEED, '287082', null, 95_000)).toBeNull(); // step 3: too late
	});

	it('refuses a code whose step was already used, or an older one', () => {
		expect(acceptedStep(RFC_SEED, '287082', 1, 59_000)).toBeNull();
		expect(acceptedStep(RFC_SEED, '287082', 2, 59_000)).toBeNull();
		expect(acceptedStep(RFC_SEED, '287082', 0, 59_000)).toBe(1);
	});

	it('refuses anything that is not six digits', () => {
		for (const code of ['', '28708', '2870820', '28708a', ' 287082', '287 082']) {
			expect(acceptedStep(RFC_SEED, code, null, 59_000), JSON.stringify(code)).toBeNull();
		}
	});

	it('makes 160-bit secrets, groups them for typing and writes the otpauth address apps read', () => {
		const secret = newTotpSecret();
		expect(secret).toMatch(/^[A-Z2-7]{32}$/); // 20 bytes = 32 base32 characters
		expect(newTotpSecret()).not.toBe(secret);
		expect(groupedForTyping(RFC_SEED)).toBe('GEZD GNBV GY3T QOJQ GEZD GNBV GY3T QOJQ');
		const uri = new URL(totpUri(RFC_SEED, 'quality@example.test'));
		expect(uri.protocol).toBe('otpauth:');
		expect(uri.host).toBe('totp');
		expect(decodeURIComponent(uri.pathname)).toBe('/Restvolt:quality@example.test');
		expect(Object.fromEntries(uri.searchParams)).toMatchObject({
			secret: RFC_SEED,
			issuer: 'Restvolt',
			algorithm: 'SHA1',
			digits: '6',
			period: '30'
		});
	});
});
