// Remembers, for a few seconds, the session and user rows a session id was found with, so a burst of
// requests from one browser does not read the sessions table once per request.
//
// A session that ends must stop working at once, whichever code ends it (sign-out, a password change
// or reset, removing a user, a manual delete). So the cache watches every statement this process
// sends: any DELETE, UPDATE or TRUNCATE on sessions or users empties it, and nothing is cached or
// answered from it until that statement's transaction has been committed or rolled back (plus a
// short margin for the commit itself). A read that began before such a statement is never stored.
// Another process writing to the database directly is only seen when the entries lapse (TTL_MS).
import type { Knex } from 'knex';

export const TTL_MS = 10_000;
// After a change is sent (or its transaction's COMMIT), lookups go to the database for this long.
const SETTLE_MS = 2_000;
// A transaction whose end was never seen stops holding the cache back after this long.
const PENDING_LIMIT_MS = 60_000;
const LIMIT = 10_000;

const CHANGES_SESSIONS = /^\s*(?:delete\s+from|update|truncate(?:\s+table)?)\s+(?:only\s+)?(?:"?public"?\.)?"?(?:sessions|users)"?(?:\s|;|$)/i;
const ENDS_TRANSACTION = /^\s*(?:commit|rollback|end)\b(?!\s+to\b)/i;

export interface SessionRow {
	userId: string;
	expiresAt: Date;
	email: string;
	name: string;
}

interface Entry extends SessionRow {
	storedAt: number;
}

interface QueryEvent {
	sql?: string;
	__knexTxId?: string;
}

export class SessionCache {
	private readonly entries = new Map<string, Entry>();
	/** Transactions that changed sessions or users and have not ended yet, with when they did. */
	private readonly pending = new Map<string, number>();
	private generation = 0;
	private settledAt = 0;
	private readonly watched = new WeakSet<object>();

	constructor(private readonly now: () => number = Date.now) {}

	/** Starts watching the statements a Knex instance sends (once per instance). */
	watch(knex: Knex) {
		if (this.watched.has(knex)) return;
		this.watched.add(knex);
		knex.on('query', (q: QueryEvent) => this.seen(q));
	}

	/** A statement on its way to the database. */
	seen(q: QueryEvent) {
		const sql = q.sql ?? '';
		if (CHANGES_SESSIONS.test(sql)) {
			this.forgetAll();
			if (q.__knexTxId) this.pending.set(q.__knexTxId, this.now());
		} else if (q.__knexTxId && this.pending.has(q.__knexTxId) && ENDS_TRANSACTION.test(sql)) {
			this.pending.delete(q.__knexTxId);
			this.forgetAll();
		}
	}

	private forgetAll() {
		this.entries.clear();
		this.generation++;
		this.settledAt = this.now() + SETTLE_MS;
	}

	private unsettled(): boolean {
		const now = this.now();
		for (const [tx, since] of this.pending) if (now - since > PENDING_LIMIT_MS) this.pending.delete(tx);
		return this.pending.size > 0 || now < this.settledAt;
	}

	/** The rows for a session key, read through `read` unless a fresh copy is at hand. */
	async get(key: string, read: () => Promise<SessionRow | null>): Promise<SessionRow | null> {
		const hit = this.entries.get(key);
		if (hit) {
			if (this.now() - hit.storedAt < TTL_MS && !this.unsettled()) return { userId: hit.userId, expiresAt: hit.expiresAt, email: hit.email, name: hit.name };
			this.entries.delete(key);
		}
		const generation = this.generation;
		const cacheable = !this.unsettled();
		const row = await read();
		if (row && cacheable && generation === this.generation && !this.unsettled()) {
			if (this.entries.size >= LIMIT) this.entries.delete(this.entries.keys().next().value as string);
			this.entries.set(key, { ...row, storedAt: this.now() });
		}
		return row;
	}

	/** Lucia moved the session's expiry: later hits must see the new one. */
	expiryMoved(key: string, expiresAt: Date) {
		const hit = this.entries.get(key);
		if (hit) hit.expiresAt = expiresAt;
	}

	forget(key: string) {
		this.entries.delete(key);
		this.generation++;
	}

	forgetUser(userId: string) {
		for (const [key, e] of this.entries) if (e.userId === userId) this.entries.delete(key);
		this.generation++;
	}

	get size() {
		return this.entries.size;
	}
}
