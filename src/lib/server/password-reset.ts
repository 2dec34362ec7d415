import { db } from './db';
import { generateToken, sha256Hex } from './tokens';
import { getUserFromEmail, normalizeEmail, setUserPassword } from './users';
import { takeRequest } from './rate-limit';
import { sendMail, type OutgoingMail } from './mail';

export const RESET_TTL_MINUTES = 60;

/** Creates a single-use reset token for the user; returns the raw token for the e-mail link. */
export async function createPasswordReset(userId: string, now = new Date()): Promise<string> {
	const token = generateToken();
	await db()('password_resets').insert({
		user_id: userId,
		token_hash: sha256Hex(token),
		expires_at: new Date(now.getTime() + RESET_TTL_MINUTES * 60_000)
	});
	return token;
}

export type SendMail = (mail: OutgoingMail) => Promise<unknown>;

/** The reset mail for an existing account: one link, valid once, for an hour. */
export async function mailPasswordReset(user: { id: string; email: string; name: string }, origin: string, send: SendMail = sendMail) {
	const link = `${origin}/reset-password/${await createPasswordReset(user.id)}`;
	await send({
		to: user.email,
		subject: 'Reset your Stripwright password',
		text: `Hello ${user.name},\n\nSomeone (hopefully you) asked to reset the password of your Stripwright account.\nOpen this link within ${RESET_TTL_MINUTES} minutes to choose a new password; it works once:\n\n${link}\n\nIf you did not ask, ignore this e-mail: your password stays as it is.\n`
	});
}

/**
 * What "forgot password" does behind its answer: a reset mail when the address has an account,
 * nothing otherwise. The page runs it in the background, so its answer and timing are the same.
 */
export async function requestPasswordReset(email: string, origin: string, send: SendMail = sendMail) {
	if (!(await takeRequest('account-mail', normalizeEmail(email))).allowed) return;
	const user = await getUserFromEmail(email);
	if (user) await mailPasswordReset(user, origin, send);
}

/** The one answer to a reset request, whether or not the address has an account. */
export function passwordResetAnswer(email: string): string {
	return `If an account uses ${email}, a reset link is on its way. It works once, for ${RESET_TTL_MINUTES} minutes.`;
}

export type ResetCheck = { ok: true; userId: string; email: string } | { ok: false; message: string };

type ResetRow = { id: string; user_id: string; expires_at: Date; used_at: Date | null; email: string };

function findReset(trx: ReturnType<typeof db>, token: string) {
	return trx('password_resets as r')
		.join('users as u', 'u.id', 'r.user_id')
		.where('r.token_hash', sha256Hex(token))
		.first<ResetRow | undefined>('r.id', 'r.user_id', 'r.expires_at', 'r.used_at', 'u.email');
}

function judge(row: ResetRow | undefined, now: Date): ResetCheck {
	if (!row) return { ok: false, message: 'This reset link is not valid. Ask for a new one.' };
	if (row.used_at) return { ok: false, message: 'This reset link has already been used. Ask for a new one.' };
	if (new Date(row.expires_at) <= now) return { ok: false, message: 'This reset link has expired (links last 1 hour). Ask for a new one.' };
	return { ok: true, userId: row.user_id, email: row.email };
}

export async function checkPasswordReset(token: string, now = new Date()): Promise<ResetCheck> {
	return judge(await findReset(db(), token), now);
}

/** Sets the new password, spends the token and ends every session of the user, atomically. */
export async function completePasswordReset(token: string, password: string, now = new Date()): Promise<ResetCheck> {
	return db().transaction(async (trx) => {
		// Lock the token row so two tabs cannot both spend it.
		const row = await findReset(trx, token).forUpdate('r');
		const check = judge(row, now);
		if (!check.ok || !row) return check;
		await setUserPassword(check.userId, password, trx);
		// This link and any other outstanding ones for the user are spent together.
		await trx('password_resets').where({ user_id: check.userId }).whereNull('used_at').update({ used_at: now });
		await trx('sessions').where({ user_id: check.userId }).delete();
		return check;
	});
}
