// Heavy geometry (layouts, outline checks, boundary files) runs in a small pool of worker threads
// (piscina), each task under a time limit, so one big field never stalls other requests.
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { MessageChannel } from 'node:worker_threads';
import { Piscina } from 'piscina';
import { AppError } from './errors';
import { failureError, type GeometryTask, type TaskOutcome, type TaskResults } from './geometry-tasks';

const WORKER = join('src', 'lib', 'server', 'geometry-worker.mjs');

/**
 * The worker entry, found by walking up from this module to the project folder that holds it:
 * the same rule serves the source tree (vitest, Vite) and the built app, whose bundled chunks sit
 * under build/server/ in the same project.
 */
export function geometryWorkerPath(from = fileURLToPath(import.meta.url)): string {
	for (let dir = dirname(from); ; dir = dirname(dir)) {
		const candidate = join(dir, WORKER);
		if (existsSync(candidate)) return candidate;
		if (dirname(dir) === dir) throw new Error(`The geometry worker ${WORKER} was not found above ${from}.`);
	}
}

export interface GeometryPoolOptions {
	/** Longest one task may run, ms. */
	taskTimeoutMs: number;
	threads: number;
	/** Tasks that may wait for a thread before new ones are turned away. */
	maxQueue: number;
}

function defaults(): GeometryPoolOptions {
	const env = (name: string, fallback: number) => {
		const v = Number(process.env[name]);
		return Number.isFinite(v) && v > 0 ? v : fallback;
	};
	return {
		taskTimeoutMs: env('GEOMETRY_TASK_TIMEOUT_MS', 15_000),
		// Leave a core for the request thread and PostgreSQL, but never fewer than two threads, so
		// one slow field still leaves a thread for everyone else.
		threads: env('GEOMETRY_THREADS', Math.max(2, Math.min(4, availableParallelism() - 1))),
		maxQueue: env('GEOMETRY_MAX_QUEUE', 64)
	};
}

const WHAT: Record<GeometryTask['kind'], string> = {
	layout: 'Laying out this field',
	'measure-field': 'Checking this outline',
	import: 'Reading this boundary file',
	busy: 'This task'
};

export class GeometryPool {
	readonly options: GeometryPoolOptions;
	private readonly pool: Piscina;

	constructor(options: Partial<GeometryPoolOptions> = {}) {
		this.options = { ...defaults(), ...options };
		this.pool = new Piscina({
			filename: geometryWorkerPath(),
			minThreads: 1,
			maxThreads: this.options.threads,
			maxQueue: this.options.maxQueue,
			idleTimeout: 5 * 60_000
		});
	}

	/**
	 * Runs a task in a worker thread. Refusals come back as the GeometryError or ImportError the
	 * code threw; a task over the time limit is stopped (its thread is ended) and answered 503.
	 */
	async run<K extends GeometryTask['kind']>(task: Extract<GeometryTask, { kind: K }>, transfer?: ArrayBuffer[]): Promise<TaskResults[K]> {
		const limit = this.options.taskTimeoutMs;
		// The limit counts from the moment a thread starts the task: waiting for a free thread, or
		// for a new one to load its code, is not the task's fault.
		const stop = new AbortController();
		const { port1, port2 } = new MessageChannel();
		let timer: ReturnType<typeof setTimeout> | undefined;
		port1.once('message', () => {
			timer = setTimeout(() => stop.abort(), limit);
		});
		let outcome: TaskOutcome;
		try {
			outcome = await this.pool.run({ task, started: port2 }, { signal: stop.signal, transferList: [port2, ...(transfer ?? [])] });
		} catch (e) {
			if (isAbort(e)) {
				throw new AppError(
					503,
					`${WHAT[task.kind]} took longer than ${Math.round(limit / 1000)} s and was stopped: the field is too complex to work out at once. Simplify the outline (fewer corners), use wider lanes, or split the field.`,
					'too_complex',
					undefined,
					{ 'Retry-After': '30' }
				);
			}
			if (e instanceof Error && /queue is at limit/i.test(e.message)) {
				throw new AppError(503, 'The server is busy working out other fields. Try again in a few seconds.', 'busy', undefined, { 'Retry-After': '5' });
			}
			throw e;
		} finally {
			clearTimeout(timer);
			port1.close();
		}
		if (!outcome.ok) throw failureError(outcome.failure);
		return outcome.value as TaskResults[K];
	}

	async close(): Promise<void> {
		await this.pool.destroy();
	}
}

function isAbort(e: unknown): boolean {
	return e instanceof Error && (e.name === 'AbortError' || e.name === 'TimeoutError');
}

let shared: GeometryPool | undefined;

/** The app's one pool, started on first use. */
export function geometryPool(): GeometryPool {
	shared ??= new GeometryPool();
	return shared;
}

export async function closeGeometryPool(): Promise<void> {
	const pool = shared;
	shared = undefined;
	await pool?.close();
}
