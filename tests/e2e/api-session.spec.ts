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
		expect(await farms.json()).toEqual([{ id: DEMO_FARM_ID, name: 'Larkspur Ridge Farm (demo)', role: 'advisor' }]);

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

	test('sign-in is rate limited with 429 and Retry-After', async ({ request }) => {
		const email = `ratelimited-${Date.now()}@example.test`;
		for (let i = 0; i < 10; i++) {
			expect((await request.post('/api/session', { data: { email, password: `wrong-${i}` } })).status()).toBe(401);
		}
		const blocked = await request.post('/api/session', { data: { email, password: 'wrong-again' } });
		expect(blocked.status()).toBe(429);
		expect(Number(blocked.headers()['retry-after'])).toBeGreaterThan(800);
		expect((await blocked.json()).error.message).toMatch(/Too many failed sign-in attempts for this e-mail/);
	});
});
