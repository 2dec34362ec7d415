// The SMTP relay down: the mail is kept and sent again once the relay is back; nothing is lost.
import { afterAll, describe, expect, it } from 'vitest';
import net from 'node:net';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import { db } from '$lib/server/db';
import { retryDelayMinutes, retryQueuedMail, sendMail } from '$lib/server/mail';
import './helpers';

const savedUrl = process.env.SMTP_URL;
afterAll(() => {
	process.env.SMTP_URL = savedUrl;
});

async function freePort(): Promise<number> {
	return new Promise((resolve) => {
		const s = net.createServer();
		s.listen(0, '127.0.0.1', () => {
			const { port } = s.address() as net.AddressInfo;
			s.close(() => resolve(port));
		});
	});
}

describe('mail outbox', () => {
	it('keeps a mail the relay refused and delivers it, attachment and all, once the relay answers', async () => {
		const port = await freePort();
		process.env.SMTP_URL = `smtp://127.0.0.1:${port}`; // nothing listens there yet
		const to = `outbox-${Date.now()}@example.test`;
		const outcome = await sendMail({ to, subject: 'Seeding sheet', text: 'Body kept', attachments: [{ filename: 'a.pdf', content: Buffer.from('%PDF-1.4 test'), contentType: 'application/pdf' }] });
		expect(outcome).toEqual({ sent: false, queued: true, retryMinutes: 1 });
		const row = await db()('mail_outbox').where({ to }).first();
		expect(row).toMatchObject({ subject: 'Seeding sheet', attempts: 1, sent_at: null });
		expect(row.last_error).toMatch(/ECONNREFUSED/);

		// Not due yet: nothing is tried.
		expect(await retryQueuedMail(new Date())).toBe(0);

		const received: { to: string; subject: string; text: string; attachment: string }[] = [];
		const server = new SMTPServer({
			authOptional: true,
			disabledCommands: ['STARTTLS'],
			onData(stream, _session, done) {
				simpleParser(stream).then((m) => {
					received.push({ to: (m.to as { text: string }).text, subject: m.subject ?? '', text: (m.text ?? '').trim(), attachment: m.attachments[0]?.content.toString() ?? '' });
					done();
				}, done);
			}
		});
		await new Promise<void>((resolve) => server.listen(port, '127.0.0.1', resolve));
		try {
			const later = new Date(Date.now() + 61_000);
			expect(await retryQueuedMail(later)).toBeGreaterThanOrEqual(1);
			expect(received.filter((m) => m.to === to)).toEqual([{ to, subject: 'Seeding sheet', text: 'Body kept', attachment: '%PDF-1.4 test' }]);
			const after = await db()('mail_outbox').where({ to }).first();
			expect(after.sent_at).not.toBeNull();
			// Sent once only.
			await retryQueuedMail(new Date(Date.now() + 3_600_000));
			expect(received.filter((m) => m.to === to)).toHaveLength(1);
		} finally {
			await new Promise<void>((resolve) => server.close(() => resolve()));
		}
	});

	it('waits longer after each failed try, at most an hour', () => {
		expect([1, 2, 3, 4, 7, 8, 20].map(retryDelayMinutes)).toEqual([1, 2, 4, 8, 60, 60, 60]);
	});

	it('a failed retry moves the next try out', async () => {
		process.env.SMTP_URL = `smtp://127.0.0.1:${await freePort()}`;
		const to = `outbox-retry-${Date.now()}@example.test`;
		await sendMail({ to, subject: 'Again', text: 'x' });
		const now = new Date(Date.now() + 61_000);
		expect(await retryQueuedMail(now)).toBe(0);
		const row = await db()('mail_outbox').where({ to }).first();
		expect(row.attempts).toBe(2);
		expect(new Date(row.next_attempt_at).getTime()).toBe(now.getTime() + 2 * 60_000);
	});
});
