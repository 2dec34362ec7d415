import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { lucia } from '$lib/server/auth';
import { checkPasswordReset, completePasswordReset, createPasswordReset, requestPasswordReset } from '$lib/server/password-reset';
import { requestSignUp } from '$lib/server/sign-up';
import { sha256Hex } from '$lib/server/tokens';
import { attemptSignIn } from '$lib/server/sign-in';
import { makeUser } from './helpers';

describe('password reset', () => {
	it('sends at most ten account mails an hour to one address, whoever asks', async () => {
		const user = await makeUser('reset-flood', 'old password 1');
		const sent: string[] = [];
		const send = async (m: { to: string; subject: string }) => void sent.push(`${m.to}|${m.subject}`);
		for (let i = 0; i < 9; i++) await requestPasswordReset(user.email.toUpperCase(), 'http://127.0.0.1', send);
		// Sign-up mail to the same address counts against the same ten.
		await requestSignUp({ name: 'Someone', email: user.email, password: 'a long password 1', redirectTo: null }, 'http://127.0.0.1', send);
		expect(sent).toHaveLength(10);
		await requestPasswordReset(user.email, 'http://127.0.0.1', send);
		await requestSignUp({ name: 'Someone', email: user.email, password: 'a long password 1', redirectTo: null }, 'http://127.0.0.1', send);
		expect(sent).toHaveLength(10);
		// Another address is not held back.
		const other = await makeUser('reset-flood-other', 'old password 1');
		await requestPasswordReset(other.email, 'http://127.0.0.1', send);
		expect(sent).toHaveLength(11);
		expect(sent[10]).toBe(`${other.email}|${sent[0].split('|')[1]}`);
		// Nine resets asked for, and the one the sign-up mail carries.
		expect(await db()('password_resets').where({ user_id: user.id }).count({ n: '*' }).first()).toEqual({ n: 10 });
	});

	it('sets the new password, ends every session and works only once', async () => {
		const user = await makeUser('reset', 'old password 1');
		const s1 = await lucia.createSession(user.id, {});
		const s2 = await lucia.createSession(user.id, {});
		const token = await createPasswordReset(user.id);
		expect(await db()('password_resets').where({ token_hash: token }).first()).toBeUndefined(); // only the hash is stored
		expect(await db()('password_resets').where({ token_hash: sha256Hex(token) }).first()).toBeDefined();

		expect(await completePasswordReset(token, 'new password 22')).toMatchObject({ ok: true, userId: user.id });
		expect((await lucia.validateSession(s1.id)).session).toBeNull();
		expect((await lucia.validateSession(s2.id)).session).toBeNull();
		expect((await attemptSignIn(user.email, 'old password 1', '192.0.2.1')).ok).toBe(false);
		expect((await attemptSignIn(user.email, 'new password 22', '192.0.2.1')).ok).toBe(true);

		expect(await completePasswordReset(token, 'third password 3')).toEqual({
			ok: false,
			message: 'This reset link has already been used. Ask for a new one.'
		});
		expect((await attemptSignIn(user.email, 'new password 22', '192.0.2.1')).ok).toBe(true);
	});

	it('expires after one hour', async () => {
		const user = await makeUser('reset-exp', 'old password 1');
		const issued = new Date('2026-03-01T10:00:00Z');
		const token = await createPasswordReset(user.id, issued);
		expect((await checkPasswordReset(token, new Date('2026-03-01T10:59:59Z'))).ok).toBe(true);
		const late = await completePasswordReset(token, 'new password 22', new Date('2026-03-01T11:00:00Z'));
		expect(late).toEqual({ ok: false, message: 'This reset link has expired (links last 1 hour). Ask for a new one.' });
		expect((await attemptSignIn(user.email, 'old password 1', '192.0.2.2')).ok).toBe(true);
	});

	it('spends every other open link of the user when one is used', async () => {
		const user = await makeUser('reset-many', 'old password 1');
		const a = await createPasswordReset(user.id);
		const b = await createPasswordReset(user.id);
		expect((await completePasswordReset(b, 'new password 22')).ok).toBe(true);
		expect((await checkPasswordReset(a)).ok).toBe(false);
	});

	it('refuses an unknown token', async () => {
		expect(await checkPasswordReset('not-a-token')).toEqual({ ok: false, message: 'This reset link is not valid. Ask for a new one.' });
	});
});
