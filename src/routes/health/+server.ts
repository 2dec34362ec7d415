import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { db } from '$lib/server/db';

// Load balancers and the start script poll this; it touches the database so a dead pool shows.
export const GET: RequestHandler = async () => {
	await db().raw('select 1');
	return json({ ok: true });
};
