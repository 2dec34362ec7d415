import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { checkHealth } from '$lib/server/health';

// 503 when the database does not answer, so a balancer stops sending users here.
export const GET: RequestHandler = async () => {
	const health = await checkHealth();
	return json(health, { status: health.ok ? 200 : 503, headers: { 'cache-control': 'no-store' } });
};
