import { checkSignInAllowed, recordSignInAttempt } from './rate-limit';
import { getUserFromEmail } from './users';
import { hashPassword, verifyPassword } from './password';
import type { SessionUser } from './auth';

export const WRONG_CREDENTIALS = 'That e-mail and password do not match an account.';

export type SignInResult =
	| { ok: true; user: SessionUser }
	| { ok: false; status: 401 | 429; message: string; retryAfterSeconds?: number };

/** The one sign-in ladder shared by the page and the JSON API: rate limit → verify → record. */
export async function attemptSignIn(email: string, password: string, ip: string): Promise<SignInResult> {
	const decision = await checkSignInAllowed(email, ip);
	if (!decision.allowed) {
		return { ok: false, status: 429, message: decision.message!, retryAfterSeconds: decision.retryAfterSeconds };
	}
	const user = await getUserFromEmail(email);
	// Verify against a dummy hash when there is no user, so timing does not reveal which e-mails exist.
	const valid = user ? await verifyPassword(user.passwordHash, password) : await verifyPassword(await dummy(), password);
	await recordSignInAttempt(email, ip, Boolean(user && valid));
	if (!user || !valid) return { ok: false, status: 401, message: WRONG_CREDENTIALS };
	return { ok: true, user: { id: user.id, email: user.email, name: user.name } };
}

let dummyHash: Promise<string> | undefined;
function dummy() {
	return (dummyHash ??= hashPassword('no account has this password'));
}
