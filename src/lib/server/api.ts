// JSON API plumbing: one error shape everywhere, { error: { code, message, fields? } }.
import { isHttpError, isRedirect, json, type RequestEvent } from '@sveltejs/kit';
import { ZodError, type ZodType } from 'zod';
import { randomUUID } from 'node:crypto';
import { AppError, DATABASE_UNAVAILABLE_MESSAGE, fromDatabaseInputError, isDatabaseUnavailable } from './errors';
import { findJsonProblem, refuseJsonProblem } from './request-checks';
import { GeometryError } from '../geometry/index';

export { AppError as ApiError } from './errors';

export function apiError(status: number, code: string, message: string, fields?: Record<string, string[]>, headers?: Record<string, string>) {
	return json({ error: fields ? { code, message, fields } : { code, message } }, { status, headers });
}

/** Field errors keyed by dotted path, from a zod error. */
export function zodFields(e: ZodError): Record<string, string[]> {
	const fields: Record<string, string[]> = {};
	for (const issue of e.issues) {
		const key = issue.path.length ? issue.path.join('.') : '_';
		(fields[key] ??= []).push(issue.message);
	}
	return fields;
}

/** Reads and validates a JSON body; bad JSON or bad shape becomes a 400 with field errors. */
export async function readJson<T>(event: RequestEvent, schema: ZodType<T>): Promise<T> {
	let body: unknown;
	try {
		body = await event.request.json();
	} catch {
		throw new AppError(400, 'The request body is not valid JSON.', 'bad_json');
	}
	const problem = findJsonProblem(body);
	if (problem) throw refuseJsonProblem(problem);
	const parsed = schema.safeParse(body);
	if (!parsed.success) {
		throw new AppError(400, 'Some values are missing or not valid; see fields.', 'invalid', zodFields(parsed.error));
	}
	return parsed.data;
}

/** Wraps a JSON handler so every failure answers in the one error shape, never a stack trace. */
export function api<E extends RequestEvent>(handler: (event: E) => Response | Promise<Response>): (event: E) => Promise<Response> {
	return async (event: E) => {
		try {
			return await handler(event);
		} catch (e) {
			if (e instanceof AppError) return apiError(e.status, e.code, e.message, e.fields, e.headers);
			if (isHttpError(e)) {
				const body = e.body as App.Error;
				return apiError(e.status, body.code ?? 'error', body.message);
			}
			if (e instanceof GeometryError) return apiError(400, e.code, e.message);
			if (isRedirect(e)) throw e;
			if (e instanceof ZodError) return apiError(400, 'invalid', 'Some values are not valid; see fields.', zodFields(e));
			if (isDatabaseUnavailable(e)) {
				console.error(`${event.request.method} ${event.url.pathname}: database unavailable (${(e as Error).message})`);
				return apiError(503, 'database_unavailable', DATABASE_UNAVAILABLE_MESSAGE, undefined, { 'retry-after': '5' });
			}
			const refused = fromDatabaseInputError(e);
			if (refused) {
				// A value reached the database unchecked: answer 400, but leave a trace to add the check.
				console.warn(`${event.request.method} ${event.url.pathname}: database refused a value (${(e as { code: string }).code})`);
				return apiError(refused.status, refused.code, refused.message);
			}
			const errorId = randomUUID();
			console.error(`[${errorId}] ${event.request.method} ${event.url.pathname}`, e);
			return apiError(500, 'internal', `Something went wrong on our side (error id ${errorId}). Nothing was saved.`);
		}
	};
}
