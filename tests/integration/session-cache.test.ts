import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { endAllSessions, endSession, lucia } from '$lib/server/auth';
import { db } from '$lib/server/db';
import { changePassword } from '$lib/server/users';
import { completePasswordReset, createPasswordReset } from '$lib/server/password-reset';
import { SessionCache, TTL_MS } from '$lib/server/session-cache';
import { makeUser } from './helpers';

// Session rows are kept for a few seconds so a burst of requests does not read them each time; a
// session that ends must stop working on the very next request, whichever code ended it.

let sql: string[] = [];
const onQuery = (q: { sql: string }) => sql.push(q.sql);
beforeEach(() => void db().on('query', onQuery));
afterEach(() => void db().removeListener('query', onQuery));

async function validate(sessionId: string) {
	sql = [];
	const { session, user } = await lucia.validateSession(sessionId);
	return { session, user, queries: sql.length };
}

/** Validates until an answer comes from the cache (no SQL), so each test starts from a cached session. */
async function cached(sessionId: string) {
	for (let i = 0; i < 40; i++) {
		const v = await validate(sessionId);
		expect(v.user).not.toBeNull();
		if (v.queries === 0) return v;
		await new Promise((r) => setTimeout(r, 100)); // a change elsewhere holds the cache back briefly
	}
	throw new Error('the session was never answered from the cache');
}

describe('session lookups kept briefly', () => {
	it('a repeat lookup reads nothing and answers the same user', async () => {
		const user = await makeUser('repeat');
		const session = await lucia.createSession(user.id, {});
		const first = await validate(session.id);
		expect(first.user).toMatchObject({ id: user.id, email: user.email, name: user.name });
		const again = await cached(session.id);
		expect(again.user).toMatchObject({ id: user.id, email: user.email, name: user.name });
		expect(again.session?.expiresAt.getTime()).toBe(first.session?.expiresAt.getTime());
	});

	it('signing out ends the session at once', async () => {
		const user = await makeUser('signout');
		const session = await lucia.createSession(user.id, {});
		await cached(session.id);
		await endSession(session.id);
		const after = await validate(session.id);
		expect(after.user).toBeNull();
		expect(after.queries).toBe(1);
	});

	it('ending all sessions of a user ends each of them, and leaves another user signed in', async () => {
		const [user, other] = [await makeUser('all'), await makeUser('bystander')];
		const [a, b, c] = [await lucia.createSession(user.id, {}), await lucia.createSession(user.id, {}), await lucia.createSession(other.id, {})];
		await cached(a.id);
		await cached(b.id);
		await endAllSessions(user.id);
		expect((await validate(a.id)).user).toBeNull();
		expect((await validate(b.id)).user).toBeNull();
		expect((await validate(c.id)).user?.id).toBe(other.id);
	});

	it('a password change ends the old sessions at once', async () => {
		const user = await makeUser('change', 'old password 123');
		const session = await lucia.createSession(user.id, {});
		await cached(session.id);
		expect(await changePassword(user.id, 'old password 123', 'new password 456')).toBe(true);
		expect((await validate(session.id)).user).toBeNull();
	});

	it('a password reset ends the old sessions at once', async () => {
		const user = await makeUser('reset');
		const session = await lucia.createSession(user.id, {});
		await cached(session.id);
		const token = await createPasswordReset(user.id);
		expect((await completePasswordReset(token, 'brand new password 789')).ok).toBe(true);
		expect((await validate(session.id)).user).toBeNull();
	});

	it('a session deleted inside a transaction is not kept while it is open, and is gone once committed', async () => {
		const user = await makeUser('trx');
		const session = await lucia.createSession(user.id, {});
		await cached(session.id);
		const trx = await db().transaction();
		await trx('sessions').where({ user_id: user.id }).delete();
		// Not yet committed: the row is still there for everyone else, but must not be kept.
		expect((await validate(session.id)).queries).toBe(1);
		expect((await validate(session.id)).queries).toBe(1);
		await trx.commit();
		expect((await validate(session.id)).user).toBeNull();
	});

	it('a changed name shows on the next lookup', async () => {
		const user = await makeUser('rename');
		const session = await lucia.createSession(user.id, {});
		await cached(session.id);
		await db()('users').where({ id: user.id }).update({ name: 'Renamed grower' });
		expect((await validate(session.id)).user?.name).toBe('Renamed grower');
	});
});

describe('SessionCache on its own clock', () => {
	const row = { userId: 'u1', expiresAt: new Date('2030-01-01T00:00:00Z'), email: 'a@example.test', name: 'A' };

	it('keeps a row for TTL_MS, then reads again', async () => {
		let now = 1_000_000;
		const cache = new SessionCache(() => now);
		let reads = 0;
		const read = async () => (reads++, row);
		await cache.get('k', read);
		await cache.get('k', read);
		expect(reads).toBe(1);
		now += TTL_MS - 1;
		await cache.get('k', read);
		expect(reads).toBe(1);
		now += 1;
		await cache.get('k', read);
		expect(reads).toBe(2);
	});

	it('does not keep a row read while sessions were being changed', async () => {
		let now = 1_000_000;
		const cache = new SessionCache(() => now);
		let release!: () => void;
		const slow = () => new Promise<typeof row>((r) => (release = () => r(row)));
		const pending = cache.get('k', slow);
		cache.seen({ sql: 'delete from "sessions" where "user_id" = ?' });
		release();
		await pending;
		expect(cache.size).toBe(0);
		now += 60_000;
		await cache.get('k', async () => row);
		expect(cache.size).toBe(1);
	});

	it('holds back until a transaction that changed users ends', async () => {
		let now = 1_000_000;
		const cache = new SessionCache(() => now);
		cache.seen({ sql: 'update "users" set "name" = ? where "id" = ?', __knexTxId: 'trx7' });
		now += 30_000;
		await cache.get('k', async () => row);
		expect(cache.size).toBe(0);
		cache.seen({ sql: 'COMMIT;', __knexTxId: 'trx7' });
		now += 5_000;
		await cache.get('k', async () => row);
		expect(cache.size).toBe(1);
		// Statements that change nothing of a session leave it alone.
		cache.seen({ sql: 'insert into "sessions" ("id") values (?)' });
		cache.seen({ sql: 'update "user_preferences" set "x" = ?' });
		expect(cache.size).toBe(1);
	});
});
