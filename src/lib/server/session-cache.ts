// Remembers, for a few seconds, the session and user rows a session id was found with, so a burst of
// requests from one browser does not read the sessions table once per request.
//
// A session that ends must stop working at once, whichever code ends it (sign-out, a password change
// or reset, removing a user, a manual delete): any DELETE, UPDATE or TRUNCATE on sessions or users
// empties the cache and holds it back until that transaction ends (see watched-cache.ts); a change
// another process commits empties it when the database's notice arrives (change-listener.ts).
import { WatchedCache } from './watched-cache';

export const TTL_MS = 10_000;

export interface SessionRow {
	userId: string;
	expiresAt: Date;
	email: string;
	name: string;
}

export class SessionCache extends WatchedCache<SessionRow> {
	// A new session cannot change one already kept, so inserts do not count.
	constructor(now: () => number = Date.now) {
		super({ tables: ['sessions', 'users'], inserts: false, ttlMs: TTL_MS, limit: 10_000 }, now);
	}

	/** Lucia moved the session's expiry: later hits must see the new one. */
	expiryMoved(key: string, expiresAt: Date) {
		const hit = this.entries.get(key);
		if (hit) hit.value = { ...hit.value, expiresAt };
	}

	forgetUser(userId: string) {
		this.forgetWhere((row) => row.userId === userId);
	}
}
