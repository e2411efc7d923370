/**
 * Keyset pages have no page numbers: "next" carries the server's cursor, and the cursors already
 * visited travel in `trail` (dot-separated; base64url never contains a dot) so "previous" works.
 */
export interface ListFilters {
	status: string;
	supplier_id: string;
	search: string;
	limit: number;
	cursor: string;
	trail: string;
}

const FIRST = '~';

function href(filters: ListFilters, cursor: string, trail: string): string {
	const params = new URLSearchParams();
	if (filters.status) params.set('status', filters.status);
	if (filters.supplier_id) params.set('supplier_id', filters.supplier_id);
	if (filters.search) params.set('search', filters.search);
	if (filters.limit !== 25) params.set('limit', String(filters.limit));
	if (cursor) params.set('cursor', cursor);
	if (trail) params.set('trail', trail);
	const query = params.toString();
	return query ? `/lots?${query}` : '/lots';
}

export function nextPageHref(filters: ListFilters, nextCursor: string): string {
	const trail = [filters.trail, filters.cursor || FIRST].filter(Boolean).join('.');
	return href(filters, nextCursor, trail);
}

export function previousPageHref(filters: ListFilters): string | null {
	if (!filters.cursor) return null;
	const steps = filters.trail ? filters.trail.split('.') : [];
	const previous = steps.pop();
	return href(filters, previous && previous !== FIRST ? previous : '', steps.join('.'));
}

export function pageNumber(filters: ListFilters): number {
	return filters.cursor ? (filters.trail ? filters.trail.split('.').length : 0) + 1 : 1;
}
