// The start command's supervisor: a crashed app is started again while the stand-ins (and the
// database) keep running, and Ctrl-C still stops everything. Runs its own copy of scripts/serve.ts
// with the built app on free ports, beside the server the other specs use.
import { expect, test } from '@playwright/test';
import { spawn, type ChildProcess } from 'node:child_process';
import net from 'node:net';

async function freePort(): Promise<number> {
	return new Promise((resolve) => {
		const s = net.createServer();
		s.listen(0, '127.0.0.1', () => {
			const { port } = s.address() as net.AddressInfo;
			s.close(() => resolve(port));
		});
	});
}

function alive(pid: number): boolean {
	try {
		process.kill(pid, 0);
		return true;
	} catch {
		return false;
	}
}

async function health(port: number): Promise<{ status: number; body: unknown } | null> {
	try {
		const res = await fetch(`http://127.0.0.1:${port}/health`);
		return { status: res.status, body: await res.json() };
	} catch {
		return null;
	}
}

let serve: ChildProcess | undefined;
let appPidsSeen: number[] = [];
test.afterEach(async () => {
	// A failed run must not leave its copy of the app behind.
	if (serve && serve.exitCode === null && serve.signalCode === null) {
		serve.kill('SIGINT');
		await new Promise((r) => setTimeout(r, 3000));
	}
	for (const pid of appPidsSeen) if (alive(pid)) process.kill(pid, 'SIGKILL');
});

test('a killed app is started again within seconds, with a line saying why; the stand-ins keep serving; Ctrl-C stops all', async () => {
	test.setTimeout(90_000);
	const [port, smtp, mailbox, tiles] = [await freePort(), await freePort(), await freePort(), await freePort()];
	const env: NodeJS.ProcessEnv = { ...process.env, HOST: '127.0.0.1', PORT: String(port), SMTP_STANDIN_PORT: String(smtp), MAILBOX_STANDIN_PORT: String(mailbox), TILE_STANDIN_PORT: String(tiles), SERVE_QUIET: '1' };
	for (const v of ['SMTP_URL', 'MAILBOX_URL', 'TILE_URL', 'TILE_ATTRIBUTION', 'ORIGIN']) delete env[v];
	serve = spawn(process.execPath, ['--import', 'tsx', 'scripts/serve.ts'], { env, stdio: ['ignore', 'pipe', 'pipe'] });
	let out = '';
	serve.stdout!.on('data', (d) => (out += d));
	serve.stderr!.on('data', (d) => (out += d));
	const appPids = () => (appPidsSeen = [...out.matchAll(/▸ App started \(pid (\d+)\)\./g)].map((m) => Number(m[1])));

	await expect.poll(async () => (await health(port))?.status, { timeout: 30_000, message: 'the app answers /health' }).toBe(200);
	expect((await health(port))!.body).toEqual({ ok: true, database: 'up' });
	const [first] = appPids();
	expect(appPids()).toHaveLength(1);
	expect(alive(first)).toBe(true);

	process.kill(first, 'SIGKILL');
	await expect.poll(() => alive(first), { timeout: 5000 }).toBe(false);
	// While the app is down the supervisor and the map-tile stand-in are still there.
	const tile = await fetch(`http://127.0.0.1:${tiles}/3/2/1.svg`);
	expect(tile.status).toBe(200);
	expect(serve.exitCode).toBeNull();

	const downAt = Date.now();
	await expect.poll(async () => (await health(port))?.status, { timeout: 15_000, message: '/health answers again' }).toBe(200);
	expect(Date.now() - downAt).toBeLessThan(10_000);
	expect(out).toContain('✗ The app stopped (killed by SIGKILL); starting it again in 1 s. PostgreSQL and the stand-ins keep running.');
	const second = appPids()[1];
	expect(second).toBeGreaterThan(0);
	expect(second).not.toBe(first);

	// A second crash soon after waits twice as long.
	process.kill(second, 'SIGKILL');
	await expect.poll(() => appPids().length, { timeout: 15_000 }).toBe(3);
	expect(out).toContain('✗ The app stopped (killed by SIGKILL); starting it again in 2 s. PostgreSQL and the stand-ins keep running.');
	await expect.poll(async () => (await health(port))?.status, { timeout: 15_000 }).toBe(200);
	const third = appPids()[2];

	// Ctrl-C: the supervisor stops the app and the stand-ins and exits; nothing is started again.
	const exited = new Promise<number | null>((resolve) => serve!.once('exit', (code) => resolve(code)));
	serve.kill('SIGINT');
	expect(await exited).toBe(0);
	expect(alive(third)).toBe(false);
	expect(appPids()).toHaveLength(3);
	await expect(fetch(`http://127.0.0.1:${tiles}/3/2/1.svg`)).rejects.toThrow();
	expect(await health(port)).toBeNull();
});
