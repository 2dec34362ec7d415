import { expect, type APIRequestContext, type Browser, type BrowserContext, type Page } from '@playwright/test';
import { randomUUID } from 'node:crypto';

export const DEMO_PASSWORD = 'stripwright-demo';
export const demoEmail = (role: string) => `${role}@demo.stripwright.test`;
export const DEMO_FARM_ID = '5a1e0000-0000-4000-8000-00000000f001';

export function uniqueEmail(tag: string) {
	return `${tag}-${randomUUID().slice(0, 8)}@example.test`;
}

const mailbox = () => {
	const url = process.env.MAILBOX_URL;
	if (!url) throw new Error('MAILBOX_URL is not set: run the tests with npm test');
	return url;
};

interface Mail { id: string; to: string[]; subject: string; text: string; attachments: { filename: string; contentType: string; size: number; base64: string }[] }

/** Waits for the newest message to the address in the SMTP stand-in. */
export async function waitForMail(request: APIRequestContext, to: string, subject: RegExp): Promise<Mail> {
	let found: Mail | undefined;
	await expect
		.poll(async () => {
			const res = await request.get(`${mailbox()}/messages?to=${encodeURIComponent(to)}`);
			const list = (await res.json()) as Mail[];
			found = list.find((m) => subject.test(m.subject));
			return Boolean(found);
		}, { timeout: 10_000, message: `an e-mail to ${to} matching ${subject}` })
		.toBe(true);
	return found!;
}

export function firstLink(text: string): string {
	const m = text.match(/https?:\/\/\S+/);
	if (!m) throw new Error(`no link in e-mail: ${text}`);
	return m[0];
}

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
	await page.goto('/sign-in');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/farms/);
}

/** Signs up through the form and the confirmation mail; ends signed in, on the page sign-up led to. */
export async function signUp(page: Page, name: string, email: string, password = 'a good long password') {
	await page.goto('/sign-up');
	await page.getByLabel('Your name').fill(name);
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Create account' }).click();
	await finishSignUp(page, email);
}

/** After the sign-up form was sent: opens the confirmation link mailed to the address and creates the account. */
export async function finishSignUp(page: Page, email: string) {
	await expect(page.getByText(`Check your inbox at ${email}`)).toBeVisible();
	const mail = await waitForMail(page.request, email, /^Confirm your e-mail for Stripwright$/);
	await page.goto(firstLink(mail.text));
	await page.getByRole('button', { name: 'Create my account' }).click();
	// The session cookie exists only once the form post has answered with its redirect.
	await page.waitForURL((url) => !url.pathname.startsWith('/sign-up'));
}

/** Signs up without a browser: the request context ends holding the new account's session cookie. */
export async function apiSignUp(request: APIRequestContext, baseURL: string, name: string, email: string, password: string) {
	const origin = new URL(baseURL).origin;
	const res = await request.post('/sign-up', { form: { name, email, password }, headers: { origin } });
	expect(res.status()).toBe(200);
	const mail = await waitForMail(request, email, /^Confirm your e-mail for Stripwright$/);
	const confirmed = await request.post(new URL(firstLink(mail.text)).pathname, { form: { confirm: 'yes' }, headers: { origin, accept: 'text/html' }, maxRedirects: 0 });
	expect(confirmed.status()).toBe(303);
}

/** A context whose every request is recorded, to prove nothing leaves 127.0.0.1. */
export async function recordingContext(browser: Browser, options: Parameters<Browser['newContext']>[0] = {}) {
	const context = await browser.newContext(options);
	const hosts = new Set<string>();
	context.on('request', (r) => {
		const u = new URL(r.url());
		if (u.protocol.startsWith('http')) hosts.add(u.hostname);
	});
	return { context, hosts };
}

export async function apiSignIn(request: APIRequestContext, role: string) {
	const res = await request.post('/api/session', { data: { email: demoEmail(role), password: DEMO_PASSWORD } });
	expect(res.status()).toBe(200);
}

export type { BrowserContext };
