// Batched, debounced saves of the grid's edits, and the 409 conflicts they meet. Nothing is
// lost silently: a failed save stays queued for retry; a conflict keeps the user's values to re-apply.
import type { PlantingField } from '$lib/schemas/planting';
import type { PlantingView } from '$lib/types';
import type {
	ApiErrorAnswer,
	PlantingConflictAnswer,
	PlantingSavedAnswer,
	PlantingsCreatedAnswer
} from '$lib/api-answers';
import type { GridRow, RowValues } from './rows';

/** What the save queue needs of the grid's rows: read one, and take the server's answers back. */
export interface SavedRows {
	row(key: string): GridRow | undefined;
	acceptServer(key: string, p: PlantingView, keepValues: boolean): void;
	replaceRows(updated: GridRow[]): void;
	applyChanges(list: { key: string; field: PlantingField; value: unknown }[]): unknown;
}

export interface ApiAnswer {
	status: number;
	/** Parsed JSON: one of the answers in $lib/api-answers, by status. */
	body: unknown;
}

/** The JSON routes, behind an interface so the unit tests can stand in for the server. */
export interface GridApi {
	patch(id: number, body: Record<string, unknown>): Promise<ApiAnswer>;
	create(seasonId: number, rows: Record<string, unknown>[]): Promise<ApiAnswer>;
	remove(id: number): Promise<ApiAnswer>;
}

export interface Conflict {
	key: string;
	/** Who saved first, and the row as they left it. */
	changedBy: string | null;
	current: PlantingView;
	/** The user's edit that did not go through, kept to re-apply. */
	mine: Partial<Record<PlantingField, unknown>>;
}

export type SaveStatus = 'idle' | 'pending' | 'saving' | 'saved' | 'failed';

export function fetchApi(fetcher: typeof fetch = fetch): GridApi {
	const call = async (url: string, method: string, body?: unknown): Promise<ApiAnswer> => {
		const res = await fetcher(url, {
			method,
			headers: { 'content-type': 'application/json', accept: 'application/json' },
			body: body === undefined ? undefined : JSON.stringify(body)
		});
		const text = await res.text();
		let parsed: unknown;
		try {
			parsed = text ? JSON.parse(text) : null;
		} catch {
			parsed = { message: text };
		}
		return { status: res.status, body: parsed };
	};
	return {
		patch: (id, body) => call(`/api/plantings/${id}`, 'PATCH', body),
		create: (seasonId, rows) => call(`/api/seasons/${seasonId}/plantings`, 'POST', { plantings: rows }),
		remove: (id) => call(`/api/plantings/${id}`, 'DELETE')
	};
}

function createBody(v: RowValues): Record<string, unknown> {
	return { ...v };
}

export class SaveQueue {
	status = $state<SaveStatus>('idle');
	error = $state<string>('');
	conflicts = $state.raw<Conflict[]>([]);
	/** How many rows wait to be saved (dirty, new or removed). */
	pending = $state(0);
	/** Rounds begun so far: a reload asked before the latest round began may predate its writes. */
	rounds = 0;

	private dirty = new Map<string, Set<PlantingField>>();
	private fresh = new Set<string>();
	private removed = new Map<string, GridRow>();
	private timer: ReturnType<typeof setTimeout> | null = null;
	private running: Promise<void> | null = null;
	private again = false;
	/** Edits made while a request was in flight: those fields stay dirty. */
	private touched = new Map<string, Set<PlantingField>>();

	constructor(
		private grid: SavedRows,
		private api: GridApi,
		private seasonId: number,
		private debounceMs: number,
		/** Told after a round wrote something (the page reloads the plan's data through its load). */
		private onWrote: () => void = () => {}
	) {}

	get unsaved(): boolean {
		return this.pending > 0 || this.running !== null;
	}

