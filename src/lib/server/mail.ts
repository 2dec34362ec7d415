import nodemailer, { type Transporter } from 'nodemailer';
import { db } from './db';

const transports = new Map<string, Transporter>();

function transporter(): Transporter {
	const url = process.env.SMTP_URL;
	if (!url) throw new Error('SMTP_URL is not set: e-mail cannot be sent (see README.md).');
	let t = transports.get(url);
	if (!t) {
		// A relay that does not answer must not hold a request for nodemailer's default two minutes.
		const withTimeouts = new URL(url);
		for (const [k, v] of [['connectionTimeout', '5000'], ['greetingTimeout', '5000'], ['socketTimeout', '10000']]) {
			if (!withTimeouts.searchParams.has(k)) withTimeouts.searchParams.set(k, v);
		}
		transports.set(url, (t = nodemailer.createTransport(withTimeouts.toString())));
	}
	return t;
}

export function mailFrom(): string {
	return process.env.MAIL_FROM ?? 'Stripwright <no-reply@stripwright.test>';
}

export interface OutgoingMail {
	to: string;
	subject: string;
	text: string;
	attachments?: { filename: string; content: Buffer; contentType: string }[];
}

export type MailOutcome = { sent: true } | { sent: false; queued: true; retryMinutes: number };

/** Pause before the next try: 1, 2, 4 … minutes, at most an hour; given up after a day of tries. */
export const retryDelayMinutes = (attempts: number) => Math.min(60, 2 ** (attempts - 1));
const MAX_ATTEMPTS = 30;

async function deliver(mail: OutgoingMail) {
	await transporter().sendMail({ from: mailFrom(), ...mail });
}

/**
 * Sends now; when the relay does not take it, keeps the mail in the outbox to be sent again
 * (see {@link retryQueuedMail}) and says so, so the caller can tell the user instead of failing.
 */
export async function sendMail(mail: OutgoingMail): Promise<MailOutcome> {
	try {
		await deliver(mail);
		return { sent: true };
	} catch (e) {
		const retryMinutes = retryDelayMinutes(1);
		await db()('mail_outbox').insert({
			to: mail.to,
			subject: mail.subject,
			text: mail.text,
			attachments: JSON.stringify((mail.attachments ?? []).map((a) => ({ filename: a.filename, contentType: a.contentType, base64: a.content.toString('base64') }))),
			last_error: String((e as Error).message ?? e).slice(0, 500),
			next_attempt_at: new Date(Date.now() + retryMinutes * 60_000)
		});
		console.warn(`Mail to ${mail.to} not taken by the relay (${(e as Error).message}); kept in the outbox, next try in ${retryMinutes} min.`);
		return { sent: false, queued: true, retryMinutes };
	}
}

/**
 * Sends the outbox mail that is due. Rows are claimed with SKIP LOCKED, so several app instances can
 * run this at once without sending a mail twice. Returns how many went out.
 */
export async function retryQueuedMail(now = new Date()): Promise<number> {
	let sent = 0;
	for (;;) {
		const done = await db().transaction(async (trx) => {
			const row = await trx('mail_outbox')
				.whereNull('sent_at')
				.where('next_attempt_at', '<=', now)
				.where('attempts', '<', MAX_ATTEMPTS)
				.orderBy('next_attempt_at')
				.forUpdate()
				.skipLocked()
				.first();
			if (!row) return null;
			try {
				await deliver({
					to: row.to,
					subject: row.subject,
					text: row.text,
					attachments: (row.attachments as { filename: string; contentType: string; base64: string }[]).map((a) => ({ filename: a.filename, contentType: a.contentType, content: Buffer.from(a.base64, 'base64') }))
				});
				await trx('mail_outbox').where({ id: row.id }).update({ sent_at: trx.fn.now(), last_error: null });
				return 'sent';
			} catch (e) {
				const attempts = row.attempts + 1;
				await trx('mail_outbox').where({ id: row.id }).update({
					attempts,
					last_error: String((e as Error).message ?? e).slice(0, 500),
					next_attempt_at: new Date(now.getTime() + retryDelayMinutes(attempts) * 60_000)
				});
				return 'failed';
			}
		});
		if (done === null) return sent;
		if (done === 'sent') sent++;
	}
}

let timer: NodeJS.Timeout | undefined;

/** Starts the outbox loop of this process (every 30 s); safe to call more than once. */
export function startMailRetries(everyMs = 30_000) {
	timer ??= setInterval(() => {
		retryQueuedMail().catch((e) => console.warn(`Outbox: could not send queued mail (${(e as Error).message}).`));
	}, everyMs).unref();
}

/** The public address of the app, for links in e-mails. */
export function appOrigin(fallback: string): string {
	return process.env.ORIGIN ?? fallback;
}
