import type { Handle, HandleServerError, ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { randomUUID } from 'node:crypto';
import { clearSessionCookie, lucia, setSessionCookie } from '$lib/server/auth';
import { closeDb } from '$lib/server/db';
import { backgroundSettled } from '$lib/server/background';
import { applySecurityHeaders } from '$lib/server/security-headers';
import { DATABASE_UNAVAILABLE_MESSAGE, frameworkRefusal, fromDatabaseInputError, isDatabaseUnavailable } from '$lib/server/errors';
import { refuseBadRequest } from '$lib/server/request-checks';
import { geometryPool } from '$lib/server/geometry-pool';
import { startMailRetries } from '$lib/server/mail';
import { startChangeListener, stopChangeListener } from '$lib/server/change-listener';

// A geometry thread loads its code at start-up, so the first layout or field save does not wait for it.
export const init: ServerInit = () => {
	geometryPool();
	// Mail the relay refused earlier goes out once it is back.
	startMailRetries();
	// Sessions and plan stamps kept by this process are emptied by changes other processes commit.
	startChangeListener();
};

// adapter-node emits this after a graceful stop; an idle pool would otherwise keep the process alive.
process.on('sveltekit:shutdown', () => {
	// Mail already promised to someone (sign-up, reset) goes out before the pool closes.
	void backgroundSettled().finally(() => Promise.all([closeDb(), stopChangeListener()]));
});

const handleSession: Handle = async ({ event, resolve }) => {
	const sessionId = event.cookies.get(lucia.sessionCookieName);
	event.locals.user = null;
	event.locals.session = null;
	if (sessionId) {
		const secure = event.url.protocol === 'https:';
		const { session, user } = await lucia.validateSession(sessionId);
		if (session && user) {
			// Sliding expiry: Lucia marks the session fresh when it extended it.
			if (session.fresh) setSessionCookie(event.cookies, session, secure);
			event.locals.user = { id: user.id, email: user.email, name: user.name };
			event.locals.session = session;
		} else {
			clearSessionCookie(event.cookies, secure);
		}
	}
	return resolve(event);
};

const handleHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	applySecurityHeaders(response.headers, event.url, process.env.TILE_URL);
	return response;
};

// Malformed requests stop here, before any route reads them.
const handleRequestChecks: Handle = async ({ event, resolve }) => (await refuseBadRequest(event)) ?? resolve(event);

// Requests that failed because the database is down answer 503 with a calm message (JSON for the
// API, a page otherwise), and the server stays up: the pool reconnects once the database is back.
const databaseDown = new WeakSet<object>();

function unavailableResponse(event: Parameters<Handle>[0]['event']): Response {
	const headers = { 'retry-after': '5', 'cache-control': 'no-store' };
	const wantsJson = event.url.pathname.startsWith('/api/') || (event.request.headers.get('accept') ?? '').includes('application/json');
	if (wantsJson) {
		return new Response(JSON.stringify({ error: { code: 'database_unavailable', message: DATABASE_UNAVAILABLE_MESSAGE } }), {
			status: 503,
			headers: { ...headers, 'content-type': 'application/json' }
		});
	}
	const page = `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>Database not answering · Stripwright</title></head><body><main><h1>Database not answering</h1><p>${DATABASE_UNAVAILABLE_MESSAGE}</p><p><a href="">Try again</a></p></main></body></html>`;
	return new Response(page, { status: 503, headers: { ...headers, 'content-type': 'text/html; charset=utf-8' } });
}

const handleDatabaseDown: Handle = async ({ event, resolve }) => {
	let response: Response;
	try {
		response = await resolve(event);
	} catch (e) {
		if (!isDatabaseUnavailable(e)) throw e;
		console.error(`${event.request.method} ${event.url.pathname}: database unavailable (${(e as Error).message})`);
		return unavailableResponse(event);
	}
	if (response.status === 500 && databaseDown.has(event.locals)) {
		const headers = new Headers(response.headers);
		headers.set('retry-after', '5');
		return new Response(response.body, { status: 503, headers });
	}
	return response;
};

export const handle = sequence(handleHeaders, handleDatabaseDown, handleSession, handleRequestChecks);

// Only unexpected errors and the framework's own 4xx arrive here; a library's message is never shown.
export const handleError: HandleServerError = ({ error, event, status, message }) => {
	if (status < 500) return frameworkRefusal(status, message, event.request.headers.get('content-type'));
	if (isDatabaseUnavailable(error)) {
		databaseDown.add(event.locals);
		console.error(`${event.request.method} ${event.url.pathname}: database unavailable (${(error as Error).message})`);
		return { message: DATABASE_UNAVAILABLE_MESSAGE, code: 'database_unavailable' };
	}
	const errorId = randomUUID();
	console.error(`[${errorId}] ${event.request.method} ${event.url.pathname}`, error);
	const refused = fromDatabaseInputError(error);
	if (refused) return { message: `${refused.message} Nothing was saved. (error id ${errorId})`, code: refused.code, errorId };
	return { message: `Something went wrong on our side. Nothing was saved. (error id ${errorId})`, code: 'internal', errorId };
};
