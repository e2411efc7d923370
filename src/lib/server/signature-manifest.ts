/**
 * The manifest stored with an e-signed quality decision, after 21 CFR Part 11, §11.50 and §11.70:
 * the signed record shows the signer's printed name, the date and time of signing and the meaning
 * of the signature (§11.50), and the signature is linked to its record so that it cannot be
 * excised, copied or transferred to falsify another record (§11.70). The link is a SHA-256 hash of
 * a canonical JSON of exactly what was signed (lot, its revision, decision, reason, evaluation),
 * which anyone can recompute from the stored `signed` object.
 */
import { createHash } from 'node:crypto';

/** What the quality manager signs. The lot revision pins the lot as it was reviewed. */
export interface SignedContent {
	lot_id: string;
	lot_code: string;
	revision: number;
	decision: 'accept' | 'reject';
	reason: string;
	evaluation_id: number | null;
}

export interface SignatureManifest {
	signer_id: string;
	signer_name: string | null;
	signer_email: string;
	meaning: string;
	signed_at: string;
	method: 'password re-entered';
	challenge_id: string;
	signed: SignedContent;
	hash_algorithm: 'SHA-256';
	canonicalization: 'JSON, keys sorted by code unit, no white space (RFC 8785 style)';
	content_sha256: string;
	// Repeated at the top level for readers of the older manifest shape.
	decision: SignedContent['decision'];
	reason: string;
	evaluation_id: number | null;
}

/**
 * JSON with object keys sorted by UTF-16 code unit and no white space, the serialization of
 * RFC 8785 (JCS) for the values a manifest holds (strings, integers, booleans, null, arrays,
 * plain objects). Undefined members are left out, as JSON.stringify does.
 */
export function canonicalJson(value: unknown): string {
	if (typeof value === 'number' && !Number.isFinite(value)) throw new Error('canonical JSON has no NaN or Infinity');
	if (value === null || typeof value !== 'object') return JSON.stringify(value);
	if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
	const record = value as Record<string, unknown>;
	const members = Object.keys(record)
		.filter((key) => record[key] !== undefined)
		.sort()
		.map((key) => `${JSON.stringify(key)}:${canonicalJson(record[key])}`);
	return `{${members.join(',')}}`;
}

export const contentHash = (signed: SignedContent) => createHash('sha256').update(canonicalJson(signed), 'utf8').digest('hex');

export const MEANING = { accept: 'release of a held lot', reject: 'rejection of a held lot' } as const;

export function signatureManifest(
	signer: { id: string; name: string | null; email: string },
	signed: SignedContent,
	challengeId: string,
	signedAt: Date
): SignatureManifest {
	return {
		signer_id: signer.id,
		signer_name: signer.name,
		signer_email: signer.email,
		meaning: MEANING[signed.decision],
		signed_at: signedAt.toISOString(),
		method: 'password re-entered',
		challenge_id: challengeId,
		signed,
		hash_algorithm: 'SHA-256',
		canonicalization: 'JSON, keys sorted by code unit, no white space (RFC 8785 style)',
		content_sha256: contentHash(signed),
		decision: signed.decision,
		reason: signed.reason,
		evaluation_id: signed.evaluation_id
	};
}
