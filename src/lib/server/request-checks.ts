// Checks every request passes before any route runs: values PostgreSQL cannot store (NUL in text),
// ids that cannot be ids, and bodies nested past reason. Routes then only meet well-formed input.
import { json, type RequestEvent } from '@sveltejs/kit';
import { isUuid } from './access';
import { AppError } from './errors';
import { readBodyUpTo } from './read-body';
import { isSeasonText } from './season';

/** Deep enough for any GeoJSON or plan body we take (a MultiPolygon position sits at depth 6). */
export const MAX_JSON_DEPTH = 32;

/** Form bodies above this (past any body limit the server sets) are left to the route to refuse. */
const FORM_SCAN_LIMIT = 16 * 1024 * 1024;

export interface JsonProblem {
	kind: 'nul' | 'depth';
	/** Dotted path of the value, as in field errors ("boundary.coordinates.0"); "_" for the whole body. */
	path: string;
}

const NUL = '\u0000';

/**
 * The first value of a parsed JSON body that cannot be taken: text (a key or a string) with a NUL
 * character, or arrays/objects nested deeper than maxDepth. Walks without recursion, so a hostile
 * depth cannot exhaust the stack.
 */
export function findJsonProblem(body: unknown, maxDepth = MAX_JSON_DEPTH): JsonProblem | null {
	const stack: { value: unknown; path: (string | number)[] }[] = [{ value: body, path: [] }];
	const where = (path: (string | number)[]) => (path.length ? path.join('.') : '_');
	while (stack.length) {
		const { value, path } = stack.pop()!;
		if (typeof value === 'string') {
			if (value.includes(NUL)) return { kind: 'nul', path: where(path) };
			continue;
		}
		if (value === null || typeof value !== 'object') continue;
		if (path.length >= maxDepth) return { kind: 'depth', path: where(path) };
		if (Array.isArray(value)) {
			for (let i = value.length - 1; i >= 0; i--) stack.push({ value: value[i], path: [...path, i] });
		} else {
			for (const [key, v] of Object.entries(value)) {
				if (key.includes(NUL)) return { kind: 'nul', path: where([...path, key.replaceAll(NUL, '\\u0000')]) };
				stack.push({ value: v, path: [...path, key] });
			}
		}
	}
	return null;
}

/** The AppError for a JsonProblem, with the offending place named in `fields`. */
export function refuseJsonProblem(problem: JsonProblem): AppError {
	if (problem.kind === 'depth') {
		const message = `The request body is too deeply nested (more than ${MAX_JSON_DEPTH} levels of arrays and objects).`;
		return new AppError(400, message, 'too_deeply_nested', { [problem.path]: [message] });
	}
	const message = 'Contains a NUL character (\\u0000), which text may not hold.';
	return new AppError(400, `A text value contains a NUL character (\\u0000) at ${problem.path}; remove it and try again.`, 'invalid', {
		[problem.path]: [message]
	});
}

/** Name of the first form entry whose name or text holds a NUL character (files are not text). */
export function findNulInForm(data: FormData): string | null {
	for (const [name, value] of data) {
		if (name.includes(NUL) || (typeof value === 'string' && value.includes(NUL))) return name.replaceAll(NUL, '\\u0000');
	}
	return null;
}

/** Where in the address a NUL character sits ("the query parameter variant", "the path"), or null. */
export function findNulInUrl(url: URL): string | null {
	if (/%00/.test(url.pathname)) return 'the path';
	for (const [name, value] of url.searchParams) {
		if (name.includes(NUL) || value.includes(NUL)) return `the query parameter "${name.replaceAll(NUL, '\\u0000')}"`;
	}
	return null;
}

/**
 * The first route parameter that cannot name anything: an id (farmId, fieldId …) that is not a
 * UUID, or a season that is not a crop year. Null when all are well-formed.
 */
export function findMalformedParam(params: Partial<Record<string, string>>): string | null {
	for (const [name, value] of Object.entries(params)) {
		if (/Id$/.test(name) && !isUuid(value)) return name;
		if (name === 'season' && !isSeasonText(value ?? '')) return name;
	}
	return null;
}

