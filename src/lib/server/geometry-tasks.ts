// The heavy geometry the server hands to its worker pool. Relative imports only: worker threads
// load this file with tsx, outside Vite. Failures come back as plain data, since a thread passes
// an error across without its class or code.
import type { MessagePort } from 'node:worker_threads';
import type { Layout, LayoutInput } from '../geometry/index';
import { GeometryError, layoutStrips } from '../geometry/index';
import { measureFieldShape, type FieldMeasure, type FieldShape } from '../fields/shape';
import { ImportError, type ImportErrorCode } from './field-import/errors';
import { readFieldFile, type ImportResult } from './field-import/read';

export type GeometryTask =
	| { kind: 'layout'; input: LayoutInput }
	| { kind: 'measure-field'; shape: FieldShape }
	| { kind: 'import'; filename: string; bytes: Uint8Array }
	/** Keeps a thread busy for `ms`: lets tests hold the pool without building a huge field. */
	| { kind: 'busy'; ms: number };

export interface TaskResults {
	layout: Layout;
	'measure-field': FieldMeasure;
	import: ImportResult;
	busy: number;
}

export type TaskFailure =
	| { type: 'geometry'; code: GeometryError['code']; message: string; where?: [number, number] }
	| { type: 'import'; code: ImportErrorCode; message: string; status: 400 | 413 };

export type TaskOutcome = { ok: true; value: unknown } | { ok: false; failure: TaskFailure };

function run(task: GeometryTask): unknown {
	switch (task.kind) {
		case 'layout':
			return layoutStrips(task.input);
		case 'measure-field':
			return measureFieldShape(task.shape);
		case 'import':
			return readFieldFile(task.filename, task.bytes);
		case 'busy': {
			const until = performance.now() + task.ms;
			let spins = 0;
			while (performance.now() < until) spins++;
			return spins;
		}
	}
}

/** Runs one task; expected refusals come back as `failure`, anything else is thrown as a bug. */
export function runGeometryTask(task: GeometryTask): TaskOutcome {
	try {
		return { ok: true, value: run(task) };
	} catch (e) {
		if (e instanceof GeometryError) return { ok: false, failure: { type: 'geometry', code: e.code, message: e.message, where: e.where } };
		if (e instanceof ImportError) return { ok: false, failure: { type: 'import', code: e.code, message: e.message, status: e.status } };
		throw e;
	}
}

/**
 * What a worker thread runs: says on `started` that the task has begun (the time limit counts from
 * there, not from the wait for a free thread), then runs it.
 */
export function runGeometryJob({ task, started }: { task: GeometryTask; started?: MessagePort }): TaskOutcome {
	started?.postMessage('started');
	started?.close();
	return runGeometryTask(task);
}

/** The error a failure stood for, rebuilt on the calling side. */
export function failureError(f: TaskFailure): GeometryError | ImportError {
	return f.type === 'geometry' ? new GeometryError(f.code, f.message, f.where) : new ImportError(f.code, f.message, f.status);
}
