import { describe, expect, it } from 'vitest';
import { randomInt } from 'node:crypto';
import { db } from '$lib/server/db';
import type { OutgoingMail } from '$lib/server/mail';
import { checkSignUpLink, confirmSignUp, requestSignUp, signUpAnswer, SignUpLinkError } from '$lib/server/sign-up';
import { checkPasswordReset, passwordResetAnswer, requestPasswordReset } from '$lib/server/password-reset';
import { attemptSignIn } from '$lib/server/sign-in';
import { getUserFromEmail } from '$lib/server/users';
import { backgroundSettled, runInBackground } from '$lib/server/background';
import { makeUser, uniqueEmail } from './helpers';

const ORIGIN = 'http://127.0.0.1:3000';

/** Keeps what would have gone to the SMTP relay. */
function outbox() {
	const sent: OutgoingMail[] = [];
	return { sent, send: async (m: OutgoingMail) => void sent.push(m) };
}

const linkIn = (text: string) => {
	const links = text.match(/https?:\/\/\S+/g) ?? [];
	return links[0];
};
const tokenOf = (link: string) => link.split('/').pop()!;
const ip = () => `10.${randomInt(256)}.${randomInt(256)}.${randomInt(1, 255)}`;

describe('sign-up by confirmed e-mail', () => {
	it('mails a new address a link, and only that link creates the account', async () => {
		const email = uniqueEmail('newcomer');
		const box = outbox();
		await requestSignUp({ name: '  New Comer ', email: email.toUpperCase(), password: 'a good long password', redirectTo: '/invitations/abc' }, ORIGIN, box.send);
		expect(box.sent.map((m) => [m.to, m.subject])).toEqual([[email, 'Confirm your e-mail for Stripwright']]);
		const link = linkIn(box.sent[0].text)!;
		expect(link).toMatch(new RegExp(`^${ORIGIN}/sign-up/confirm/[A-Za-z0-9_-]{43}$`));
		// Nothing exists yet, so an unconfirmed address cannot hold an account.
		expect(await getUserFromEmail(email)).toBeNull();
		expect(await checkSignUpLink(tokenOf(link))).toEqual({ email, name: 'New Comer' });

		const { user, redirectTo } = await confirmSignUp(tokenOf(link));
		expect(user).toMatchObject({ email, name: 'New Comer' });
		expect(redirectTo).toBe('/invitations/abc');
		expect(await attemptSignIn(email, 'a good long password', ip())).toMatchObject({ ok: true, user: { id: user.id } });
		await expect(confirmSignUp(tokenOf(link))).rejects.toThrow('This link was already used: the account exists. Sign in with it.');
	});

	it('mails an address that has an account a note with a reset link, and makes nothing', async () => {
		const existing = await makeUser('taken', 'the owner password');
		const box = outbox();
		await requestSignUp({ name: 'Someone Else', email: existing.email, password: 'an intruder password' }, ORIGIN, box.send);
		expect(box.sent.map((m) => [m.to, m.subject])).toEqual([[existing.email, 'You already have a Stripwright account']]);
		const link = linkIn(box.sent[0].text)!;
		expect(link).toMatch(new RegExp(`^${ORIGIN}/reset-password/`));
		expect(await checkPasswordReset(tokenOf(link))).toEqual({ ok: true, userId: existing.id, email: existing.email });
		expect(await db()('sign_up_requests').where({ email: existing.email })).toEqual([]);
		// The owner's password is untouched; the one typed in the sign-up form is not.
		expect((await attemptSignIn(existing.email, 'the owner password', ip())).ok).toBe(true);
		expect((await attemptSignIn(existing.email, 'an intruder password', ip())).ok).toBe(false);
	});

	it('answers with the same words for a new and a known address', () => {
		expect(signUpAnswer('a@example.test').replace('a@example.test', '<address>')).toBe(signUpAnswer('b@example.test').replace('b@example.test', '<address>'));
		expect(signUpAnswer('a@example.test')).toBe('Check your inbox at a@example.test: we sent a link to finish creating your account. It works for 24 hours.');
	});

	it('costs about the same for a new and a known address (both hash the password and send one mail)', async () => {
		const known = await makeUser('timing', 'some password 1');
		const box = outbox();
		const time = async (email: string) => {
			const t = performance.now();
			await requestSignUp({ name: 'Timing', email, password: 'timing password 1' }, ORIGIN, box.send);
			return performance.now() - t;
		};
		const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
		const fresh: number[] = [];
		const taken: number[] = [];
		for (let i = 0; i < 9; i++) {
			fresh.push(await time(uniqueEmail('timing-new')));
			taken.push(await time(known.email));
		}
		// Before: a known address answered in a few ms, a new one after an argon2 hash (~100 ms).
		const ratio = median(taken) / median(fresh);
		expect(ratio).toBeGreaterThan(0.5);
		expect(ratio).toBeLessThan(2);
		expect(box.sent).toHaveLength(18);
	});

	it('refuses an expired link, and a second account for an address confirmed meanwhile', async () => {
		const email = uniqueEmail('twice');
		const box = outbox();
		const sent = new Date('2026-03-01T10:00:00Z');
		await requestSignUp({ name: 'First', email, password: 'first password 1' }, ORIGIN, box.send, sent);
		await requestSignUp({ name: 'Second', email, password: 'second password 2' }, ORIGIN, box.send);
		const [first, second] = box.sent.map((m) => tokenOf(linkIn(m.text)!));
		await expect(confirmSignUp(first, new Date('2026-03-02T10:00:01Z'))).rejects.toThrow('This link has expired (links last 24 hours). Sign up again to get a new one.');
		await confirmSignUp(second);
		await expect(confirmSignUp(first, new Date('2026-03-01T11:00:00Z'))).rejects.toThrow(/already used/);
		await expect(checkSignUpLink('no-such-token')).rejects.toBeInstanceOf(SignUpLinkError);
		expect((await db()('users').where({ email })).map((u) => u.name)).toEqual(['Second']);
	});
});

describe('forgot password', () => {
	it('mails a known address and sends nothing for an unknown one, with one answer for both', async () => {
		const user = await makeUser('forgot');
		const box = outbox();
		await requestPasswordReset(user.email.toUpperCase(), ORIGIN, box.send);
		await requestPasswordReset(uniqueEmail('nobody'), ORIGIN, box.send);
		expect(box.sent.map((m) => [m.to, m.subject])).toEqual([[user.email, 'Reset your Stripwright password']]);
		expect(await checkPasswordReset(tokenOf(linkIn(box.sent[0].text)!))).toMatchObject({ ok: true, userId: user.id });
		expect(passwordResetAnswer('x@example.test')).toBe('If an account uses x@example.test, a reset link is on its way. It works once, for 60 minutes.');
	});
});

describe('background work', () => {
	it('returns before the task ends and logs a failure instead of throwing it', async () => {
		const order: string[] = [];
		runInBackground('test task', async () => {
			await new Promise((r) => setTimeout(r, 20));
			order.push('task');
		});
		order.push('caller');
		runInBackground('failing task', async () => {
			throw new Error('boom');
		});
		await backgroundSettled();
		expect(order).toEqual(['caller', 'task']);
	});
});
