// A short-lived cache of rows that is emptied by any change to the tables they come from.
//
// It watches every statement this process sends through Knex: an INSERT, UPDATE, DELETE or TRUNCATE
// on a watched table empties it, and nothing is stored or answered from it until that statement's
// transaction has been committed or rolled back, plus a short margin for the commit itself. A read
// that began before such a statement is never stored. Changes committed by other processes arrive
// as database notices (change-listener.ts) and empty it too; while the app's listener is not
// connected, nothing is answered from any cache.
import type { Knex } from 'knex';

// After a change is sent (or its transaction's COMMIT), reads go to the database for this long.
const SETTLE_MS = 2_000;
// A transaction whose end was never seen stops holding the cache back after this long.
const PENDING_LIMIT_MS = 60_000;

const ENDS_TRANSACTION = /^\s*(?:commit|rollback|end)\b(?!\s+to\b)/i;

export interface QueryEvent {
	sql?: string;
	__knexTxId?: string;
}

export interface WatchedCacheOptions {
	/** Tables whose changes empty the cache. */
	tables: string[];
	/** Whether inserts count as changes (not for rows that can only be added, like new sessions). */
	inserts?: boolean;
	ttlMs: number;
	limit: number;
}

/** The statement pattern for changes to `tables`, wherever it stands in the statement. */
export function changePattern(tables: string[], inserts = true): RegExp {
	const verbs = ['delete\\s+from', 'update', 'truncate(?:\\s+table)?', ...(inserts ? ['insert\\s+into'] : [])].join('|');
	const names = tables.map((t) => t.replace(/[^a-z0-9_]/gi, '')).join('|');
	return new RegExp(`(?:^|[\\s(;])(?:${verbs})\\s+(?:only\\s+)?(?:"?public"?\\.)?"?(?:${names})"?(?=[\\s;(]|$)`, 'i');
}

interface Entry<T> {
	value: T;
	storedAt: number;
}

/** Whether other processes' changes reach this one: 'off' until a listener starts (scripts, tests). */
let crossProcess: 'off' | 'connected' | 'lost' = 'off';
const registry = new Set<WatchedCache<unknown>>();

/** The listener's state; 'lost' stops every cache from answering until it is 'connected' again. */
export function setCrossProcess(state: 'connected' | 'lost' | 'off') {
	crossProcess = state;
	for (const cache of registry) cache.forgetAll();
}

/** Another process committed a change to `table`: empty every cache built from it. */
export function changedElsewhere(table: string) {
	for (const cache of registry) if (cache.tables.includes(table)) cache.forgetAll();
}

export class WatchedCache<T> {
	protected readonly entries = new Map<string, Entry<T>>();
	private readonly pending = new Map<string, number>();
	private readonly changes: RegExp;
	private generation = 0;
	private settledAt = 0;
	private readonly watched = new WeakSet<object>();

	constructor(
		private readonly options: WatchedCacheOptions,
		private readonly now: () => number = Date.now
	) {
		this.changes = changePattern(options.tables, options.inserts ?? true);
		registry.add(this as WatchedCache<unknown>);
	}

	get tables(): readonly string[] {
		return this.options.tables;
	}

	/** Starts watching the statements a Knex instance sends (once per instance). */
	watch(knex: Knex) {
		if (this.watched.has(knex)) return;
		this.watched.add(knex);
		knex.on('query', (q: QueryEvent) => this.seen(q));
	}

	/** A statement on its way to the database. */
	seen(q: QueryEvent) {
		const sql = q.sql ?? '';
		if (this.changes.test(sql)) {
			this.forgetAll();
			if (q.__knexTxId) this.pending.set(q.__knexTxId, this.now());
		} else if (q.__knexTxId && this.pending.has(q.__knexTxId) && ENDS_TRANSACTION.test(sql)) {
			this.pending.delete(q.__knexTxId);
			this.forgetAll();
		}
	}

	forgetAll() {
		this.entries.clear();
		this.generation++;
		this.settledAt = this.now() + SETTLE_MS;
	}

	forget(key: string) {
		this.entries.delete(key);
		this.generation++;
	}

	protected forgetWhere(test: (value: T) => boolean) {
		for (const [key, e] of this.entries) if (test(e.value)) this.entries.delete(key);
		this.generation++;
	}

	private unsettled(): boolean {
		const now = this.now();
		for (const [tx, since] of this.pending) if (now - since > PENDING_LIMIT_MS) this.pending.delete(tx);
		return crossProcess === 'lost' || this.pending.size > 0 || now < this.settledAt;
	}

	/** The value for `key`, read through `read` unless a fresh copy is at hand. Nulls are not kept. */
	async get(key: string, read: () => Promise<T | null>): Promise<T | null> {
		const hit = this.entries.get(key);
		if (hit) {
			if (this.now() - hit.storedAt < this.options.ttlMs && !this.unsettled()) return hit.value;
			this.entries.delete(key);
		}
		const generation = this.generation;
		const cacheable = !this.unsettled();
		const value = await read();
		if (value !== null && cacheable && generation === this.generation && !this.unsettled()) {
			if (this.entries.size >= this.options.limit) this.entries.delete(this.entries.keys().next().value as string);
			this.entries.set(key, { value, storedAt: this.now() });
		}
		return value;
	}

	get size() {
		return this.entries.size;
	}
}
