/** Shapes that carry meaning on their own, so no chart relies on colour alone. */
export type MarkerShape = 'dot' | 'ring' | 'cross' | 'diamond' | 'square' | 'triangle';

/** A positioned tick: `pos` is in SVG user units along the axis. */
export interface Tick {
	value: number;
	pos: number;
	label: string;
}

interface LegendBase {
	label: string;
	color: string;
}

export type LegendItem = LegendBase &
	(
		| { kind: 'marker'; shape: MarkerShape }
		| { kind: 'line'; dash?: string; strokeWidth?: number }
		| { kind: 'swatch'; fill: string; dash?: string }
		| { kind: 'interval'; hollow: boolean; dash?: string }
	);

/** A label pinned to a reference line; `y` is the line, `labelY` where the text ends up. */
export interface LineLabel {
	key: string;
	y: number;
	lines: string[];
	color: string;
}
