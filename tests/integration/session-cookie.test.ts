import { describe, expect, it } from 'vitest';
import type { Cookies } from '@sveltejs/kit';
import { lucia, setSessionCookie, clearSessionCookie } from '$lib/server/auth';
import { makeUser } from './helpers';

function jar() {
	const set: { name: string; value: string; opts: Record<string, unknown> }[] = [];
	return { set, cookies: { set: (name: string, value: string, opts: Record<string, unknown>) => set.push({ name, value, opts }) } as unknown as Cookies };
}

describe('session cookie flags', () => {
	it('is httpOnly and SameSite=Lax always, Secure only over https', async () => {
		const user = await makeUser('cookie');
		const session = await lucia.createSession(user.id, {});
		for (const secure of [true, false]) {
			const { set, cookies } = jar();
			setSessionCookie(cookies, session, secure);
			expect(set).toHaveLength(1);
			expect(set[0].name).toBe('sw_session');
			expect(set[0].value).toBe(session.id);
			expect(set[0].opts).toMatchObject({ httpOnly: true, sameSite: 'lax', path: '/', secure });
			expect(set[0].opts.maxAge).toBe(30 * 24 * 3600);
		}
		const { set, cookies } = jar();
		clearSessionCookie(cookies, true);
		expect(set[0]).toMatchObject({ name: 'sw_session', value: '', opts: { maxAge: 0, secure: true } });
	});
});
