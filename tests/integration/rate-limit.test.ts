import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { attemptSignIn, WRONG_CREDENTIALS } from '$lib/server/sign-in';
import { SIGN_IN_LIMITS } from '$lib/server/rate-limit';
import { makeUser, uniqueEmail } from './helpers';

describe('sign-in rate limiting', () => {
	it('gives one generic message for an unknown e-mail and for a wrong password', async () => {
		const user = await makeUser('generic', 'the right password');
		const unknown = await attemptSignIn(uniqueEmail('nobody'), 'whatever-password', '198.51.100.1');
		const wrong = await attemptSignIn(user.email, 'the wrong password', '198.51.100.1');
		expect(unknown).toEqual({ ok: false, status: 401, message: WRONG_CREDENTIALS });
		expect(wrong).toEqual({ ok: false, status: 401, message: WRONG_CREDENTIALS });
	});

	it('blocks an e-mail after 10 failures in 15 minutes, even with the right password', async () => {
		const user = await makeUser('limited', 'the right password');
		for (let i = 0; i < SIGN_IN_LIMITS.perEmail; i++) {
			expect((await attemptSignIn(user.email, `wrong ${i}`, `198.51.100.${i + 10}`)).ok).toBe(false);
		}
		const blocked = await attemptSignIn(user.email, 'the right password', '198.51.100.99');
		expect(blocked.ok).toBe(false);
		if (!blocked.ok) {
			expect(blocked.status).toBe(429);
			expect(blocked.message).toMatch(/Too many failed sign-in attempts for this e-mail\. Try again in 15 minutes/);
			expect(blocked.retryAfterSeconds).toBeGreaterThan(14 * 60);
		}
		// Another account is not affected.
		const other = await makeUser('other', 'other password!');
		expect((await attemptSignIn(other.email, 'other password!', '198.51.100.99')).ok).toBe(true);
	});

	it('lets the e-mail in again once the failures are older than the window', async () => {
		const user = await makeUser('window', 'the right password');
		for (let i = 0; i < SIGN_IN_LIMITS.perEmail; i++) await attemptSignIn(user.email, 'nope nope', '198.51.100.50');
		await db()('login_attempts').where({ email: user.email }).update({ at: new Date(Date.now() - 16 * 60_000) });
		expect((await attemptSignIn(user.email, 'the right password', '198.51.100.50')).ok).toBe(true);
	});

	it('blocks one address after 100 failures across e-mails', async () => {
		const ip = '203.0.113.77';
		const rows = Array.from({ length: SIGN_IN_LIMITS.perIp }, (_, i) => ({ email: `spray-${i}@example.test`, ip, succeeded: false }));
		await db()('login_attempts').insert(rows);
		const user = await makeUser('ipblock', 'the right password');
		const r = await attemptSignIn(user.email, 'the right password', ip);
		expect(r).toMatchObject({ ok: false, status: 429 });
		if (!r.ok) expect(r.message).toMatch(/from your network/);
		expect((await attemptSignIn(user.email, 'the right password', '203.0.113.78')).ok).toBe(true);
	});
});
