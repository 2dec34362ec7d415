// Whether the database answers, for /health: load balancers and the start script poll it.
import type { Knex } from 'knex';
import { db } from './db';

export interface Health {
	ok: boolean;
	database: 'up' | 'down';
}

/**
 * Runs `select 1`, giving up after timeoutMs. A stopped server fails at once, but a pool waiting
 * for a free connection (or a hung network) would otherwise hold the probe for a minute.
 */
export async function checkHealth(knex: Knex = db(), timeoutMs = 2000): Promise<Health> {
	let timer: NodeJS.Timeout | undefined;
	const gaveUp = new Promise<false>((resolve) => (timer = setTimeout(() => resolve(false), timeoutMs)));
	const answered = knex
		.raw('select 1 as one')
		.then((r: { rows?: { one: number }[] }) => r.rows?.[0]?.one === 1)
		.catch(() => false);
	try {
		const up = await Promise.race([answered, gaveUp]);
		return { ok: up, database: up ? 'up' : 'down' };
	} finally {
		clearTimeout(timer);
	}
}
