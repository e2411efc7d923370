// Chart colours are the app's design tokens: the CSS variables that Tailwind's @theme defines in
// src/app.css (emitted always, as `@theme static`), so a chart and the page around it never disagree.
export const colors = {
	accent: 'var(--color-volt-600)',
	danger: 'var(--color-status-reject)',
	warn: 'var(--color-status-hold)',
	ok: 'var(--color-status-accept)',
	ink: 'currentColor',
	muted: 'var(--color-ink-muted)',
	grid: 'var(--color-line-faint)',
	panel: 'var(--color-panel)',
	/** The acceptance window behind the readings: the accent, faint. */
	windowFill: 'color-mix(in srgb, var(--color-volt-600) 9%, transparent)'
} as const;

export const FONT_SIZE = 12;
export const SMALL_FONT_SIZE = 11;

/** Light outline behind text that sits over data, so it stays legible. */
export const halo = `paint-order: stroke; stroke: ${colors.panel}; stroke-width: 3px; stroke-linejoin: round`;
