import { expect, test } from '@playwright/test';
import { DEMO_FARM_ID, DEMO_PASSWORD, apiSignIn, demoEmail } from './helpers';

test.describe('JSON API: session and farms', () => {
	test('signs in, lists farms with the role, signs out', async ({ request }) => {
		expect((await request.get('/api/farms')).status()).toBe(401);
		const res = await request.post('/api/session', { data: { email: demoEmail('advisor'), password: DEMO_PASSWORD } });
		expect(res.status()).toBe(200);
		const cookie = res.headers()['set-cookie'];
		expect(cookie).toMatch(/sw_session=[a-z0-9]+;/);
		expect(cookie).toMatch(/HttpOnly/);
		expect(cookie).toMatch(/SameSite=Lax/);
		expect(cookie).not.toMatch(/Secure/); // plain http on 127.0.0.1
		expect((await res.json()).user).toMatchObject({ email: demoEmail('advisor') });

		const farms = await request.get('/api/farms');
		expect(farms.status()).toBe(200);
		expect(await farms.json()).toEqual([{ id: DEMO_FARM_ID, name: 'Larkspur Ridge Farm (demo)', role: 'advisor', timeZone: 'America/Chicago' }]);

		expect((await request.delete('/api/session')).status()).toBe(204);
		const after = await request.get('/api/farms');
		expect(after.status()).toBe(401);
		expect(await after.json()).toEqual({ error: { code: 'unauthenticated', message: 'Sign in first: your session has ended or you are not signed in.' } });
	});

	test('bad input gets the one error shape', async ({ request }) => {
		const notJson = await request.post('/api/session', { headers: { 'content-type': 'application/json' }, data: Buffer.from('{"email":') });
		expect(notJson.status()).toBe(400);
		expect(await notJson.json()).toEqual({ error: { code: 'bad_json', message: 'The request body is not valid JSON.' } });

		const bad = await request.post('/api/session', { data: { email: 'nope', password: '' } });
		expect(bad.status()).toBe(400);
		expect(await bad.json()).toEqual({
			error: {
				code: 'invalid',
				message: 'Some values are missing or not valid; see fields.',
				fields: { email: ['Enter an e-mail address like name@example.com.'], password: ['Enter your password.'] }
			}
		});

		const wrong = await request.post('/api/session', { data: { email: demoEmail('viewer'), password: 'not the password' } });
		expect(wrong.status()).toBe(401);
		expect((await wrong.json()).error.code).toBe('wrong_credentials');
	});

	test('a tampered session cookie is treated as signed out', async ({ request }) => {
		await apiSignIn(request, 'crew');
		const state = await request.storageState();
		const c = state.cookies.find((x) => x.name === 'sw_session')!;
		const res = await request.get('/api/farms', { headers: { cookie: `sw_session=${c.value.slice(0, -2)}zz` } });
		expect(res.status()).toBe(401);
	});

	test('20 parallel wrong passwords all get 401; then the e-mail waits a capped, growing delay', async ({ request }) => {
		const email = `ratelimited-${Date.now()}@example.test`;
		const answers = await Promise.all(Array.from({ length: 20 }, (_, i) => request.post('/api/session', { data: { email, password: `wrong-${i}` } })));
		expect(answers.map((r) => r.status())).toEqual(Array(20).fill(401));
		// 20 failures is ten past the free ones: 2^9 s, capped at one minute.
		const blocked = await request.post('/api/session', { data: { email, password: 'wrong-again' } });
		expect(blocked.status()).toBe(429);
		expect(blocked.headers()['retry-after']).toMatch(/^(59|60)$/);
		expect((await blocked.json()).error).toEqual({
			code: 'too_many_requests',
			message: `Too many failed sign-ins for this e-mail. Wait ${blocked.headers()['retry-after']} seconds and try again, or reset your password.`
		});
	});

	test('signing in again gives a new session id and ends the old one', async ({ playwright, baseURL }) => {
		const request = await playwright.request.newContext({ baseURL });
		const cookieOf = async () => (await request.storageState()).cookies.find((c) => c.name === 'sw_session')!.value;
		await apiSignIn(request, 'advisor');
		const first = await cookieOf();
		await apiSignIn(request, 'advisor');
		const second = await cookieOf();
		expect(second).not.toBe(first);
		const withCookie = (id: string) => request.get('/api/farms', { headers: { cookie: `sw_session=${id}` } });
		expect((await withCookie(second)).status()).toBe(200);
		expect((await withCookie(first)).status()).toBe(401);
		await request.dispose();
	});
});
