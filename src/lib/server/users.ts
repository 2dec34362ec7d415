import { db } from './db';
import { hashPassword, verifyPassword } from './password';
import type { SessionUser } from './auth';

export interface UserWithHash extends SessionUser {
	passwordHash: string;
}

export class DuplicateEmailError extends Error {
	constructor() {
		super('An account with this e-mail already exists. Sign in, or reset your password.');
	}
}

export function normalizeEmail(email: string): string {
	return email.trim().toLowerCase();
}

export async function getUserFromEmail(email: string): Promise<UserWithHash | null> {
	const row = await db()('users').whereRaw('lower(email) = ?', [normalizeEmail(email)]).first();
	return row ? { id: row.id, email: row.email, name: row.name, passwordHash: row.password_hash } : null;
}

export async function getUser(id: string): Promise<SessionUser | null> {
	const row = await db()('users').where({ id }).first('id', 'email', 'name');
	return row ?? null;
}

/** Creates an account directly (seeds, tests); people sign up through a confirmed e-mail (sign-up.ts). */
export async function createUser(input: { email: string; name: string; password: string }): Promise<SessionUser> {
	return insertUser(db(), { email: input.email, name: input.name, passwordHash: await hashPassword(input.password) });
}

export async function insertUser(trx: ReturnType<typeof db>, input: { email: string; name: string; passwordHash: string }): Promise<SessionUser> {
	try {
		const [row] = await trx('users')
			.insert({ email: normalizeEmail(input.email), name: input.name.trim(), password_hash: input.passwordHash })
			.returning(['id', 'email', 'name']);
		return row;
	} catch (e) {
		if ((e as { code?: string }).code === '23505') throw new DuplicateEmailError();
		throw e;
	}
}

export async function setUserPassword(userId: string, password: string, trx = db()) {
	await trx('users')
		.where({ id: userId })
		.update({ password_hash: await hashPassword(password), updated_at: trx.fn.now() });
}

/**
 * Changes the password when the current one is right, and ends every session of the user in the
 * same transaction (the caller starts a fresh one for this browser). False when the current
 * password is wrong; nothing changes then.
 */
export async function changePassword(userId: string, currentPassword: string, newPassword: string): Promise<boolean> {
	return db().transaction(async (trx) => {
		const row = await trx('users').where({ id: userId }).forUpdate().first('password_hash');
		if (!row || !(await verifyPassword(row.password_hash, currentPassword))) return false;
		await setUserPassword(userId, newPassword, trx);
		await trx('sessions').where({ user_id: userId }).delete();
		return true;
	});
}
