import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import nodemailer from 'nodemailer';
import { isHttpError, isRedirect } from '@sveltejs/kit';
import { startMailStandIn } from '../../scripts/stand-ins/smtp';
import { load } from '../../src/routes/dev/mailbox/+page.server';

type Loaded = { email: string; messages: { to: string[]; subject: string; text: string }[] };

let standIn: Awaited<ReturnType<typeof startMailStandIn>>;
const saved = { HOST: process.env.HOST, MAILBOX_URL: process.env.MAILBOX_URL, SOCKET_PATH: process.env.SOCKET_PATH };
const alice = 'alice-mailbox@example.test';
const bob = 'bob-mailbox@example.test';

function event(user: { email: string } | null) {
	const url = new URL('http://127.0.0.1:3000/dev/mailbox');
	return {
		url,
		request: new Request(url),
		locals: { user: user && { id: 'u', name: 'Someone', ...user }, session: null },
		fetch
	} as unknown as Parameters<typeof load>[0];
}

async function outcome(run: () => unknown) {
	try {
		return { value: await run() };
	} catch (e) {
		return { thrown: e };
	}
}

beforeAll(async () => {
	standIn = await startMailStandIn({ host: '127.0.0.1', smtpPort: 0, httpPort: 0 });
	const transport = nodemailer.createTransport(`smtp://127.0.0.1:${standIn.smtpPort}`);
	await transport.sendMail({ from: 'app@example.test', to: alice, subject: 'Reset for Alice', text: 'http://127.0.0.1:3000/reset/alice-token' });
	await transport.sendMail({ from: 'app@example.test', to: bob, subject: 'Reset for Bob', text: 'http://127.0.0.1:3000/reset/bob-token' });
	delete process.env.SOCKET_PATH;
	process.env.MAILBOX_URL = `http://127.0.0.1:${standIn.httpPort}`;
});

afterAll(async () => {
	await standIn?.close();
	for (const [k, v] of Object.entries(saved)) {
		if (v === undefined) delete process.env[k];
		else process.env[k] = v;
	}
});

describe('dev mailbox page', () => {
	it('shows a signed-in user only the mail addressed to them', async () => {
		process.env.HOST = '127.0.0.1';
		// The stand-in itself holds both messages; the page must pick.
		const all = (await (await fetch(`${process.env.MAILBOX_URL}/messages`)).json()) as { to: string[] }[];
		expect(all.map((m) => m.to[0]).sort()).toEqual([alice, bob]);

		const forBob = (await load(event({ email: 'Bob-Mailbox@example.test' }))) as Loaded;
		expect(forBob.messages).toHaveLength(1);
		expect(forBob.messages[0]).toMatchObject({ to: [bob], subject: 'Reset for Bob', text: 'http://127.0.0.1:3000/reset/bob-token\n' });

		const forAlice = (await load(event({ email: alice }))) as Loaded;
		expect(forAlice.messages.map((m) => m.subject)).toEqual(['Reset for Alice']);

		const forCarol = (await load(event({ email: 'carol-mailbox@example.test' }))) as Loaded;
		expect(forCarol.messages).toEqual([]);
	});

	it('sends a signed-out visitor to sign in, and shows nothing', async () => {
		process.env.HOST = '127.0.0.1';
		const { value, thrown } = await outcome(() => load(event(null)));
		expect(value).toBeUndefined();
		expect(isRedirect(thrown)).toBe(true);
		expect(thrown).toMatchObject({ status: 303, location: '/sign-in?redirectTo=%2Fdev%2Fmailbox' });
	});

	it('answers 404 when the app listens beyond loopback, even to a signed-in user', async () => {
		for (const host of ['0.0.0.0', '192.168.1.20']) {
			process.env.HOST = host;
			const { value, thrown } = await outcome(() => load(event({ email: alice })));
			expect(value).toBeUndefined();
			expect(isHttpError(thrown, 404)).toBe(true);
		}
		delete process.env.HOST;
		const { thrown } = await outcome(() => load(event({ email: alice })));
		expect(isHttpError(thrown, 404)).toBe(true);
	});

	it('answers 404 when mail goes to a real relay', async () => {
		process.env.HOST = '127.0.0.1';
		const reader = process.env.MAILBOX_URL;
		delete process.env.MAILBOX_URL;
		const { thrown } = await outcome(() => load(event({ email: alice })));
		process.env.MAILBOX_URL = reader;
		expect(isHttpError(thrown, 404)).toBe(true);
	});
});
