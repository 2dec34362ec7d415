// Expected failures of domain modules. Pages turn them into form messages; the JSON API into the
// one error shape. Anything else is a bug and is logged with an error id.

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

export const notFound = (what: string) => new AppError(404, `No ${what} here: it does not exist, was deleted, or is not shared with you.`, 'not_found');

export const versionConflict = (what: string, stored: number, sent: number) =>
	new AppError(409, `Someone else saved this ${what} after you opened it (version ${stored}, yours ${sent}). Reload to see their changes; nothing of yours was saved.`, 'version_conflict');

export const invalid = (message: string, fields?: Record<string, string[]>) => new AppError(400, message, 'invalid', fields);