function isFormBody(request: Request) {
	const type = request.headers.get('content-type')?.split(';')[0].trim().toLowerCase();
	return type === 'application/x-www-form-urlencoded' || type === 'multipart/form-data';
}

/**
 * A refusal for a request no route should see, or null to let it through. /api answers in the
 * JSON error shape; a form action posted by the page script gets an action result; pages get a
 * plain page saying what is wrong.
 */
export async function refuseBadRequest(event: RequestEvent): Promise<Response | null> {
	const { url, request } = event;
	const isApi = url.pathname === '/api' || url.pathname.startsWith('/api/');
	const refuse = (status: number, code: string, message: string, fields?: Record<string, string[]>): Response => {
		if (isApi) return json({ error: fields ? { code, message, fields } : { code, message } }, { status });
		const wantsJson = (request.headers.get('accept') ?? '').includes('application/json');
		if (request.method === 'POST' && wantsJson) return json({ type: 'error', error: { code, message } }, { status });
		return plainErrorPage(status, message);
	};

	const nulInUrl = findNulInUrl(url);
	if (nulInUrl) return refuse(400, 'invalid', `The address contains a NUL character (%00) in ${nulInUrl}; remove it and try again.`);

	if (isApi && event.route.id === null) return refuse(404, 'not_found', `There is no API at ${url.pathname}.`);
	const badParam = findMalformedParam(event.params);
	if (badParam === 'season') return refuse(404, 'not_found', 'No plan here: the season in the address is not a year such as 2025.');
	if (badParam) {
		const what = badParam.replace(/Id$/, '');
		return refuse(404, 'not_found', `No ${what} here: the ${what} id in the address is not a valid id.`);
	}

	if (request.method !== 'GET' && request.method !== 'HEAD' && url.searchParams.has('/default')) {
		return refuse(404, 'not_found', 'There is no form action named "default" here.');
	}

	if (request.method !== 'GET' && request.method !== 'HEAD' && isFormBody(request)) {
		const body = await readFormCopy(request, FORM_SCAN_LIMIT);
		if (body === 'damaged') {
			return refuse(400, 'bad_form', 'The form data could not be read: the body is damaged or does not match its content type.');
		}
		const field = body && findNulInForm(body);
		if (field) {
			const message = 'Contains a NUL character (\\u0000), which text may not hold.';
			return refuse(400, 'invalid', `The form field "${field}" contains a NUL character (\\u0000); remove it and try again.`, { [field]: [message] });
		}
	}
	return null;
}

/**
 * The form a request carries, read from a copy so the route still gets the body. Null when the
 * body is larger than `limit` or ends early (the route refuses those, e.g. with a 413), whether or
 * not it declared its length; 'damaged' when it cannot be read as the form its type names.
 */
async function readFormCopy(request: Request, limit: number): Promise<FormData | null | 'damaged'> {
	if (Number(request.headers.get('content-length') ?? 0) > limit || !request.body) return null;
	let bytes: Uint8Array<ArrayBuffer> | null;
	try {
		// Cancelling one copy leaves the route's copy of the stream untouched.
		bytes = await readBodyUpTo(request.clone().body, limit, 'cancel');
	} catch {
		return null;
	}
	if (!bytes) return null;
	try {
		return await new Response(bytes, { headers: { 'content-type': request.headers.get('content-type') ?? '' } }).formData();
	} catch {
		return 'damaged';
	}
}

/** A bare page (no layout: no route has run) that says what is wrong; the message is text, never markup. */
function plainErrorPage(status: number, message: string): Response {
	const text = message.replaceAll('&', '&amp;').replaceAll('<', '&lt;').replaceAll('>', '&gt;');
	const html = `<!doctype html>
<html lang="en">
<head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${status} · Stripwright</title></head>
<body><main><p>${status}</p><h1>${text}</h1><p><a href="/">Back to Stripwright</a></p></main></body>
</html>
`;
	return new Response(html, { status, headers: { 'content-type': 'text/html; charset=utf-8' } });
}
