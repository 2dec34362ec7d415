import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/access';
import { devMailboxUrl } from '$lib/server/dev-mailbox';
import type { CapturedMessage } from '$lib/mailbox';

// Only on a machine that serves itself to itself, and only the signed-in user's own mail:
// reset and invitation links are keys to accounts.
export const load: PageServerLoad = async (event) => {
	const base = devMailboxUrl();
	if (!base) error(404, { message: 'This page does not exist.', code: 'not_found' });
	const user = requireUser(event);
	const own = user.email.toLowerCase();
	const res = await event.fetch(`${base}/messages?to=${encodeURIComponent(own)}`);
	if (!res.ok) error(502, { message: 'The local e-mail stand-in did not answer; is it running?', code: 'mailbox_unavailable' });
	const messages = ((await res.json()) as CapturedMessage[]).filter((m) => m.to.some((a) => a.toLowerCase() === own));
	const selected = event.url.searchParams.get('id');
	return {
		email: user.email,
		messages: messages.map((m) => ({ id: m.id, receivedAt: m.receivedAt, to: m.to.filter((a) => a.toLowerCase() === own), subject: m.subject, text: m.text, attachments: m.attachments.map((a) => ({ filename: a.filename, size: a.size })) })),
		selected
	};
};
