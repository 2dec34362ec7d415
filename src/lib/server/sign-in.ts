import { checkSignInAllowed, recordSignInFailure, recordSignInSuccess } from './rate-limit';
import { getUserFromEmail } from './users';
import { hashPassword, verifyPassword } from './password';
import type { SessionUser } from './auth';

export const WRONG_CREDENTIALS = 'That e-mail and password do not match an account.';

export type SignInResult =
	| { ok: true; user: SessionUser }
	| { ok: false; status: 401 | 429; message: string; retryAfterSeconds?: number };

/** The one sign-in ladder shared by the page and the JSON API: throttle → verify → count. */
export async function attemptSignIn(email: string, password: string, ip: string, now = new Date()): Promise<SignInResult> {
	const decision = await checkSignInAllowed(email, ip, now);
	if (!decision.allowed) {
		return { ok: false, status: 429, message: decision.message!, retryAfterSeconds: decision.retryAfterSeconds };
	}
	const user = await getUserFromEmail(email);
	// Verify against a dummy hash when there is no user, so timing does not reveal which e-mails exist.
	const valid = user ? await verifyPassword(user.passwordHash, password) : await verifyPassword(await dummy(), password);
	if (!user || !valid) {
		await recordSignInFailure(email, ip, now);
		return { ok: false, status: 401, message: WRONG_CREDENTIALS };
	}
	await recordSignInSuccess(email);
	return { ok: true, user: { id: user.id, email: user.email, name: user.name } };
}

let dummyHash: Promise<string> | undefined;
export function dummyPasswordHash() {
	return (dummyHash ??= hashPassword('no account has this password'));
}
const dummy = dummyPasswordHash;
