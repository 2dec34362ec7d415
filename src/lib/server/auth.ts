import { Lucia, TimeSpan, type Session } from 'lucia';
import type { Cookies } from '@sveltejs/kit';
import { db } from './db';
import { KnexSessionAdapter } from './session-adapter';

export interface SessionUser {
	id: string;
	email: string;
	name: string;
}

export const lucia = new Lucia(new KnexSessionAdapter(db), {
	// Sliding expiry: Lucia extends a session once less than half of this remains.
	sessionExpiresIn: new TimeSpan(30, 'd'),
	sessionCookie: { name: 'sw_session', attributes: { sameSite: 'lax' } },
	getUserAttributes: (a) => ({ email: a.email, name: a.name })
});

declare module 'lucia' {
	interface Register {
		Lucia: typeof lucia;
		DatabaseUserAttributes: { email: string; name: string };
	}
}

/** Sets the session cookie: httpOnly, SameSite=Lax, Secure whenever the request came over https. */
export function setSessionCookie(cookies: Cookies, session: Session, secure: boolean) {
	const c = lucia.createSessionCookie(session.id);
	cookies.set(c.name, c.value, { ...c.attributes, path: '/', secure });
}

export function clearSessionCookie(cookies: Cookies, secure: boolean) {
	const c = lucia.createBlankSessionCookie();
	cookies.set(c.name, c.value, { ...c.attributes, path: '/', secure });
}

/**
 * Starts a fresh session for the user. Whatever session id the browser already carried (another
 * account's, or one planted before sign-in) is ended first, so a new sign-in never reuses an id.
 */
export async function startSession(cookies: Cookies, userId: string, secure: boolean) {
	const previous = cookies.get(lucia.sessionCookieName);
	if (previous) await lucia.invalidateSession(previous);
	const session = await lucia.createSession(userId, {});
	setSessionCookie(cookies, session, secure);
	return session;
}

export async function validateSessionId(sessionId: string) {
	return lucia.validateSession(sessionId);
}

export async function endSession(sessionId: string) {
	await lucia.invalidateSession(sessionId);
}

export async function endAllSessions(userId: string) {
	await lucia.invalidateUserSessions(userId);
}
