// Rows typed on the bench, saved through POST /api/v1/lots/{id}/readings. Nothing typed is lost:
// unsaved rows live in component state AND localStorage (keyed by lot) and are retried with backoff.
// Each row carries a client_key (crypto.randomUUID), so a retry after a lost answer never duplicates.

export type RowState = 'saving' | 'retrying' | 'saved' | 'refused';

export interface BenchRow {
	client_key: string;
	serial: string;
	ocv_v: number;
	temperature_c: number;
	ac_resistance_mohm: number | null;
	/** The inspector confirmed an OCV the entry guard found implausible. */
	confirmed?: boolean;
	measured_at: string;
	state: RowState;
	message?: string;
	/** The stored reading's id, once the server has answered with it (lets the row be corrected). */
	id?: number;
}

const storageKey = (lotId: string) => `restvolt:bench:${lotId}`;
const BACKOFF_MS = [1000, 2000, 4000, 8000, 15000, 30000];

export class SaveQueue {
	rows = $state<BenchRow[]>([]);
	attempt = $state(0);
	nextRetryAt = $state<number | null>(null);
	lotMessage = $state<string | null>(null);
	#timer: ReturnType<typeof setTimeout> | null = null;
	#inFlight = false;

	constructor(
		private readonly lotId: string,
		private readonly onSaved: () => void
	) {}

	get unsaved() {
		return this.rows.filter((r) => r.state === 'saving' || r.state === 'retrying');
	}

	/** Rows left unsaved by an earlier visit (closed tab, lost network) come back and are retried. */
	restore(): void {
		try {
			const stored = JSON.parse(localStorage.getItem(storageKey(this.lotId)) ?? '[]') as BenchRow[];
			if (stored.length > 0) {
				this.rows = [...this.rows, ...stored.map((r) => ({ ...r, state: 'retrying' as const }))];
				this.flush();
			}
		} catch {
			localStorage.removeItem(storageKey(this.lotId));
		}
	}

	add(row: Omit<BenchRow, 'client_key' | 'state' | 'measured_at'>): void {
		// eslint-disable-next-line svelte/prefer-svelte-reactivity -- a local value, not reactive state
		this.rows = [...this.rows, { ...row, client_key: crypto.randomUUID(), measured_at: new Date().toISOString(), state: 'saving' }];
		this.#persist();
		this.flush();
	}

	#persist(): void {
		const pending = this.rows.filter((r) => r.state === 'saving' || r.state === 'retrying');
		if (pending.length === 0) localStorage.removeItem(storageKey(this.lotId));
		else localStorage.setItem(storageKey(this.lotId), JSON.stringify(pending));
	}

	#mark(keys: Set<string>, state: RowState, message?: string): void {
		this.rows = this.rows.map((r) => (keys.has(r.client_key) ? { ...r, state, message } : r));
		this.#persist();
	}

	/** The ids the server gave the saved rows (201 body `stored: [{client_key, id}]`). */
	#noteIds(body: { stored?: Array<{ client_key: string; id: number }> } | null): void {
		// eslint-disable-next-line svelte/prefer-svelte-reactivity -- a local value, not reactive state
		const ids = new Map((body?.stored ?? []).map((s) => [s.client_key, s.id]));
		if (ids.size > 0) this.rows = this.rows.map((r) => (ids.has(r.client_key) ? { ...r, id: ids.get(r.client_key) } : r));
	}

	#scheduleRetry(): void {
		const delay = BACKOFF_MS[Math.min(this.attempt, BACKOFF_MS.length - 1)];
		this.attempt += 1;
		this.nextRetryAt = Date.now() + delay;
		if (this.#timer) clearTimeout(this.#timer);
		this.#timer = setTimeout(() => this.flush(), delay);
	}

	/** Send every unsaved row in one all-or-nothing batch. */
	async flush(): Promise<void> {
		if (this.#inFlight) return;
		const batch = this.unsaved;
		if (batch.length === 0) return;
		this.#inFlight = true;
		// eslint-disable-next-line svelte/prefer-svelte-reactivity -- a local value, not reactive state
		const keys = new Set(batch.map((r) => r.client_key));
		try {
			const res = await fetch(`/api/v1/lots/${this.lotId}/readings`, {
				method: 'POST',
				headers: { 'content-type': 'application/json' },
				body: JSON.stringify({
					readings: batch.map(({ serial, ocv_v, temperature_c, ac_resistance_mohm, confirmed, measured_at, client_key }) => ({
						confirmed: confirmed ?? false,
						serial,
						ocv_v,
						temperature_c,
						ac_resistance_mohm,
						measured_at,
						client_key
					}))
				})
			});
			if (res.ok) {
				this.attempt = 0;
				this.nextRetryAt = null;
				this.#mark(keys, 'saved');
				this.#noteIds(await res.json().catch(() => null));
				this.onSaved();
			} else if (res.status >= 500 || res.status === 429) {
				this.#mark(keys, 'retrying');
				this.#scheduleRetry();
			} else {
				const body = await res.json().catch(() => null);
				const message = body?.error?.message ?? `refused (${res.status})`;
				if (res.status === 409) this.lotMessage = message;
				this.#mark(keys, 'refused', message);
			}
		} catch {
			this.#mark(keys, 'retrying');
			this.#scheduleRetry();
		} finally {
			this.#inFlight = false;
		}
		// Rows typed while the request was in flight go next.
		if (this.unsaved.some((r) => r.state === 'saving')) this.flush();
	}

	/** A refused row leaves the queue; its values return to the entry row for fixing. */
	discard(key: string): void {
		this.rows = this.rows.filter((r) => r.client_key !== key);
		this.#persist();
	}

	dispose(): void {
		if (this.#timer) clearTimeout(this.#timer);
	}
}
