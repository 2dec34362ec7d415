import { db } from './db';
import { generateToken, sha256Hex } from './tokens';
import { hashPassword } from './password';
import { getUserFromEmail, insertUser, normalizeEmail } from './users';
import { takeRequest } from './rate-limit';
import { createPasswordReset, RESET_TTL_MINUTES, type SendMail } from './password-reset';
import { sendMail } from './mail';
import { safeRedirectTarget } from './redirects';
import type { SessionUser } from './auth';

export const SIGN_UP_TTL_HOURS = 24;

export interface SignUpInput {
	name: string;
	email: string;
	password: string;
	redirectTo?: string | null;
}

/** The one answer to a sign-up, whether the address is new or already has an account. */
export function signUpAnswer(email: string): string {
	return `Check your inbox at ${email}: we sent a link to finish creating your account. It works for ${SIGN_UP_TTL_HOURS} hours.`;
}

/**
 * What sign-up does behind its answer. A new address gets a link that creates the account; an
 * address that already has one gets a mail saying so, with a reset link. The password is hashed
 * either way, so both paths cost the same; the page also runs this in the background.
 */
export async function requestSignUp(input: SignUpInput, origin: string, send: SendMail = sendMail, now = new Date()) {
	const email = normalizeEmail(input.email);
	if (!(await takeRequest('account-mail', email)).allowed) return;
	const passwordHash = await hashPassword(input.password);
	const existing = await getUserFromEmail(email);
	if (existing) {
		const resetLink = `${origin}/reset-password/${await createPasswordReset(existing.id, now)}`;
		await send({
			to: existing.email,
			subject: 'You already have a Stripwright account',
			text: `Hello ${existing.name},\n\nSomeone (hopefully you) tried to create a Stripwright account with this address, but it already has one, so nothing new was made.\nIf you forgot your password, open this link within ${RESET_TTL_MINUTES} minutes to choose a new one; it works once:\n\n${resetLink}\n\nOr sign in as usual at ${origin}/sign-in. If it was not you, ignore this e-mail: your account stays as it is.\n`
		});
		return;
	}
	const token = generateToken();
	await db()('sign_up_requests').insert({
		email,
		name: input.name.trim(),
		password_hash: passwordHash,
		token_hash: sha256Hex(token),
		redirect_to: input.redirectTo ? safeRedirectTarget(input.redirectTo) : null,
		expires_at: new Date(now.getTime() + SIGN_UP_TTL_HOURS * 3_600_000)
	});
	await send({
		to: email,
		subject: 'Confirm your e-mail for Stripwright',
		text: `Hello ${input.name.trim()},\n\nOpen this link within ${SIGN_UP_TTL_HOURS} hours to confirm your address and finish creating your Stripwright account:\n\n${origin}/sign-up/confirm/${token}\n\nIf you did not sign up, ignore this e-mail: no account is made without this link.\n`
	});
}

export class SignUpLinkError extends Error {}

type RequestRow = { id: string; email: string; name: string; password_hash: string; redirect_to: string | null; expires_at: Date; used_at: Date | null };

function findRequest(trx: ReturnType<typeof db>, token: string) {
	return trx('sign_up_requests').where({ token_hash: sha256Hex(token) }).first<RequestRow | undefined>('id', 'email', 'name', 'password_hash', 'redirect_to', 'expires_at', 'used_at');
}

function judge(row: RequestRow | undefined, now: Date): RequestRow {
	if (!row) throw new SignUpLinkError('This link is not valid. Sign up again to get a new one.');
	if (row.used_at) throw new SignUpLinkError('This link was already used: the account exists. Sign in with it.');
	if (new Date(row.expires_at) <= now) throw new SignUpLinkError(`This link has expired (links last ${SIGN_UP_TTL_HOURS} hours). Sign up again to get a new one.`);
	return row;
}

/** The address and name waiting behind a confirmation link, or a SignUpLinkError saying why not. */
export async function checkSignUpLink(token: string, now = new Date()): Promise<{ email: string; name: string }> {
	const row = judge(await findRequest(db(), token), now);
	return { email: row.email, name: row.name };
}

/**
 * Creates the account the link was sent for, once. Every other pending sign-up of that address is
 * spent with it; if the address got an account meanwhile, nothing is created.
 */
export async function confirmSignUp(token: string, now = new Date()): Promise<{ user: SessionUser; redirectTo: string }> {
	return db().transaction(async (trx) => {
		const row = judge(await findRequest(trx, token).forUpdate(), now);
		if (await trx('users').whereRaw('lower(email) = ?', [row.email]).first('id')) {
			await trx('sign_up_requests').where({ email: row.email }).whereNull('used_at').update({ used_at: now });
			throw new SignUpLinkError('An account with this e-mail already exists. Sign in, or reset your password.');
		}
		const user = await insertUser(trx, { email: row.email, name: row.name, passwordHash: row.password_hash });
		await trx('sign_up_requests').where({ email: row.email }).whereNull('used_at').update({ used_at: now });
		return { user, redirectTo: safeRedirectTarget(row.redirect_to) };
	});
}
