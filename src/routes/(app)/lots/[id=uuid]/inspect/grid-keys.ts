// Arrow keys in the readings grid: up and down move between rows, left and right between the fields
// of a row (in a text field only from its first or last character, so the caret still moves inside).
// Rows carry data-nav-row, the elements that take focus in them data-nav-cell.

function caretAtEdge(el: HTMLElement, side: 'start' | 'end'): boolean {
	if (!(el instanceof HTMLInputElement)) return true;
	const { selectionStart, selectionEnd, value } = el;
	if (selectionStart === null || selectionStart !== selectionEnd) return false;
	return side === 'start' ? selectionStart === 0 : selectionStart === value.length;
}

function cellsOf(row: Element): HTMLElement[] {
	return [...row.querySelectorAll<HTMLElement>('[data-nav-cell]')].filter((el) => !(el as HTMLInputElement).disabled);
}

/** Move the focus for an arrow key pressed in the grid; true when it moved (the key is then consumed). */
export function moveInGrid(e: KeyboardEvent, grid: HTMLElement): boolean {
	const el = e.target as HTMLElement;
	const row = el.closest('[data-nav-row]');
	if (!row || e.altKey || e.ctrlKey || e.metaKey || e.shiftKey) return false;
	const rows = [...grid.querySelectorAll('[data-nav-row]')].filter((r) => cellsOf(r).length > 0);
	const cells = cellsOf(row);
	const r = rows.indexOf(row);
	const c = Math.max(0, cells.indexOf(el));
	let target: HTMLElement | undefined;
	if (e.key === 'ArrowDown' || e.key === 'ArrowUp') {
		const next = rows[r + (e.key === 'ArrowDown' ? 1 : -1)];
		if (next) {
			const nextCells = cellsOf(next);
			target = nextCells[Math.min(c, nextCells.length - 1)];
		}
	} else if (e.key === 'ArrowLeft' && caretAtEdge(el, 'start')) target = cells[c - 1];
	else if (e.key === 'ArrowRight' && caretAtEdge(el, 'end')) target = cells[c + 1];
	if (!target) return false;
	target.focus();
	return true;
}
