import nodemailer, { type Transporter } from 'nodemailer';

let transport: Transporter | undefined;

function transporter(): Transporter {
	const url = process.env.SMTP_URL;
	if (!url) throw new Error('SMTP_URL is not set: e-mail cannot be sent (see README.md).');
	transport ??= nodemailer.createTransport(url);
	return transport;
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

export async function sendMail(mail: OutgoingMail) {
	await transporter().sendMail({ from: mailFrom(), ...mail });
}

/** The public address of the app, for links in e-mails. */
export function appOrigin(fallback: string): string {
	return process.env.ORIGIN ?? fallback;
}
