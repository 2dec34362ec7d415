// HTTP speed of the built app against a bare node:http server sending the same bytes, in one run.
// Run: npm run bench:http
//   BENCH_SECONDS (5) per target and server, BENCH_CONNECTIONS (10), BENCH_BUILD=always|never|auto (auto).
// It uses the private PostgreSQL cluster (scripts/env.sh) with a database of its own, stripwright_bench,
// dropped, migrated and seeded on every run, plus a one-mile section field with a 264-lane plan made
// through the app's JSON API. The app is built (under the e2e lock, since builds share .svelte-kit)
// when build/ is missing or older than the sources, copied to .data/bench-app so a later build
// cannot change it mid-run, and served on a spare port of 127.0.0.1. Everything it starts it stops.
import autocannon from 'autocannon';
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { rectangleField, travel } from './bench/fields';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const HOST = '127.0.0.1';
const SECONDS = Number(process.env.BENCH_SECONDS ?? 5);
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 10);
const BUILD = process.env.BENCH_BUILD ?? 'auto';
const DATABASE = 'stripwright_bench';
const E2E_LOCK = '/tmp/stripwright-e2e.lock';

interface Captured {
	path: string;
	contentType: string;
	body: Buffer;
}

/** Bare server mode: a child process that answers each captured path with its bytes. */
function serveBare(file: string) {
	const entries = JSON.parse(readFileSync(file, 'utf8')) as { path: string; contentType: string; body: string }[];
	const byPath = new Map(entries.map((e) => [e.path, { contentType: e.contentType, body: Buffer.from(e.body, 'base64') }]));
	const server = http.createServer((req, res) => {
		const hit = byPath.get(req.url ?? '');
		if (!hit) {
			res.writeHead(404).end();
			return;
		}
		res.writeHead(200, { 'content-type': hit.contentType, 'content-length': hit.body.length }).end(hit.body);
	});
	server.listen(0, HOST, () => process.send?.({ port: (server.address() as net.AddressInfo).port }));
	process.on('SIGTERM', () => process.exit(0));
}

const children: ChildProcess[] = [];
let stopCluster: (() => void) | null = null;
let tempDir: string | null = null;

function cleanUp() {
	for (const c of children) if (c.exitCode === null && c.signalCode === null) c.kill('SIGTERM');
	if (tempDir) rmSync(tempDir, { recursive: true, force: true });
	tempDir = null;
	stopCluster?.();
	stopCluster = null;
}
process.on('SIGINT', () => {
	cleanUp();
	process.exit(130);
});
process.on('SIGTERM', () => {
	cleanUp();
	process.exit(143);
});

function step(message: string) {
	console.log(`▸ ${message}`);
}

