// Tailwind classes per tone of src/lib/status.ts, written out whole so Tailwind finds them.
// The colours themselves are the @theme tokens in src/app.css.
import type { Tone } from '$lib/status';

/** Coloured text for a word with its shape. */
export const TONE_TEXT: Record<Tone, string> = {
	accept: 'text-status-accept',
	hold: 'text-status-hold',
	reject: 'text-status-reject',
	pending: 'text-status-pending',
	info: 'text-status-info',
	muted: 'text-ink-muted'
};

/** A pill: coloured text and edge on a faint wash of the same colour. */
export const TONE_PILL: Record<Tone, string> = {
	accept: 'text-status-accept border-status-accept/50 bg-status-accept/5',
	hold: 'text-status-hold border-status-hold/50 bg-status-hold/5',
	reject: 'text-status-reject border-status-reject/50 bg-status-reject/5',
	pending: 'text-status-pending border-status-pending/50 bg-status-pending/5',
	info: 'text-status-info border-status-info/50 bg-status-info/5',
	muted: 'text-ink-muted border-line bg-paper'
};
