import { db } from './db';
import { generateToken, sha256Hex } from './tokens';
import { setUserPassword } from './users';

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
