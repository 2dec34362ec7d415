import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, ApiError, readJson } from '$lib/server/api';
import { signInSchema } from '$lib/schemas/account';
import { attemptSignIn } from '$lib/server/sign-in';
import { clearSessionCookie, endSession, startSession } from '$lib/server/auth';

export const POST: RequestHandler = api(async (event) => {
	const body = await readJson(event, signInSchema);
	const result = await attemptSignIn(body.email, body.password, event.getClientAddress());
	if (!result.ok) {
		throw new ApiError(result.status, result.message, result.status === 429 ? 'too_many_requests' : 'wrong_credentials', undefined,
			result.retryAfterSeconds ? { 'retry-after': String(result.retryAfterSeconds) } : undefined);
	}
	await startSession(event.cookies, result.user.id, event.url.protocol === 'https:');
	return json({ user: result.user });
});

export const DELETE: RequestHandler = api(async ({ locals, cookies, url }) => {
	if (locals.session) await endSession(locals.session.id);
	clearSessionCookie(cookies, url.protocol === 'https:');
	return new Response(null, { status: 204 });
});
