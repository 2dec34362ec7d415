import type { LayoutServerLoad } from './$types';
import { mailboxUrl } from '$lib/server/mail';

export const load: LayoutServerLoad = ({ locals }) => ({
	// Only what the pages need; never the whole user row.
	user: locals.user ? { id: locals.user.id, name: locals.user.name, email: locals.user.email } : null,
	mailbox: mailboxUrl() !== null,
	map: { tileUrl: process.env.TILE_URL || null, attribution: process.env.TILE_ATTRIBUTION || '' }
});
