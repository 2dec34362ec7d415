import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { mailboxUrl } from '$lib/server/mail';
import type { CapturedMessage } from '../../../../scripts/stand-ins/smtp';

// Only exists while e-mail goes to the local stand-in; in production SMTP_URL points elsewhere.
export const load: PageServerLoad = async ({ fetch, url }) => {
	const base = mailboxUrl();
	if (!base) error(404, { message: 'The dev mailbox is only there when the local e-mail stand-in is in use.', code: 'not_found' });
	const res = await fetch(`${base}/messages`);
	const messages = (await res.json()) as CapturedMessage[];
	const selected = url.searchParams.get('id');
	return {
		messages: messages.map((m) => ({ id: m.id, receivedAt: m.receivedAt, to: m.to, subject: m.subject, text: m.text, attachments: m.attachments.map((a) => ({ filename: a.filename, size: a.size })) })),
		selected
	};
};
