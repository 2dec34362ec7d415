// Starts the local stand-ins (unless real services are configured) and the built app, then waits.
// Ctrl-C (SIGINT) or SIGTERM stops everything this process started.
import { spawn } from 'node:child_process';
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
// Boundary uploads may be up to 10 MB; the import code enforces that with a clear message.
env.BODY_SIZE_LIMIT ??= '12M';
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

const app = spawn(process.execPath, ['build/index.js'], { env, stdio: ['ignore', 'inherit', 'inherit'] });

let stopping = false;
async function stop(code: number) {
	if (stopping) return;
	stopping = true;
	const exited = new Promise<void>((resolve) => (app.exitCode !== null ? resolve() : app.once('exit', () => resolve())));
	app.kill('SIGTERM');
	await Promise.all(closers.map((c) => c().catch(() => {})));
	// Give the app a moment to finish requests in flight, then make sure it is gone.
	await Promise.race([exited, new Promise((r) => setTimeout(r, 5000))]);
	if (app.exitCode === null) app.kill('SIGKILL');
	process.exit(code);
}
process.on('SIGINT', () => stop(0));
process.on('SIGTERM', () => stop(0));
app.on('exit', (code) => {
	if (!stopping) {
		console.error(`✗ The app stopped (exit code ${code}).`);
		stop(code ?? 1);
	}
});

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
