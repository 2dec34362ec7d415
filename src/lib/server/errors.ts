// Expected failures of domain modules. Pages turn them into form messages; the JSON API into the
// one error shape. Anything else is a bug and is logged with an error id.
import { error } from '@sveltejs/kit';

const CODES: Record<number, string> = {
	400: 'invalid',
	401: 'unauthenticated',
	403: 'forbidden',
	404: 'not_found',
	409: 'version_conflict',
	413: 'too_large',
	429: 'too_many_requests'
};

export class AppError extends Error {
	constructor(
		readonly status: number,
		message: string,
		readonly code = CODES[status] ?? 'error',
		readonly fields?: Record<string, string[]>,
		readonly headers?: Record<string, string>
	) {
		super(message);
	}
}

/**
 * Rethrows for a page load or form action: an AppError becomes SvelteKit's error with the same
 * status (a missing field in the address is a 404 page, not a 500). `.catch(pageError)`.
 */
export function pageError(e: unknown): never {
	if (e instanceof AppError) error(e.status, { message: e.message, code: e.code });
	throw e;
}

export const notFound = (what: string) => new AppError(404, `No ${what} here: it does not exist, was deleted, or is not shared with you.`, 'not_found');

export const versionConflict = (what: string, stored: number, sent: number) =>
	new AppError(409, `Someone else saved this ${what} after you opened it (version ${stored}, yours ${sent}). Reload to see their changes; nothing of yours was saved.`, 'version_conflict');

export const invalid = (message: string, fields?: Record<string, string[]>) => new AppError(400, message, 'invalid', fields);

// PostgreSQL's "data exception" class (SQLSTATE 22xxx) means a value the database cannot take:
// a NUL byte in text (22021, 22P05), a malformed id (22P02), a number out of range (22003).
// That is bad input, not a fault; the library's own words are never shown.
const DATA_EXCEPTION_MESSAGES: Record<string, string> = {
	'22021': 'A text value contains a NUL character (\\u0000), which cannot be stored. Remove it and try again.',
	'22P05': 'A text value contains a NUL character (\\u0000), which cannot be stored. Remove it and try again.',
	'22P02': 'A value is not in the expected form (for example an id that is not a UUID, or text where a number belongs).',
	'22003': 'A number is outside the range that can be stored.',
	'22001': 'A text value is longer than can be stored.',
	'22007': 'A date or time is not in a form that can be read.',
	'22008': 'A date or time is outside the range that can be stored.'
};

/** The 400 for a value PostgreSQL refused as data, or null when the error is something else. */
export function fromDatabaseInputError(e: unknown): AppError | null {
	const code = (e as { code?: unknown } | null)?.code;
	// A CHECK constraint (23514) guards a value the code should have refused first: still bad input.
	if (code === '23514') return new AppError(400, 'A value is outside what can be stored (for example zero or negative where an amount is needed); check the values and try again.', 'invalid');
	if (typeof code !== 'string' || !/^22[0-9A-Z]{3}$/.test(code)) return null;
	return new AppError(400, DATA_EXCEPTION_MESSAGES[code] ?? 'A value cannot be stored as sent; check the values and try again.', 'invalid');
}

/**
 * What the user reads when the framework itself refuses a request with a 4xx (an unknown page,
 * a form posted without form data …); its own labels ("Unsupported Media Type") say too little.
 */
export function frameworkRefusal(status: number, label: string, contentType: string | null): { message: string; code: string } {
	switch (status) {
		case 404:
			return { message: 'This page does not exist.', code: 'not_found' };
		case 405:
			return { message: 'This address does not take that kind of request.', code: 'method_not_allowed' };
		case 413:
			return { message: 'The request is larger than this site accepts.', code: 'too_large' };
		case 415: {
			const sent = contentType ? `it was sent as ${contentType.split(';')[0].trim()}` : 'it was sent with no body';
			return {
				message: `This form must be sent as form data (application/x-www-form-urlencoded or multipart/form-data), but ${sent}.`,
				code: 'unsupported_media_type'
			};
		}
		default:
			return { message: `The request could not be handled (${status} ${label}).`, code: 'bad_request' };
	}
}

export const DATABASE_UNAVAILABLE_MESSAGE =
	'The farm database is not answering right now, so nothing could be read or saved. Try again in a minute; nothing was half-saved.';

// Node's socket errors and PostgreSQL's connection classes (08xxx; 57P01–57P03: the server is
// shutting down or starting), plus the pool giving up waiting for a connection.
const UNAVAILABLE_ERRNO = new Set(['ECONNREFUSED', 'ECONNRESET', 'ENOENT', 'EPIPE', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENOTCONN']);
const UNAVAILABLE_MESSAGES = /Connection terminated|connection timeout|timeout exceeded when trying to connect|Knex: Timeout acquiring a connection|Client has encountered a connection error|terminating connection/i;

/** Whether an error means the database cannot be reached (a 503, not a bug). */
export function isDatabaseUnavailable(e: unknown): boolean {
	for (let cause: unknown = e, depth = 0; cause && depth < 4; cause = (cause as { cause?: unknown }).cause, depth++) {
		const { code, name, message } = cause as { code?: unknown; name?: unknown; message?: unknown };
		if (typeof code === 'string' && (UNAVAILABLE_ERRNO.has(code) || /^08[0-9A-Z]{3}$/.test(code) || /^57P0[123]$/.test(code))) return true;
		if (name === 'KnexTimeoutError') return true;
		if (typeof message === 'string' && UNAVAILABLE_MESSAGES.test(message)) return true;
	}
	return false;
}
