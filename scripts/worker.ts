// Works the background job queue (yield-monitor files) until stopped. `scripts/serve.ts` starts one
// beside the app; more can run on other machines with the same DATABASE_URL.
import { startYieldWorker } from '../src/lib/server/jobs.ts';
import { processYieldImport } from '../src/lib/server/yield-import.ts';
import { closeDb } from '../src/lib/server/db.ts';

const worker = await startYieldWorker(processYieldImport);
console.log(`▸ Worker started (pid ${process.pid}).`);

let stopping = false;
async function stop() {
	if (stopping) return;
	stopping = true;
	await worker.stop().catch((e) => console.error('worker stop:', e));
	await closeDb();
	process.exit(0);
}
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
