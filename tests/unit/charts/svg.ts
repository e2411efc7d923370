// Tiny reader for server-rendered SVG markup, enough to assert on elements, attributes and text.

export interface SvgElement {
	tag: string;
	attrs: Record<string, string>;
	/** text of a <title> that directly follows the opening tag (marker tooltips) */
	title?: string;
}

const ENTITIES: Record<string, string> = { '&amp;': '&', '&lt;': '<', '&gt;': '>', '&quot;': '"', '&#39;': "'" };
// No-break spaces (between a number and its unit) become plain spaces so tests read naturally.
const decode = (text: string) => text.replace(/&(amp|lt|gt|quot|#39);/g, (m) => ENTITIES[m]).replace(/\u00a0/g, ' ');

/** Drops Svelte's hydration comments so the markup reads like plain SVG. */
export function clean(markup: string): string {
	return markup.replace(/<!--[\s\S]*?-->/g, '');
}

export function elements(markup: string, tag?: string): SvgElement[] {
	const html = clean(markup);
	const found: SvgElement[] = [];
	const open = /<([a-zA-Z][\w:-]*)((?:\s+[\w:-]+(?:="[^"]*")?)*)\s*\/?>/g;
	for (const match of html.matchAll(open)) {
		if (tag && match[1] !== tag) continue;
		const attrs: Record<string, string> = {};
		for (const a of match[2].matchAll(/([\w:-]+)(?:="([^"]*)")?/g)) attrs[a[1]] = decode(a[2] ?? '');
		const rest = html.slice((match.index ?? 0) + match[0].length);
		const title = /^<title>([^<]*)<\/title>/.exec(rest)?.[1];
		found.push({ tag: match[1], attrs, title: title === undefined ? undefined : decode(title) });
	}
	return found;
}

/** Visible text: every <text> and <tspan> content, with no-break spaces made plain. */
export function texts(markup: string): string[] {
	const html = clean(markup);
	return [...html.matchAll(/<(text|tspan)\b[^>]*>([^<]*)/g)].map((m) => decode(m[2]).trim()).filter((t) => t.length > 0);
}

/** Markers that stand for data (they carry a tooltip); legend markers have none. */
export function dataMarkers(markup: string, shape?: string): SvgElement[] {
	return elements(markup).filter((e) => e.attrs['data-shape'] && e.title !== undefined && (!shape || e.attrs['data-shape'] === shape));
}

export const num = (value: string | undefined) => {
	const n = Number(value);
	if (!Number.isFinite(n)) throw new Error(`not a number: ${value}`);
	return n;
};

/** <text> elements with their attributes and direct text. */
export function textNodes(markup: string): Array<{ attrs: Record<string, string>; text: string }> {
	const html = clean(markup);
	return [...html.matchAll(/<text\b([^>]*)>([^<]*)/g)].map((m) => {
		const attrs: Record<string, string> = {};
		for (const a of m[1].matchAll(/([\w:-]+)="([^"]*)"/g)) attrs[a[1]] = decode(a[2]);
		return { attrs, text: decode(m[2]).trim() };
	});
}
