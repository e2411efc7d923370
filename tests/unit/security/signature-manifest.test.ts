// The e-signature manifest (21 CFR Part 11, §11.50 and §11.70 style): canonical JSON and its
// SHA-256. The key order is RFC 8785 (JSON Canonicalization Scheme) §3.2.3's sorting example
// (from memory); the hash is checked against node:crypto over a canonical text written by hand.
import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { canonicalJson, contentHash, signatureManifest, type SignedContent } from '../../../src/lib/server/signature-manifest';

const signed: SignedContent = {
	lot_id: '0b7c1f2e-5d7a-4c57-9a43-2f8e1d6b9c10',
	lot_code: 'L-2031-0042',
	revision: 7,
	decision: 'accept',
	reason: 'UN 38.3 summary received “by mail”\nand checked',
	evaluation_id: 12
};

describe('canonicalJson', () => {
	it('sorts keys by UTF-16 code unit, as RFC 8785 §3.2.3 orders its example', () => {
		const input = { '\u20ac': 1, '\r': 2, '\ufb33': 3, '1': 4, '\ud83d\ude00': 5, '\u0080': 6, '\u00f6': 7 };
		// Read the order from the text: JSON.parse would move the integer-like key "1" first.
		const order = [...canonicalJson(input).matchAll(/"((?:[^"\\]|\\.)*)":/g)].map((m) => JSON.parse(`"${m[1]}"`));
		expect(order).toEqual(['\r', '1', '\u0080', '\u00f6', '\u20ac', '\ud83d\ude00', '\ufb33']);
	});

	it('writes no white space, nests, keeps arrays in order and leaves out undefined members', () => {
		expect(canonicalJson({ b: [3, { d: null, c: true }], a: 'x', u: undefined })).toBe('{"a":"x","b":[3,{"c":true,"d":null}]}');
		expect(canonicalJson({ b: 1, a: 2 })).toBe(canonicalJson({ a: 2, b: 1 }));
		expect(() => canonicalJson({ x: Number.NaN })).toThrow();
	});
});

describe('signature manifest', () => {
	it('hashes exactly the signed content, in its canonical form', () => {
		const byHand =
			'{"decision":"accept","evaluation_id":12,"lot_code":"L-2031-0042","lot_id":"0b7c1f2e-5d7a-4c57-9a43-2f8e1d6b9c10",' +
			'"reason":"UN 38.3 summary received “by mail”\\nand checked","revision":7}';
		expect(canonicalJson(signed)).toBe(byHand);
		expect(contentHash(signed)).toBe(createHash('sha256').update(byHand, 'utf8').digest('hex'));
		expect(contentHash({ ...signed, revision: 8 })).not.toBe(contentHash(signed));
		expect(contentHash({ ...signed, decision: 'reject' })).not.toBe(contentHash(signed));
	});

	it('records signer, meaning, time, challenge and the hash (§11.50: name, date and time, meaning)', () => {
		const at = new Date('2031-05-14T09:30:00.000Z');
		const m = signatureManifest({ id: 'u-7', name: 'Ines Quality', email: 'quality@kestrel-mobility.example' }, signed, 'c-1', at);
		expect(m).toMatchObject({
			signer_id: 'u-7',
			signer_name: 'Ines Quality',
			signer_email: 'quality@kestrel-mobility.example',
			meaning: 'release of a held lot',
			signed_at: '2031-05-14T09:30:00.000Z',
			challenge_id: 'c-1',
			signed,
			hash_algorithm: 'SHA-256',
			content_sha256: contentHash(signed)
		});
		expect(signatureManifest({ id: 'u-7', name: null, email: 'q@x.example' }, { ...signed, decision: 'reject' }, 'c-2', at).meaning).toBe(
			'rejection of a held lot'
		);
	});
});
