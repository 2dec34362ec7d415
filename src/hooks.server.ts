import type { Handle, HandleServerError, ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { randomUUID } from 'node:crypto';
import { clearSessionCookie, lucia, setSessionCookie } from '$lib/server/auth';
import { closeDb } from '$lib/server/db';
import { backgroundSettled } from '$lib/server/background';
import { applySecurityHeaders } from '$lib/server/security-headers';
import { frameworkRefusal, fromDatabaseInputError } from '$lib/server/errors';
import { refuseBadRequest } from '$lib/server/request-checks';
import { geometryPool } from '$lib/server/geometry-pool';

// A geometry thread loads its code at start-up, so the first layout or field save does not wait for it.
export const init: ServerInit = () => {
	geometryPool();
};

// adapter-node emits this after a graceful stop; an idle pool would otherwise keep the process alive.
process.on('sveltekit:shutdown', () => {
	// Mail already promised to someone (sign-up, reset) goes out before the pool closes.
	void backgroundSettled().finally(() => closeDb());
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

export const handle = sequence(handleSession, handleHeaders, handleRequestChecks);

// Only unexpected errors and the framework's own 4xx arrive here; a library's message is never shown.
export const handleError: HandleServerError = ({ error, event, status, message }) => {
	if (status < 500) return frameworkRefusal(status, message, event.request.headers.get('content-type'));
	const errorId = randomUUID();
	console.error(`[${errorId}] ${event.request.method} ${event.url.pathname}`, error);
	const refused = fromDatabaseInputError(error);
	if (refused) return { message: `${refused.message} Nothing was saved. (error id ${errorId})`, code: refused.code, errorId };
	return { message: `Something went wrong on our side. Nothing was saved. (error id ${errorId})`, code: 'internal', errorId };
};
