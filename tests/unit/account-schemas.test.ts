import { describe, expect, it } from 'vitest';
import { inviteSchema, resetPasswordSchema, signUpSchema } from '$lib/schemas/account';
import { safeRedirectTarget } from '$lib/server/redirects';

function fieldErrors(result: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) {
	return Object.fromEntries((result.error?.issues ?? []).map((i) => [i.path.join('.'), i.message]));
}

describe('sign-up validation', () => {
	it('accepts a good sign-up and trims the e-mail', () => {
		const r = signUpSchema.safeParse({ name: 'Pat', email: '  pat@example.test ', password: 'ten chars!' });
		expect(r.success).toBe(true);
		expect(r.data?.email).toBe('pat@example.test');
	});
	it('refuses a malformed e-mail with a message that says what is expected', () => {
		const r = signUpSchema.safeParse({ name: 'Pat', email: 'pat-at-example', password: 'long enough pw' });
		expect(fieldErrors(r)).toEqual({ email: 'Enter an e-mail address like name@example.com.' });
	});
	it('refuses a password under 10 characters', () => {
		const r = signUpSchema.safeParse({ name: 'Pat', email: 'pat@example.test', password: '123456789' });
		expect(fieldErrors(r)).toEqual({ password: 'Use at least 10 characters.' });
	});
	it('refuses an empty name', () => {
		const r = signUpSchema.safeParse({ name: '   ', email: 'pat@example.test', password: '1234567890' });
		expect(fieldErrors(r)).toEqual({ name: 'Enter your name.' });
	});
});

describe('other account forms', () => {
	it('reset needs both passwords to match', () => {
		const r = resetPasswordSchema.safeParse({ password: 'abcdefghijk', confirm: 'abcdefghijx' });
		expect(fieldErrors(r)).toEqual({ confirm: 'The two passwords do not match.' });
	});
	it('an invitation defaults to crew, never owner, and refuses unknown roles', () => {
		expect(inviteSchema.parse({ email: 'a@example.test' }).role).toBe('crew');
		expect(inviteSchema.safeParse({ email: 'a@example.test', role: 'admin' }).success).toBe(false);
	});
});

describe('redirect after sign-in', () => {
	it('keeps same-site paths and refuses other sites', () => {
		expect(safeRedirectTarget('/farms/abc/team')).toBe('/farms/abc/team');
		expect(safeRedirectTarget('//evil.example/x')).toBe('/farms');
		expect(safeRedirectTarget('https://evil.example')).toBe('/farms');
		expect(safeRedirectTarget('/\\evil.example')).toBe('/farms');
		expect(safeRedirectTarget(null)).toBe('/farms');
	});
});
