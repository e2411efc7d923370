import { pairColumns, type Pair } from './blocks';
import { dateTime, MISSING } from '$lib/format';
import { sectionTitle, type Cursor } from './layout';
import type { ReportData } from './types';

/** Hex digits of the content hash printed; enough to compare against a recomputation by eye. */
export const HASH_PREFIX_LENGTH = 16;

/**
 * The e-signature manifest of a quality override, as the signed record must show it: the signer's
 * name, the date and time and the meaning of the signature (21 CFR Part 11, §11.50), and the hash
 * that links it to what was signed (§11.70). Nothing is drawn for the engine's own decisions.
 */
export function drawSignature(cursor: Cursor, data: ReportData): void {
	const signature = data.decision?.kind === 'override' ? data.decision.signature : null;
	if (!signature) return;
	sectionTitle(cursor, 'Electronic signature of the quality decision', 50);
	const left: Pair[] = [
		['Signed by', signature.signer],
		['Meaning', signature.meaning],
		['Signed at', dateTime(signature.signed_at)]
	];
	const right: Pair[] = [
		['Lot revision', signature.revision === null ? MISSING : String(signature.revision)],
		['Content SHA-256', signature.content_sha256 ? `${signature.content_sha256.slice(0, HASH_PREFIX_LENGTH)}…` : MISSING],
		['Challenge', signature.challenge_id ? `${signature.challenge_id.slice(0, 8)}…` : MISSING]
	];
	pairColumns(cursor, left, right);
}
