// Local stand-in for an SMTP relay: accepts every message on 127.0.0.1 and keeps it in memory,
// readable as JSON over HTTP for the dev mailbox page and for tests. Never relays anything.
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import http from 'node:http';
import { randomUUID } from 'node:crypto';
// The message shape is the app's; the stand-in only fills it in.
import type { CapturedMessage } from '../../src/lib/mailbox';

const KEEP = 500;

export async function startMailStandIn(opts: { host: string; smtpPort: number; httpPort: number }) {
	const messages: CapturedMessage[] = [];

	const smtp = new SMTPServer({
		authOptional: true,
		disabledCommands: ['STARTTLS'],
		banner: 'Stripwright local mail stand-in',
		logger: false,
		onData(stream, session, callback) {
			simpleParser(stream)
				.then((mail) => {
					messages.unshift({
						id: randomUUID(),
						receivedAt: new Date().toISOString(),
						from: mail.from?.text || (session.envelope.mailFrom ? session.envelope.mailFrom.address : ''),
						to: session.envelope.rcptTo.map((r) => r.address),
						subject: mail.subject ?? '',
						text: mail.text ?? '',
						html: typeof mail.html === 'string' ? mail.html : null,
						attachments: mail.attachments.map((a) => ({
							filename: a.filename ?? 'attachment',
							contentType: a.contentType,
							size: a.size,
							base64: a.content.toString('base64')
						}))
					});
					messages.length = Math.min(messages.length, KEEP);
					callback();
				})
				.catch((e: Error) => callback(e));
		}
	});

	const api = http.createServer((req, res) => {
		const url = new URL(req.url ?? '/', 'http://x');
		const send = (status: number, body: unknown) => {
			res.writeHead(status, { 'content-type': 'application/json' });
			res.end(JSON.stringify(body));
		};
		if (req.method === 'GET' && url.pathname === '/messages') {
			const to = url.searchParams.get('to')?.toLowerCase();
			return send(200, to ? messages.filter((m) => m.to.some((a) => a.toLowerCase() === to)) : messages);
		}
		const one = url.pathname.match(/^\/messages\/([0-9a-f-]{36})$/);
		if (req.method === 'GET' && one) {
			const m = messages.find((x) => x.id === one[1]);
			return m ? send(200, m) : send(404, { error: { code: 'not_found', message: 'No such message' } });
		}
		if (req.method === 'DELETE' && url.pathname === '/messages') {
			messages.length = 0;
			return send(200, { ok: true });
		}
		send(404, { error: { code: 'not_found', message: 'Unknown path' } });
	});

	await new Promise<void>((resolve, reject) => {
		smtp.once('error', reject);
		smtp.listen(opts.smtpPort, opts.host, () => resolve());
	});
	await new Promise<void>((resolve, reject) => {
		api.once('error', reject);
		api.listen(opts.httpPort, opts.host, () => resolve());
	});
	// Port 0 picks a free port; callers (tests) learn which from here.
	const portOf = (server: { address(): unknown }) => (server.address() as { port: number }).port;
	return {
		smtpPort: portOf(smtp.server),
		httpPort: portOf(api),
		close: async () => {
			await new Promise<void>((r) => smtp.close(() => r()));
			await new Promise<void>((r) => api.close(() => r()));
		}
	};
}
