// Sessions and plan stamps are kept a few seconds per process. A change committed by another process
// (another app server, a script) reaches this one as a database notice and empties what it kept, so
// a session ended elsewhere stops working here within moments, not when the kept copy lapses.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import pg from 'pg';
import { lucia } from '$lib/server/auth';
import { db } from '$lib/server/db';
import { listening, startChangeListener, stopChangeListener } from '$lib/server/change-listener';
import { TTL_MS } from '$lib/server/session-cache';
import { requireMember } from '$lib/server/access';
import { fakeEvent, makeFarmWithTeam, makeUser, thrown } from './helpers';

let sql: string[] = [];
const onQuery = (q: { sql: string }) => sql.push(q.sql);

async function validate(sessionId: string) {
	sql = [];
	const { user } = await lucia.validateSession(sessionId);
	return { user, queries: sql.length };
}

async function until(test: () => Promise<boolean> | boolean, ms: number) {
	const end = Date.now() + ms;
	while (Date.now() < end) {
		if (await test()) return true;
		await new Promise((r) => setTimeout(r, 50));
	}
	return false;
}

/** Validates until the answer comes from the kept copy (no SQL). */
async function cached(sessionId: string) {
	const ok = await until(async () => {
		const v = await validate(sessionId);
		expect(v.user).not.toBeNull();
		return v.queries === 0;
	}, 8000);
	expect(ok).toBe(true);
}

/** Another process: its own connection, unseen by this process's statement watcher. */
async function elsewhere(text: string, values: unknown[]) {
	const other = new pg.Client({ connectionString: process.env.DATABASE_URL });
	await other.connect();
	try {
		await other.query(text, values);
	} finally {
		await other.end();
	}
}

beforeAll(async () => {
	db().on('query', onQuery);
	startChangeListener();
	expect(await until(listening, 5000)).toBe(true);
});
afterAll(async () => {
	db().removeListener('query', onQuery);
	await stopChangeListener();
});

describe('changes committed by another process', () => {
	it('a session deleted elsewhere stops working here well before the kept copy would lapse', async () => {
		const user = await makeUser('elsewhere');
		const session = await lucia.createSession(user.id, {});
		await cached(session.id);
		const deletedAt = Date.now();
		await elsewhere('delete from sessions where user_id = $1', [user.id]);
		const ended = await until(async () => (await validate(session.id)).user === null, 3000);
		expect(ended).toBe(true);
		expect(Date.now() - deletedAt).toBeLessThan(TTL_MS / 2);
	});

	it('while the listening connection is down nothing is answered from the kept copies, and it comes back by itself', async () => {
		const user = await makeUser('listener-down');
		const session = await lucia.createSession(user.id, {});
		await cached(session.id);
		await elsewhere(
			`select pg_terminate_backend(pid) from pg_stat_activity where datname = current_database() and pid <> pg_backend_pid() and query ilike 'listen stripwright_changes%'`,
			[]
		);
		expect(await until(() => !listening(), 3000)).toBe(true);
		const down = await validate(session.id);
		expect(down.user?.id).toBe(user.id);
		expect(down.queries).toBeGreaterThan(0);
		expect(await until(listening, 5000)).toBe(true);
		await cached(session.id);
	});

	it('a member demoted or removed is refused on the next read, by this process or another', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const read = async (capability: 'read' | 'editPlans') => {
			sql = [];
			const access = await requireMember(fakeEvent(members.manager) as never, farm.id, capability);
			return { role: access.role, queries: sql.length };
		};
		// Kept: a repeat read sends no query.
		expect(await until(async () => (await read('editPlans')).queries === 0, 8000)).toBe(true);
		// Another process makes the manager a viewer: refused within moments, long before 5 s.
		const changedAt = Date.now();
		await elsewhere(`update memberships set role = 'viewer' where farm_id = $1 and user_id = $2`, [farm.id, members.manager.id]);
		expect(await until(async () => (await thrown(() => read('editPlans'))).status === 403, 3000)).toBe(true);
		expect(Date.now() - changedAt).toBeLessThan(2500);
		// This process removes the member: the very next read answers 404.
		expect(await until(async () => (await read('read')).queries === 0, 8000)).toBe(true);
		await db()('memberships').where({ farm_id: farm.id, user_id: members.manager.id }).delete();
		expect((await thrown(() => read('read'))).status).toBe(404);
	});
});
