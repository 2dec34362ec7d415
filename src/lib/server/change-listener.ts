// Listens for the changes other processes commit to the tables the short-lived caches are built
// from (sessions, users, plans, plan lanes, fields, farms; announced by database triggers), so a
// session ended or a plan saved through one app server is never answered from another's cache.
// While the listening connection is down, the caches answer nothing and every read goes to the
// database; on reconnecting they start empty.
import pg from 'pg';
import { changedElsewhere, setCrossProcess } from './watched-cache';

export const CHANGE_CHANNEL = 'stripwright_changes';

let client: pg.Client | undefined;
let stopped = false;
let retryMs = 1000;
let retryTimer: NodeJS.Timeout | undefined;

async function connect(url: string) {
	const c = new pg.Client({ connectionString: url });
	client = c;
	const lost = () => {
		if (client !== c) return;
		client = undefined;
		setCrossProcess('lost');
		c.removeAllListeners();
		c.on('error', () => {});
		c.end().catch(() => {});
		if (stopped) return;
		retryTimer = setTimeout(() => connect(url), retryMs);
		retryTimer.unref();
		retryMs = Math.min(retryMs * 2, 30_000);
	};
	c.on('error', lost);
	c.on('end', lost);
	c.on('notification', (n) => {
		if (n.channel === CHANGE_CHANNEL && n.payload) changedElsewhere(n.payload);
	});
	try {
		await c.connect();
		await c.query(`listen ${CHANGE_CHANNEL}`);
		if (client !== c) return;
		retryMs = 1000;
		setCrossProcess('connected');
	} catch {
		lost();
	}
}

/** Starts listening (once per process); the caches answer nothing until the first connection is made. */
export function startChangeListener(url = process.env.DATABASE_URL) {
	if (client || retryTimer || !url) return;
	stopped = false;
	setCrossProcess('lost');
	void connect(url);
}

/** Stops listening; the caches go back to what this process sees of its own writes. */
export async function stopChangeListener() {
	stopped = true;
	clearTimeout(retryTimer);
	retryTimer = undefined;
	const c = client;
	client = undefined;
	setCrossProcess('off');
	if (c) {
		c.removeAllListeners();
		c.on('error', () => {});
		await c.end().catch(() => {});
	}
}

/** Whether the listening connection is up (for tests and health checks). */
export function listening(): boolean {
	return !!client && !stopped;
}
