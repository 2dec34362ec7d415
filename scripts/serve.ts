// Starts the local stand-ins (unless real services are configured) and the built app, then waits,
// starting the app again if it stops on its own. Ctrl-C (SIGINT) or SIGTERM stops everything this
// process started.
import { spawn, type ChildProcess } from 'node:child_process';
import net from 'node:net';
import { startMailStandIn } from './stand-ins/smtp.ts';
import { startTileStandIn } from './stand-ins/tiles.ts';

const host = process.env.HOST ?? '127.0.0.1';
const port = Number(process.env.PORT ?? 3000);
const smtpPort = Number(process.env.SMTP_STANDIN_PORT ?? 2525);
const mailboxPort = Number(process.env.MAILBOX_STANDIN_PORT ?? 2526);
const tilePort = Number(process.env.TILE_STANDIN_PORT ?? 8088);
const quiet = process.env.SERVE_QUIET === '1';

function portFree(p: number): Promise<boolean> {
	return new Promise((resolve) => {
		const s = net.createServer();
		s.once('error', () => resolve(false));
		s.listen(p, host, () => s.close(() => resolve(true)));
	});
}

async function requirePort(p: number, what: string, variable: string) {
	if (!(await portFree(p))) {
		console.error(`✗ Port ${p} (${what}) on ${host} is taken by another program.`);
		console.error(`  Stop that program, or choose another port, e.g. ${variable}=${p + 10} npm start`);
		process.exit(1);
	}
}

const env: NodeJS.ProcessEnv = { ...process.env, HOST: host, PORT: String(port) };
env.ORIGIN ??= `http://${host}:${port}`;
// The largest body the app takes is a scouting upload of 4 photos of up to 15 MB each; every
// upload path enforces its own smaller limit (boundaries 10 MB, yield files 11 MB) with a clear message.
env.BODY_SIZE_LIMIT ??= '61M';
const closers: (() => Promise<void>)[] = [];

await requirePort(port, 'the web app', 'PORT');
if (!process.env.SMTP_URL) {
	await requirePort(smtpPort, 'the local SMTP stand-in', 'SMTP_STANDIN_PORT');
	await requirePort(mailboxPort, 'the local mailbox reader', 'MAILBOX_STANDIN_PORT');
	const mail = await startMailStandIn({ host: '127.0.0.1', smtpPort, httpPort: mailboxPort });
	closers.push(mail.close);
	env.SMTP_URL = `smtp://127.0.0.1:${smtpPort}`;
	env.MAILBOX_URL = `http://127.0.0.1:${mailboxPort}`;
}
if (!process.env.TILE_URL) {
	await requirePort(tilePort, 'the local map-tile stand-in', 'TILE_STANDIN_PORT');
	const tiles = await startTileStandIn({ host: '127.0.0.1', port: tilePort });
	closers.push(tiles.close);
	env.TILE_URL = `http://127.0.0.1:${tilePort}/{z}/{x}/{y}.svg`;
	env.TILE_ATTRIBUTION ??= 'Local grid (no imagery)';
}

// The app runs as a child that is started again whenever it stops on its own, so one crash does
// not take the database and the stand-ins down with it. Waits double from 1 s up to 30 s while it
// keeps failing, and start again at 1 s once it has stayed up for a minute.
const RESTART_FIRST_MS = 1000;
const RESTART_MAX_MS = 30_000;
const HEALTHY_AFTER_MS = 60_000;

let app: ChildProcess;
let startedAt = 0;
let restartDelay = RESTART_FIRST_MS;
let restartTimer: NodeJS.Timeout | undefined;
let stopping = false;

function startApp() {
	restartTimer = undefined;
	startedAt = Date.now();
	app = spawn(process.execPath, ['build/index.js'], { env, stdio: ['ignore', 'inherit', 'inherit'] });
	// Tests and operators find the process to watch (or kill) by this line.
	console.log(`▸ App started (pid ${app.pid}).`);
	app.on('exit', (code, signal) => {
		if (stopping) return;
		if (Date.now() - startedAt >= HEALTHY_AFTER_MS) restartDelay = RESTART_FIRST_MS;
		const why = signal ? `killed by ${signal}` : `exit code ${code}`;
		console.error(`✗ The app stopped (${why}); starting it again in ${restartDelay / 1000} s. PostgreSQL and the stand-ins keep running.`);
		restartTimer = setTimeout(startApp, restartDelay);
		restartDelay = Math.min(restartDelay * 2, RESTART_MAX_MS);
	});
}
startApp();

// The background worker (yield-monitor files) runs beside the app and is started again if it stops.
// More workers may run on other machines against the same database.
let worker: ChildProcess;
function startWorker() {
	worker = spawn(process.execPath, ['--import', 'tsx', 'scripts/worker.ts'], { env, stdio: ['ignore', 'inherit', 'inherit'] });
	worker.on('exit', (code, signal) => {
		if (stopping) return;
		console.error(`✗ The worker stopped (${signal ?? `exit code ${code}`}); starting it again in 5 s.`);
		setTimeout(() => stopping || startWorker(), 5000);
	});
}
startWorker();

async function stop(code: number) {
	if (stopping) return;
	stopping = true;
	clearTimeout(restartTimer);
	const running = app.exitCode === null && app.signalCode === null;
	const exited = new Promise<void>((resolve) => (running ? app.once('exit', () => resolve()) : resolve()));
	if (running) app.kill('SIGTERM');
	const workerRunning = worker.exitCode === null && worker.signalCode === null;
	const workerExited = new Promise<void>((resolve) => (workerRunning ? worker.once('exit', () => resolve()) : resolve()));
	if (workerRunning) worker.kill('SIGTERM');
	await Promise.all(closers.map((c) => c().catch(() => {})));
	// Give the app a moment to finish requests in flight, then make sure it is gone.
	await Promise.race([Promise.all([exited, workerExited]), new Promise((r) => setTimeout(r, 5000))]);
	if (app.exitCode === null && app.signalCode === null) app.kill('SIGKILL');
	if (worker.exitCode === null && worker.signalCode === null) worker.kill('SIGKILL');
	process.exit(code);
}
process.on('SIGINT', () => stop(0));
process.on('SIGTERM', () => stop(0));

// Wait until the app answers, then say where it is.
for (let i = 0; i < 100; i++) {
	try {
		const r = await fetch(`http://${host}:${port}/health`);
		if (r.ok) break;
	} catch {
		/* not up yet */
	}
	await new Promise((r) => setTimeout(r, 200));
}
if (!quiet) {
	console.log(`
  Stripwright is running at  http://${host}:${port}
  Demo sign-in:              owner@demo.stripwright.test  /  stripwright-demo
                             (also manager@, crew@, advisor@, viewer@ — same domain and password)
  Mailbox (local SMTP):      ${env.MAILBOX_URL ? `http://${host}:${port}/dev/mailbox` : 'off (SMTP_URL is set)'}
  Map tiles:                 ${process.env.TILE_URL ? 'from TILE_URL' : `local grid stand-in on 127.0.0.1:${tilePort}`}
  Press Ctrl-C to stop; the data is kept.
`);
}
