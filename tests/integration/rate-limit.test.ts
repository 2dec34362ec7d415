import { describe, expect, it } from 'vitest';
import { randomInt } from 'node:crypto';
import { db } from '$lib/server/db';
import { attemptSignIn, WRONG_CREDENTIALS } from '$lib/server/sign-in';
import { accountDelaySeconds, addressKey, recordSignInFailure, SIGN_IN_LIMITS } from '$lib/server/rate-limit';
import { makeUser, uniqueEmail } from './helpers';

// Each test signs in from addresses of its own, so reruns against one database do not add up.
const randomIp = () => `10.${randomInt(256)}.${randomInt(256)}.${randomInt(1, 255)}`;
const later = (from: Date, seconds: number) => new Date(from.getTime() + seconds * 1000);

/** Fails n times, each attempt made just as the previous wait ends; returns the time of the last one. */
async function failAfterEachWait(email: string, n: number, ip: string, start: Date) {
	let now = start;
	for (let i = 0; i < n; i++) {
		const r = await attemptSignIn(email, `wrong ${i}`, ip, now);
		expect(r).toMatchObject({ ok: false, status: 401 });
		if (i < n - 1) now = later(now, (await blockedFor(email, now)) ?? 0);
	}
	return now;
}

async function blockedFor(email: string, now: Date) {
	const row = await db()('sign_in_throttles').where({ scope: 'account', key: email }).first('blocked_until');
	return row?.blocked_until ? Math.round((new Date(row.blocked_until).getTime() - now.getTime()) / 1000) : null;
}

async function failures(scope: 'account' | 'address', key: string) {
	const row = await db()('sign_in_throttles').where({ scope, key }).first('failures');
	return row?.failures ?? 0;
}

describe('sign-in throttling', () => {
	it('gives one generic message for an unknown e-mail and for a wrong password', async () => {
		const user = await makeUser('generic', 'the right password');
		const ip = randomIp();
		const unknown = await attemptSignIn(uniqueEmail('nobody'), 'whatever-password', ip);
		const wrong = await attemptSignIn(user.email, 'the wrong password', ip);
		expect(unknown).toEqual({ ok: false, status: 401, message: WRONG_CREDENTIALS });
		expect(wrong).toEqual({ ok: false, status: 401, message: WRONG_CREDENTIALS });
	});

	it('answers 20 parallel wrong passwords with 401 each and counts every one of them', async () => {
		const user = await makeUser('parallel', 'the right password');
		const ip = randomIp();
		const now = new Date();
		const results = await Promise.all(Array.from({ length: 20 }, (_, i) => attemptSignIn(user.email, `wrong guess ${i}`, ip, now)));
		expect(results.map((r) => (r.ok ? 200 : r.status))).toEqual(Array(20).fill(401));
		// One upsert per failure: none of the 20 was lost to a read-then-write race.
		expect(await failures('account', user.email)).toBe(20);
		expect(await failures('address', ip)).toBe(20);
		// Twenty failures is 10 past the free ones: the e-mail now waits the one-minute cap.
		const next = await attemptSignIn(user.email, 'the right password', randomIp(), now);
		expect(next).toMatchObject({ ok: false, status: 429, retryAfterSeconds: 60 });
	});

	it('lets the owner in from another address right after ten wrong passwords', async () => {
		const user = await makeUser('ten', 'the right password');
		const attacker = randomIp();
		const now = new Date();
		for (let i = 0; i < 10; i++) expect(await attemptSignIn(user.email, `wrong ${i}`, attacker, now)).toMatchObject({ status: 401 });
		expect((await attemptSignIn(user.email, 'the right password', randomIp(), now)).ok).toBe(true);
		// The right password cleared the e-mail's count.
		expect(await failures('account', user.email)).toBe(0);
	});

	it('makes the e-mail wait twice as long after each further failure, never more than a minute', async () => {
		const user = await makeUser('backoff', 'the right password');
		const attacker = randomIp();
		let now = new Date();
		const waits: number[] = [];
		for (let i = 0; i < 18; i++) {
			const r = await attemptSignIn(user.email, `wrong ${i}`, attacker, now);
			expect(r).toMatchObject({ ok: false, status: 401 });
			const wait = (await blockedFor(user.email, now)) ?? 0;
			waits.push(wait);
			now = later(now, wait);
		}
		expect(waits).toEqual([0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 1, 2, 4, 8, 16, 32, 60, 60]);
	});

	it('refuses the right password during the short wait, from any address, and accepts it once the wait is over', async () => {
		const user = await makeUser('wait', 'the right password');
		const attacker = randomIp();
		const owner = randomIp();
		const now = await failAfterEachWait(user.email, 15, attacker, new Date());
		// 15 failures = 5 past the free ones: 16 seconds.
		const early = await attemptSignIn(user.email, 'the right password', owner, later(now, 10));
		expect(early).toMatchObject({ ok: false, status: 429, retryAfterSeconds: 6 });
		if (!early.ok) expect(early.message).toBe('Too many failed sign-ins for this e-mail. Wait 6 seconds and try again, or reset your password.');
		// Refused attempts are not verified and do not count, so the wait does not grow while it runs.
		expect(await failures('account', user.email)).toBe(15);
		expect((await attemptSignIn(user.email, 'the right password', owner, later(now, 16))).ok).toBe(true);
	});

	it('starts the count again after 15 quiet minutes', async () => {
		const user = await makeUser('quiet', 'the right password');
		const ip = randomIp();
		const now = await failAfterEachWait(user.email, 12, ip, new Date());
		expect(await failures('account', user.email)).toBe(12);
		await attemptSignIn(user.email, 'wrong again', ip, later(now, 15 * 60 + 1));
		expect(await failures('account', user.email)).toBe(1);
	});

	it('pauses one address after 100 failures across e-mails, for that address only', async () => {
		const ip = randomIp();
		const now = new Date();
		for (let i = 0; i < SIGN_IN_LIMITS.perAddress; i++) await recordSignInFailure(uniqueEmail(`spray-${i}`), ip, now);
		const user = await makeUser('ipblock', 'the right password');
		const r = await attemptSignIn(user.email, 'the right password', ip, later(now, 60));
		expect(r).toMatchObject({ ok: false, status: 429, retryAfterSeconds: 14 * 60 });
		if (!r.ok) expect(r.message).toBe('Too many failed sign-ins from your network. Try again in 14 minutes.');
		expect((await attemptSignIn(user.email, 'the right password', randomIp(), later(now, 60))).ok).toBe(true);
		expect((await attemptSignIn(user.email, 'the right password', ip, later(now, 15 * 60))).ok).toBe(true);
	});
});

describe('throttle keys and delays', () => {
	it('grows 1, 2, 4 … seconds after the tenth failure and stops at 60', () => {
		expect([1, 10, 11, 12, 13, 16, 17, 100].map(accountDelaySeconds)).toEqual([0, 0, 1, 2, 4, 32, 60, 60]);
	});

	it('counts IPv6 clients by their /64 and IPv4-mapped addresses as IPv4', () => {
		expect(addressKey('203.0.113.9')).toBe('203.0.113.9');
		expect(addressKey('::ffff:203.0.113.9')).toBe('203.0.113.9');
		expect(addressKey('2001:db8:0:1:aaaa::1')).toBe('2001:db8:0:1::/64');
		expect(addressKey('2001:0db8:0000:0001:bbbb:cccc:dddd:eeee')).toBe('2001:db8:0:1::/64');
		expect(addressKey('2001:db8::5')).toBe('2001:db8:0:0::/64');
		expect(addressKey('::1')).toBe('0:0:0:0::/64');
	});
});