function run(command: string, args: string[], env: NodeJS.ProcessEnv = process.env): string {
	const r = spawnSync(command, args, { cwd: ROOT, env, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
	if (r.status !== 0) throw new Error(`${command} ${args.join(' ')} failed (exit ${r.status}):\n${r.stdout}\n${r.stderr}`);
	return r.stdout;
}

/** The private cluster, started if needed, and a freshly dropped and created bench database. */
function prepareCluster(): string {
	const out = run('bash', [
		'-c',
		`set -e; source scripts/env.sh; ensure_postgres_installed; start_cluster >&2; ensure_database ${DATABASE} fresh;
		 echo "BENCH_URL=$(database_url ${DATABASE})"; echo "BENCH_STARTED=$PG_STARTED_HERE"`
	]);
	const url = /^BENCH_URL=(.+)$/m.exec(out)?.[1];
	if (!url) throw new Error(`Could not read the database address from scripts/env.sh:\n${out}`);
	if (/^BENCH_STARTED=1$/m.test(out)) {
		stopCluster = () => spawnSync('bash', ['-c', 'source scripts/env.sh; find_pg_bin; choose_data_dir; stop_cluster'], { cwd: ROOT });
	}
	return url;
}

function newestMtime(p: string): number {
	const s = statSync(p);
	if (!s.isDirectory()) return s.mtimeMs;
	return readdirSync(p).reduce((m, name) => Math.max(m, newestMtime(path.join(p, name))), s.mtimeMs);
}

/** Builds when asked or stale, then copies the build so concurrent builds cannot swap it mid-run. */
function prepareBuild(): string {
	const target = path.join(ROOT, '.data/bench-app');
	const built = path.join(ROOT, 'build/index.js');
	const sources = ['src', 'svelte.config.js', 'vite.config.ts', 'package.json', 'tailwind.config.js', 'postcss.config.js']
		.map((p) => path.join(ROOT, p))
		.filter(existsSync);
	const stale = BUILD === 'always' || !existsSync(built) || (BUILD !== 'never' && sources.some((s) => newestMtime(s) > statSync(built).mtimeMs));
	if (stale) step('building the app (build/ is missing or older than the sources)');
	const script = `
		set -e
		if [ "$BENCH_STALE" = 1 ]; then npx vite build --logLevel error >/tmp/stripwright-bench-build.log 2>&1 || { cat /tmp/stripwright-bench-build.log >&2; exit 1; }; fi
		[ -f build/index.js ] || { echo "build/index.js is missing" >&2; exit 1; }
		rm -rf "$BENCH_TARGET"; mkdir -p "$(dirname "$BENCH_TARGET")"; cp -r build "$BENCH_TARGET"
	`;
	const env = { ...process.env, BENCH_STALE: stale ? '1' : '0', BENCH_TARGET: target };
	const r = spawnSync('flock', [E2E_LOCK, 'bash', '-c', script], { cwd: ROOT, env, stdio: ['ignore', 'inherit', 'inherit'] });
	if (r.status !== 0) throw new Error('The build failed; see above.');
	return target;
}

function sparePort(): Promise<number> {
	return new Promise((resolve, reject) => {
		const s = net.createServer();
		s.once('error', reject);
		s.listen(0, HOST, () => {
			const { port } = s.address() as net.AddressInfo;
			s.close(() => resolve(port));
		});
	});
}

async function waitUntilUp(origin: string, app: ChildProcess) {
	for (let i = 0; i < 200; i++) {
		if (app.exitCode !== null) throw new Error(`The app exited (code ${app.exitCode}) before answering.`);
		try {
			if ((await fetch(`${origin}/health`)).ok) return;
		} catch {
			// not listening yet
		}
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error('The app did not answer /health within 20 s.');
}

class Client {
	cookie = '';
	constructor(readonly origin: string) {}
	async request(method: string, p: string, body?: unknown): Promise<Response> {
		const res = await fetch(this.origin + p, {
			method,
			headers: { cookie: this.cookie, accept: 'application/json', ...(body ? { 'content-type': 'application/json' } : {}) },
			body: body ? JSON.stringify(body) : undefined,
			redirect: 'manual'
		});
		const set = res.headers.getSetCookie().map((c) => c.split(';')[0]);
		if (set.length) this.cookie = set.join('; ');
		return res;
	}
	async json<T>(method: string, p: string, body?: unknown): Promise<T> {
		const res = await this.request(method, p, body);
		const text = await res.text();
		if (!res.ok) throw new Error(`${method} ${p} answered ${res.status}: ${text.slice(0, 500)}`);
		return JSON.parse(text) as T;
	}
}

interface PlanJson {
	id: string;
	season: number;
	version: number;
	adopted: boolean;
	lanes: unknown[];
}

/** The demo's 63-lane plan and a new 264-lane plan on a one-mile section; paths of every target. */
async function makeTargets(client: Client) {
	await client.json('POST', '/api/session', { email: 'owner@demo.stripwright.test', password: 'stripwright-demo' });
	const farms = await client.json<{ id: string; name: string }[]>('GET', '/api/farms');
	const farmId = farms[0].id;
	const fields = await client.json<{ id: string; name: string }[]>('GET', `/api/farms/${farmId}/fields`);
	let demo: { fieldId: string; season: number; lanes: number } | null = null;
	for (const f of fields) {
		const plans = await client.json<{ season: number; adopted: boolean }[]>('GET', `/api/farms/${farmId}/fields/${f.id}/plans`);
		for (const p of plans.filter((p) => p.adopted)) {
			const plan = await client.json<PlanJson>('GET', `/api/farms/${farmId}/fields/${f.id}/plans/${p.season}`);
			if (plan.lanes.length === 63) demo = { fieldId: f.id, season: p.season, lanes: 63 };
		}
		if (demo) break;
	}
	if (!demo) throw new Error('No adopted 63-lane plan in the demo data.');

	// One mile square (5,280 ft), 8-row corn and soybean strips on 30-in rows: 264 lanes of 20 ft.
	const sw: [number, number] = [-94.35, 44.1];
	const section = await client.json<{ id: string }>('POST', `/api/farms/${farmId}/fields`, { name: 'Bench section', boundary: rectangleField(sw, 5280, 5280) });
	const strip = (crop: string) => ({ kind: 'crop', crop, rows: 8, rowSpacingIn: 30 });
	const big = await client.json<PlanJson>('PUT', `/api/farms/${farmId}/fields/${section.id}/plans/2027`, {
		version: 0,
		variant: 'main',
		guidance: { a: sw, b: travel(sw, 0, 5280) },
		pattern: [strip('corn'), strip('soybean')],
		offsetFt: 0,
		headlandFt: 0,
		assignments: []
	});
	const planPath = (fieldId: string, season: number) => `/api/farms/${farmId}/fields/${fieldId}/plans/${season}`;
	return {
		demoLanes: demo.lanes,
		bigLanes: big.lanes.length,
		targets: [
			{ name: `plan JSON, ${demo.lanes} lanes`, path: planPath(demo.fieldId, demo.season) },
			{ name: `lanes.geojson, ${demo.lanes} lanes`, path: `${planPath(demo.fieldId, demo.season)}/lanes.geojson` },
			{ name: `plan JSON, ${big.lanes.length} lanes`, path: planPath(section.id, 2027) },
			{ name: `lanes.geojson, ${big.lanes.length} lanes`, path: `${planPath(section.id, 2027)}/lanes.geojson` },
			{ name: `plan page, ${demo.lanes} lanes`, path: `/farms/${farmId}/fields/${demo.fieldId}/plans/${demo.season}` },
			{ name: 'fields page', path: `/farms/${farmId}/fields` }
		]
	};
}

interface Measure {
	requestsPerSecond: number;
	p95Ms: number;
	errors: number;
}

/** autocannon for SECONDS; p95 from every response's own time (autocannon's table has no p95). */
async function measure(url: string, headers: Record<string, string>, seconds = SECONDS): Promise<Measure> {
	const times: number[] = [];
	let bad = 0;
	const instance = autocannon({ url, connections: CONNECTIONS, duration: seconds, headers });
	instance.on('response', (_client: unknown, status: number, _bytes: number, ms: number) => {
		if (status === 200) times.push(ms);
		else bad++;
	});
	const result = await instance;
	times.sort((a, b) => a - b);
	return {
		requestsPerSecond: times.length / seconds,
		p95Ms: times.length ? times[Math.min(times.length - 1, Math.ceil(times.length * 0.95) - 1)] : NaN,
		errors: bad + result.errors + result.timeouts
	};
}

async function startBare(captured: Captured[]): Promise<number> {
	tempDir = mkdtempSync(path.join(os.tmpdir(), 'stripwright-bench-'));
	const file = path.join(tempDir, 'bodies.json');
	writeFileSync(file, JSON.stringify(captured.map((c) => ({ path: c.path, contentType: c.contentType, body: c.body.toString('base64') }))));
	const bare = spawn(process.execPath, ['--import', 'tsx', fileURLToPath(import.meta.url)], {
		cwd: ROOT,
		env: { ...process.env, BENCH_BARE_FILE: file },
		stdio: ['ignore', 'inherit', 'inherit', 'ipc']
	});
	children.push(bare);
	return new Promise((resolve, reject) => {
		bare.once('message', (m: { port: number }) => resolve(m.port));
		bare.once('exit', (code) => reject(new Error(`The bare server exited (code ${code}).`)));
	});
}

function table(rows: string[][]): string {
	const widths = rows[0].map((_, i) => Math.max(...rows.map((r) => r[i].length)));
	return rows.map((r) => r.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('  ')).join('\n');
}

async function main() {
	step('database: private cluster, fresh stripwright_bench');
	const databaseUrl = prepareCluster();
	const dbEnv = { ...process.env, DATABASE_URL: databaseUrl };
	run('npm', ['run', '--silent', 'migrate'], dbEnv);
	run('npm', ['run', '--silent', 'seed'], dbEnv);

	step(`app build (BENCH_BUILD=${BUILD})`);
	const appDir = prepareBuild();
	const port = await sparePort();
	const origin = `http://${HOST}:${port}`;
	step(`starting the built app on ${origin}`);
	const app = spawn(process.execPath, [path.join(appDir, 'index.js')], {
		cwd: ROOT,
		env: { ...dbEnv, HOST, PORT: String(port), ORIGIN: origin, NODE_ENV: 'production', SMTP_URL: 'smtp://127.0.0.1:9', TILE_URL: '' },
		stdio: ['ignore', 'ignore', 'inherit']
	});
	children.push(app);
	await waitUntilUp(origin, app);

	const client = new Client(origin);
	step('signing in as the demo owner; laying out the 264-lane section plan');
	const { targets } = await makeTargets(client);

	// Capture each answer once: the bare server sends exactly these bytes.
	const captured: (Captured & { name: string })[] = [];
	for (const t of targets) {
		const res = await client.request('GET', t.path);
		if (res.status !== 200) throw new Error(`${t.path} answered ${res.status}`);
		captured.push({ name: t.name, path: t.path, contentType: res.headers.get('content-type') ?? 'application/octet-stream', body: Buffer.from(await res.arrayBuffer()) });
	}
	const barePort = await startBare(captured);
	const headers = { cookie: client.cookie, accept: 'application/json, text/html' };

	// Every target is warmed before any is measured: the first one measured would otherwise pay for
	// the app's start-up (compiling the shared request path, filling the pool, the database settling
	// after the seed), which says nothing about that target.
	step('warming every target for 1 s (not counted)');
	for (const c of captured) await measure(origin + c.path, headers, 1);

	const loadBefore = os.loadavg()[0];
	const rows = [['target', 'bytes', 'app req/s', 'app p95 ms', 'bare req/s', 'bare p95 ms', 'req/s ÷ bare', 'p95 ÷ bare']];
	for (const c of captured) {
		step(`measuring ${c.name} (${SECONDS} s each, ${CONNECTIONS} connections)`);
		await measure(origin + c.path, headers, 1); // warm-up, not counted
		await measure(`http://${HOST}:${barePort}${c.path}`, {}, 1);
		const ours = await measure(origin + c.path, headers);
		const bare = await measure(`http://${HOST}:${barePort}${c.path}`, {});
		if (ours.errors || bare.errors) console.warn(`  ! ${ours.errors} app and ${bare.errors} bare requests did not answer 200`);
		rows.push([
			c.name,
			c.body.length.toLocaleString('en-US'),
			ours.requestsPerSecond.toFixed(0),
			ours.p95Ms.toFixed(1),
			bare.requestsPerSecond.toFixed(0),
			bare.p95Ms.toFixed(1),
			`${(ours.requestsPerSecond / bare.requestsPerSecond).toFixed(3)}×`,
			`${(ours.p95Ms / bare.p95Ms).toFixed(1)}×`
		]);
	}
	// Other programs on the machine take turns with both servers: the 1-minute load says how busy it was.
	const load = `load average ${loadBefore.toFixed(1)} → ${os.loadavg()[0].toFixed(1)}`;
	console.log(`\n${os.cpus().length} cores, ${load}, Node ${process.version}, ${CONNECTIONS} connections, ${SECONDS} s per target\n`);
	console.log(table(rows));

	if (process.env.BENCH_FARM_MAP !== '0') {
		step('season map redraw in Chromium (scripts/bench-farm-map.ts; BENCH_FARM_MAP=0 skips it)');
		console.log(run(process.execPath, ['--import', 'tsx', 'scripts/bench-farm-map.ts'], { ...dbEnv, BENCH_BASE_URL: origin }));
	}
}

if (process.env.BENCH_BARE_FILE) {
	serveBare(process.env.BENCH_BARE_FILE);
} else {
	try {
		await main();
	} catch (e) {
		console.error(`✗ ${(e as Error).message}`);
		process.exitCode = 1;
	} finally {
		cleanUp();
	}
	process.exit();
}
