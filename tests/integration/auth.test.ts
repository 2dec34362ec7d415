import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { hashPassword, verifyPassword } from '$lib/server/password';
import type { Cookies } from '@sveltejs/kit';
import { lucia, startSession } from '$lib/server/auth';
import { sha256Hex } from '$lib/server/tokens';
import { changePassword, createUser, DuplicateEmailError, getUserFromEmail } from '$lib/server/users';
import { makeUser, uniqueEmail } from './helpers';

describe('password hashing', () => {
	it('uses argon2id with at least the OWASP parameters (m=19 MiB, t=2, p=1)', async () => {
		const h = await hashPassword('a long enough password');
		// OWASP Password Storage Cheat Sheet (argon2id minimum configuration).
		expect(h).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/);
		expect(await verifyPassword(h, 'a long enough password')).toBe(true);
		expect(await verifyPassword(h, 'a long enough passworD')).toBe(false);
		expect(await verifyPassword('not a hash', 'x')).toBe(false);
	});

	it('stores only the hash and refuses a duplicate e-mail whatever its case', async () => {
		const email = uniqueEmail('dup');
		const u = await createUser({ email, name: 'Dup', password: 'first password!' });
		const row = await db()('users').where({ id: u.id }).first();
		expect(row.password_hash).not.toContain('first password!');
		await expect(createUser({ email: email.toUpperCase(), name: 'Dup 2', password: 'second password' })).rejects.toBeInstanceOf(DuplicateEmailError);
		expect((await getUserFromEmail(email.toUpperCase()))?.id).toBe(u.id);
	});
});

describe('session life cycle', () => {
	it('stores only a SHA-256 of the session id', async () => {
		const user = await makeUser('sess');
		const session = await lucia.createSession(user.id, {});
		const rows = await db()('sessions').where({ user_id: user.id });
		expect(rows).toHaveLength(1);
		expect(rows[0].id).toBe(sha256Hex(session.id));
		expect(rows[0].id).not.toBe(session.id);
		const { session: valid, user: who } = await lucia.validateSession(session.id);
		expect(valid?.id).toBe(session.id);
		expect(who).toMatchObject({ id: user.id, email: user.email });
	});

	it('refuses a tampered or hashed id as a cookie', async () => {
		const user = await makeUser('tamper');
		const session = await lucia.createSession(user.id, {});
		const tampered = session.id.slice(0, -1) + (session.id.endsWith('a') ? 'b' : 'a');
		expect((await lucia.validateSession(tampered)).session).toBeNull();
		// Someone who read the table cannot use its ids as cookies.
		expect((await lucia.validateSession(sha256Hex(session.id))).session).toBeNull();
	});

	it('slides the expiry forward once less than half of 30 days remains', async () => {
		const user = await makeUser('slide');
		const session = await lucia.createSession(user.id, {});
		const soon = new Date(Date.now() + 5 * 86_400_000);
		await db()('sessions').where({ id: sha256Hex(session.id) }).update({ expires_at: soon });
		const { session: renewed } = await lucia.validateSession(session.id);
		expect(renewed?.fresh).toBe(true);
		const row = await db()('sessions').where({ id: sha256Hex(session.id) }).first();
		expect(new Date(row.expires_at).getTime()).toBeGreaterThan(Date.now() + 29 * 86_400_000);
	});

	it('ends an expired session and deletes it', async () => {
		const user = await makeUser('expired');
		const session = await lucia.createSession(user.id, {});
		await db()('sessions').where({ id: sha256Hex(session.id) }).update({ expires_at: new Date(Date.now() - 1000) });
		expect((await lucia.validateSession(session.id)).session).toBeNull();
		expect(await db()('sessions').where({ id: sha256Hex(session.id) }).first()).toBeUndefined();
	});

	it('signs out one session or all of a user', async () => {
		const user = await makeUser('signout');
		const a = await lucia.createSession(user.id, {});
		const b = await lucia.createSession(user.id, {});
		await lucia.invalidateSession(a.id);
		expect((await lucia.validateSession(a.id)).session).toBeNull();
		expect((await lucia.validateSession(b.id)).session).not.toBeNull();
		await lucia.invalidateUserSessions(user.id);
		expect((await lucia.validateSession(b.id)).session).toBeNull();
	});
});

/** A cookie jar holding what the browser sent and what the response sets. */
function cookieJar(sent: Record<string, string> = {}) {
	const jar = { ...sent };
	const cookies = { get: (name: string) => jar[name], set: (name: string, value: string) => void (jar[name] = value) } as unknown as Cookies;
	return { jar, cookies };
}

describe('session rotation', () => {
	it('gives a new session id on sign-in and ends the one the browser carried before', async () => {
		const user = await makeUser('rotate');
		const before = await lucia.createSession(user.id, {});
		const { jar, cookies } = cookieJar({ sw_session: before.id });
		const after = await startSession(cookies, user.id, false);
		expect(after.id).not.toBe(before.id);
		expect(jar.sw_session).toBe(after.id);
		expect((await lucia.validateSession(before.id)).session).toBeNull();
		expect((await lucia.validateSession(after.id)).session?.userId).toBe(user.id);
	});

	it('ends another account\'s session left in the browser when someone else signs in', async () => {
		const first = await makeUser('shared-first');
		const second = await makeUser('shared-second');
		const left = await lucia.createSession(first.id, {});
		const { jar, cookies } = cookieJar({ sw_session: left.id });
		await startSession(cookies, second.id, false);
		expect((await lucia.validateSession(left.id)).session).toBeNull();
		expect((await lucia.validateSession(jar.sw_session)).user?.id).toBe(second.id);
	});

	it('starts a session when the browser carried an unknown id', async () => {
		const user = await makeUser('planted');
		const { jar, cookies } = cookieJar({ sw_session: 'not-a-session-anyone-has' });
		const s = await startSession(cookies, user.id, false);
		expect(jar.sw_session).toBe(s.id);
		expect((await db()('sessions').where({ user_id: user.id })).map((r) => r.id)).toEqual([sha256Hex(s.id)]);
	});
});

describe('password change', () => {
	it('refuses a wrong current password and changes nothing', async () => {
		const user = await makeUser('change-wrong', 'the old password');
		const session = await lucia.createSession(user.id, {});
		expect(await changePassword(user.id, 'not the old password', 'a brand new password')).toBe(false);
		const row = await getUserFromEmail(user.email);
		expect(await verifyPassword(row!.passwordHash, 'the old password')).toBe(true);
		expect((await lucia.validateSession(session.id)).session).not.toBeNull();
	});

	it('sets the new password and ends every session of that user only', async () => {
		const user = await makeUser('change-right', 'the old password');
		const other = await makeUser('bystander');
		const phone = await lucia.createSession(user.id, {});
		const laptop = await lucia.createSession(user.id, {});
		const theirs = await lucia.createSession(other.id, {});
		expect(await changePassword(user.id, 'the old password', 'a brand new password')).toBe(true);
		const row = await getUserFromEmail(user.email);
		expect(await verifyPassword(row!.passwordHash, 'a brand new password')).toBe(true);
		expect(await verifyPassword(row!.passwordHash, 'the old password')).toBe(false);
		expect((await lucia.validateSession(phone.id)).session).toBeNull();
		expect((await lucia.validateSession(laptop.id)).session).toBeNull();
		expect((await lucia.validateSession(theirs.id)).session?.userId).toBe(other.id);
	});
});