	private count(): void {
		this.pending = this.dirty.size + this.fresh.size + this.removed.size;
		if (this.pending > 0 && this.status !== 'saving' && this.status !== 'failed') this.status = 'pending';
	}

	markDirty(key: string, field: PlantingField): void {
		if (!this.fresh.has(key)) {
			const s = this.dirty.get(key) ?? new Set();
			s.add(field);
			this.dirty.set(key, s);
		}
		if (this.running) {
			const t = this.touched.get(key) ?? new Set();
			t.add(field);
			this.touched.set(key, t);
		}
		this.count();
		this.schedule();
	}

	markNew(key: string): void {
		this.fresh.add(key);
		this.count();
		this.schedule();
	}

	markRemoved(row: GridRow): void {
		this.dirty.delete(row.key);
		// A row the server never saw just stops being sent.
		if (this.fresh.delete(row.key)) return this.count();
		if (row.id !== null) this.removed.set(row.key, row);
		this.count();
		this.schedule();
	}

	private schedule(): void {
		if (this.timer) clearTimeout(this.timer);
		this.timer = setTimeout(() => {
			this.timer = null;
			void this.flush();
		}, this.debounceMs);
	}

	/** Sends everything queued now; resolves when it and any follow-up round are done. */
	async flush(): Promise<void> {
		if (this.timer) {
			clearTimeout(this.timer);
			this.timer = null;
		}
		if (this.running) {
			this.again = true;
			return this.running;
		}
		this.running = this.round().finally(() => {
			this.running = null;
			this.touched.clear();
		});
		await this.running;
		if (this.again) {
			this.again = false;
			await this.flush();
		}
	}

	retry(): Promise<void> {
		this.status = 'pending';
		this.error = '';
		return this.flush();
	}

	private async round(): Promise<void> {
		const dirty = [...this.dirty];
		const fresh = [...this.fresh];
		const removed = [...this.removed];
		if (!dirty.length && !fresh.length && !removed.length) return;
		this.dirty.clear();
		this.fresh.clear();
		this.removed.clear();
		this.rounds++;
		this.status = 'saving';
		const failures: string[] = [];
		let wrote = 0;
		const requeue = (fn: () => void, why: string): void => {
			fn();
			failures.push(why);
		};

		// New rows go in one POST (a paste of 200 rows is one request, one transaction).
		const freshRows = fresh.map((k) => this.grid.row(k)).filter((r): r is GridRow => !!r && r.id === null);
		const tasks: Promise<void>[] = [];
		if (freshRows.length) {
			tasks.push(
				this.api
					.create(
						this.seasonId,
						freshRows.map((r) => createBody(r.values))
					)
					.then(
						(a) => {
							if (a.status === 201) {
								wrote++;
								(a.body as PlantingsCreatedAnswer).plantings.forEach((p, i) => {
									const key = freshRows[i].key;
									const later = this.touched.get(key);
									this.grid.acceptServer(key, p, !!later?.size);
									// Fields edited while the POST was in flight are sent next round as a PATCH.
									if (later?.size) this.dirty.set(key, new Set(later));
								});
							} else {
								for (const r of freshRows) this.fresh.add(r.key);
								requeue(() => this.setErrors(freshRows, a), messageOf(a));
							}
						},
						(e) => requeue(() => freshRows.forEach((r) => this.fresh.add(r.key)), String(e))
					)
			);
		}
		for (const [key, fields] of dirty) {
			const row = this.grid.row(key);
			if (!row || row.id === null) continue;
			const body: Record<string, unknown> = { version: row.version };
			for (const f of fields) body[f] = row.values[f];
			tasks.push(
				this.api.patch(row.id, body).then(
					(a) => {
						if (a.status === 200) wrote++;
						this.patched(key, fields, body, a, failures);
					},
					(e) => requeue(() => this.mergeDirty(key, fields), String(e))
				)
			);
		}
		for (const [key, row] of removed) {
			tasks.push(
				this.api.remove(row.id!).then(
					(a) => {
						if (a.status === 204) wrote++;
						else if (a.status !== 404) requeue(() => this.removed.set(key, row), messageOf(a));
					},
					(e) => requeue(() => this.removed.set(key, row), String(e))
				)
			);
		}
		await Promise.all(tasks);
		this.count();
		// Even a round that partly failed changed the saved plan: whatever was written is news.
		if (wrote > 0) this.onWrote();
		if (failures.length) {
			this.status = 'failed';
			this.error = failures[0];
		} else {
			this.status = this.pending > 0 ? 'pending' : 'saved';
			this.error = '';
		}
	}

