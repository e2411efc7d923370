// Colours resolve from the app's CSS custom properties, with fallbacks so a chart
// rendered on its own (server HTML, printout, PDF) keeps the same look.
export const colors = {
	accent: 'var(--rv-accent, #0f766e)',
	danger: 'var(--rv-danger, #b42318)',
	warn: 'var(--rv-warn, #b54708)',
	ok: 'var(--rv-ok, #2e7d32)',
	ink: 'currentColor',
	muted: 'var(--rv-muted, #667085)',
	grid: 'var(--rv-grid, #e4e0d6)',
	panel: 'var(--rv-panel, #ffffff)'
} as const;

export const FONT_SIZE = 12;
export const SMALL_FONT_SIZE = 11;

/** Light outline behind text that sits over data, so it stays legible. */
export const halo = `paint-order: stroke; stroke: ${colors.panel}; stroke-width: 3px; stroke-linejoin: round`;
