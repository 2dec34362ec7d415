import type { LayoutServerLoad } from './$types';
import { devMailboxUrl } from '$lib/server/dev-mailbox';

export const load: LayoutServerLoad = ({ locals }) => ({
	// Only what the pages need; never the whole user row.
	user: locals.user ? { id: locals.user.id, name: locals.user.name, email: locals.user.email } : null,
	mailbox: locals.user !== null && devMailboxUrl() !== null,
	map: { tileUrl: process.env.TILE_URL || null, attribution: process.env.TILE_ATTRIBUTION || '' }
});
