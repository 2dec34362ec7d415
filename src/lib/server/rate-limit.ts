import { db } from './db';
import { normalizeEmail } from './users';

// Failed sign-ins allowed in the window, per e-mail and per client address. Kept in PostgreSQL so
// every app instance counts the same tries.
export const SIGN_IN_LIMITS = { windowMinutes: 15, perEmail: 10, perIp: 100 } as const;

export interface RateDecision {
	allowed: boolean;
	retryAfterSeconds: number;
	message?: string;
}

export async function checkSignInAllowed(email: string, ip: string, now = new Date()): Promise<RateDecision> {
	const since = new Date(now.getTime() - SIGN_IN_LIMITS.windowMinutes * 60_000);
	const [byEmail, byIp] = await Promise.all([
		db()('login_attempts').where({ email: normalizeEmail(email), succeeded: false }).where('at', '>', since).count<{ count: number }[]>('* as count').min('at as first'),
		db()('login_attempts').where({ ip, succeeded: false }).where('at', '>', since).count<{ count: number }[]>('* as count').min('at as first')
	]);
	const over = [
		{ row: byEmail[0] as { count: number; first: Date | null }, limit: SIGN_IN_LIMITS.perEmail, what: 'for this e-mail' },
		{ row: byIp[0] as { count: number; first: Date | null }, limit: SIGN_IN_LIMITS.perIp, what: 'from your network' }
	].find((c) => Number(c.row.count) >= c.limit);
	if (!over) return { allowed: true, retryAfterSeconds: 0 };
	const first = over.row.first ? new Date(over.row.first).getTime() : now.getTime();
	const retryAfterSeconds = Math.max(1, Math.ceil((first + SIGN_IN_LIMITS.windowMinutes * 60_000 - now.getTime()) / 1000));
	const minutes = Math.ceil(retryAfterSeconds / 60);
	return {
		allowed: false,
		retryAfterSeconds,
		message: `Too many failed sign-in attempts ${over.what}. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}, or reset your password.`
	};
}

export async function recordSignInAttempt(email: string, ip: string, succeeded: boolean) {
	await db()('login_attempts').insert({ email: normalizeEmail(email), ip, succeeded });
	if (succeeded) {
		// A successful sign-in clears the e-mail's failure count.
		await db()('login_attempts').where({ email: normalizeEmail(email), succeeded: false }).delete();
	}
}