	private patched(
		key: string,
		fields: Set<PlantingField>,
		body: Record<string, unknown>,
		a: ApiAnswer,
		failures: string[]
	): void {
		const later = this.touched.get(key);
		if (a.status === 200) {
			this.grid.acceptServer(key, (a.body as PlantingSavedAnswer).planting, !!later?.size);
			if (later?.size) this.mergeDirty(key, later);
			return;
		}
		if (a.status === 409) {
			const body409 = a.body as PlantingConflictAnswer;
			const mine: Partial<Record<PlantingField, unknown>> = {};
			for (const f of fields) mine[f] = body[f];
			this.conflicts = [
				...this.conflicts.filter((c) => c.key !== key),
				{ key, changedBy: body409.changedBy ?? null, current: body409.current, mine }
			];
			// The server's row wins on screen; the user's values wait in the conflict to re-apply.
			this.grid.acceptServer(key, body409.current, false);
			failures.push(body409.message ?? 'Someone else saved this planting first.');
			return;
		}
		if (a.status === 400 || a.status === 403) {
			const row = this.grid.row(key);
			if (row) this.setErrors([row], a);
			failures.push(messageOf(a));
			return;
		}
		this.mergeDirty(key, fields);
		failures.push(messageOf(a));
	}

	private mergeDirty(key: string, fields: Set<PlantingField>): void {
		const s = this.dirty.get(key) ?? new Set();
		for (const f of fields) s.add(f);
		this.dirty.set(key, s);
	}

	/** The server's field errors shown in their cells ("plantings.3.fieldDate" or "fieldDate"). */
	private setErrors(rows: GridRow[], a: ApiAnswer): void {
		const errors = errorAnswer(a)?.errors ?? {};
		const updated = rows.map((row, i) => {
			const e = { ...row.errors };
			for (const [path, message] of Object.entries(errors)) {
				const parts = path.split('.');
				const field = (parts[0] === 'plantings' ? (Number(parts[1]) === i ? parts[2] : undefined) : parts[0]) as
					PlantingField | undefined;
				if (field && field in row.values) e[field] = { text: String(row.values[field] ?? ''), message };
			}
			return { ...row, errors: e };
		});
		this.grid.replaceRows(updated);
	}

	/** Re-applies the user's edit on top of the version that won (a new undo step, saved again). */
	reapply(key: string): void {
		const c = this.conflicts.find((x) => x.key === key);
		if (!c) return;
		this.conflicts = this.conflicts.filter((x) => x.key !== key);
		this.grid.applyChanges(
			Object.entries(c.mine).map(([field, value]) => ({ key, field: field as PlantingField, value }))
		);
	}

	dismiss(key: string): void {
		this.conflicts = this.conflicts.filter((x) => x.key !== key);
		if (!this.conflicts.length && this.status === 'failed' && this.pending === 0) this.status = 'saved';
	}
}

function errorAnswer(a: ApiAnswer): Partial<ApiErrorAnswer> | null {
	return a.body && typeof a.body === 'object' ? (a.body as Partial<ApiErrorAnswer>) : null;
}

function messageOf(a: ApiAnswer): string {
	const m = errorAnswer(a)?.message;
	return (typeof m === 'string' ? m : '') || `The server answered ${a.status}.`;
}
