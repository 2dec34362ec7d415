// The PostgreSQL-backed job queue (pg-boss). The app only sends jobs; worker processes
// (scripts/worker.ts, one or many, on any machine that reaches the database) work them.
import PgBoss from 'pg-boss';

export const YIELD_IMPORT_QUEUE = 'yield-import';

let sender: Promise<PgBoss> | undefined;

function connectionString(): string {
	const url = process.env.DATABASE_URL;
	if (!url) throw new Error('DATABASE_URL is not set: the job queue lives in the app\u2019s database.');
	return url;
}

async function startBoss(options: { supervise: boolean; max: number }): Promise<PgBoss> {
	const boss = new PgBoss({ connectionString: connectionString(), schema: 'pgboss', supervise: options.supervise, schedule: false, max: options.max });
	boss.on('error', (e) => console.error('job queue:', e));
	await boss.start();
	await boss.createQueue(YIELD_IMPORT_QUEUE, { name: YIELD_IMPORT_QUEUE, retryLimit: 0, expireInSeconds: 15 * 60 });
	return boss;
}

/** The app's handle for sending jobs (started once, without maintenance: workers do that). */
function senderBoss(): Promise<PgBoss> {
	if (!sender) {
		// adapter-node emits this after a graceful stop: an open queue pool would keep the process alive.
		process.once('sveltekit:shutdown', () => void closeJobs());
	}
	sender ??= startBoss({ supervise: false, max: 2 }).catch((e) => {
		sender = undefined;
		throw e;
	});
	return sender;
}

/** Queues a yield file for a worker. */
export async function queueYieldImport(importId: string): Promise<void> {
	const boss = await senderBoss();
	await boss.send(YIELD_IMPORT_QUEUE, { importId }, { retryLimit: 0 });
}

export interface RunningWorker {
	stop(): Promise<void>;
}

/**
 * Works the yield-import queue in this process until stopped: one file at a time per worker,
 * polling every second. Start as many worker processes as the load needs.
 */
export async function startYieldWorker(work: (importId: string) => Promise<void>, options: { pollingIntervalSeconds?: number } = {}): Promise<RunningWorker> {
	const boss = await startBoss({ supervise: true, max: 4 });
	await boss.work<{ importId: string }>(YIELD_IMPORT_QUEUE, { batchSize: 1, pollingIntervalSeconds: options.pollingIntervalSeconds ?? 1 }, async (jobs) => {
		for (const job of jobs) await work(job.data.importId);
	});
	return { stop: () => boss.stop({ graceful: true, wait: true, timeout: 20_000 }) };
}

/** Stops the app's sender (tests, shutdown). */
export async function closeJobs(): Promise<void> {
	const s = sender;
	sender = undefined;
	if (s) await (await s).stop({ graceful: false, wait: true, close: true }).catch(() => {});
}
