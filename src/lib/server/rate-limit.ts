import { db } from './db';
import { normalizeEmail } from './users';

/**
 * Sign-in throttling, after OWASP's Authentication Cheat Sheet (OWASP Foundation, "Login
 * Throttling" and "Account Lockout"): no hard lock that a stranger can set off. Per e-mail, the
 * first failures are free, then each further failure makes the next attempt wait twice as long,
 * capped at a minute, from every address alike. Per client address, too many failures in the window
 * pause that address only. Kept in PostgreSQL so every app instance counts the same tries.
 */
export const SIGN_IN_LIMITS = {
	windowMinutes: 15,
	freeFailuresPerAccount: 10,
	maxAccountDelaySeconds: 60,
	perAddress: 100
} as const;

export interface RateDecision {
	allowed: boolean;
	retryAfterSeconds: number;
	message?: string;
}

/** Seconds the account waits after its nth consecutive failure: 0, …, 0, 1, 2, 4, … up to the cap. */
export function accountDelaySeconds(failures: number): number {
	const over = failures - SIGN_IN_LIMITS.freeFailuresPerAccount;
	if (over <= 0) return 0;
	return Math.min(2 ** (over - 1), SIGN_IN_LIMITS.maxAccountDelaySeconds);
}

/** IPv6 clients usually hold a whole /64, so they are counted by that prefix. */
export function addressKey(ip: string): string {
	const mapped = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/i.exec(ip);
	if (mapped) return mapped[1];
	if (!ip.includes(':')) return ip;
	const [head, tail = ''] = ip.toLowerCase().split('::');
	const left = head ? head.split(':') : [];
	const right = ip.includes('::') && tail ? tail.split(':') : [];
	const groups = ip.includes('::') ? [...left, ...Array(Math.max(0, 8 - left.length - right.length)).fill('0'), ...right] : left;
	return `${groups.slice(0, 4).map((g) => g.replace(/^0+(?=.)/, '')).join(':')}::/64`;
}

function waitMessage(scope: string, seconds: number): string {
	if (scope === 'account') {
		return `Too many failed sign-ins for this e-mail. Wait ${seconds} second${seconds === 1 ? '' : 's'} and try again, or reset your password.`;
	}
	const minutes = Math.ceil(seconds / 60);
	return `Too many failed sign-ins from your network. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`;
}

export async function checkSignInAllowed(email: string, ip: string, now = new Date()): Promise<RateDecision> {
	const rows: { scope: string; blocked_until: Date }[] = await db()('sign_in_throttles')
		.where((q) => q.where({ scope: 'account', key: normalizeEmail(email) }).orWhere({ scope: 'address', key: addressKey(ip) }))
		.where('blocked_until', '>', now)
		.select('scope', 'blocked_until');
	if (!rows.length) return { allowed: true, retryAfterSeconds: 0 };
	// The address pause is the longer one; name it so the person knows the e-mail is not the cause.
	const worst = rows.reduce((a, b) => (new Date(a.blocked_until) >= new Date(b.blocked_until) ? a : b));
	const retryAfterSeconds = Math.max(1, Math.ceil((new Date(worst.blocked_until).getTime() - now.getTime()) / 1000));
	return { allowed: false, retryAfterSeconds, message: waitMessage(worst.scope, retryAfterSeconds) };
}

/**
 * Counts one failure for the e-mail and for the address and sets their waits, in one statement:
 * a count older than the window starts again at one (the account's after 15 quiet minutes).
 */
export async function recordSignInFailure(email: string, ip: string, now = new Date()) {
	const windowStart = new Date(now.getTime() - SIGN_IN_LIMITS.windowMinutes * 60_000);
	const { freeFailuresPerAccount: free, maxAccountDelaySeconds: cap, perAddress } = SIGN_IN_LIMITS;
	const fresh = `CASE WHEN (t.scope = 'account' AND t.last_failure_at > :windowStart) OR (t.scope = 'address' AND t.first_failure_at > :windowStart)`;
	const failures = `(${fresh} THEN t.failures + 1 ELSE 1 END)`;
	const firstAt = `(${fresh} THEN t.first_failure_at ELSE :now END)`;
	const result = await db().raw(
		`INSERT INTO sign_in_throttles AS t (scope, key, failures, first_failure_at, last_failure_at, blocked_until)
		 VALUES ('account', :account, 1, :now, :now, NULL), ('address', :address, 1, :now, :now, NULL)
		 ON CONFLICT (scope, key) DO UPDATE SET
		   failures = ${failures},
		   first_failure_at = ${firstAt},
		   last_failure_at = :now,
		   blocked_until = CASE
		     WHEN t.scope = 'account' AND ${failures} > :free
		       THEN CAST(:now AS timestamptz) + least(power(2, ${failures} - :free - 1), :cap) * interval '1 second'
		     WHEN t.scope = 'address' AND ${failures} >= :perAddress
		       THEN ${firstAt} + CAST(:windowMinutes AS integer) * interval '1 minute'
		     ELSE NULL END
		 RETURNING scope, failures, blocked_until`,
		{ account: normalizeEmail(email), address: addressKey(ip), now, windowStart, free, cap, perAddress, windowMinutes: SIGN_IN_LIMITS.windowMinutes }
	);
	return result.rows as { scope: 'account' | 'address'; failures: number; blocked_until: Date | null }[];
}

/** A right password clears the e-mail's count; the address keeps its own, so one good account cannot reset it. */
export async function recordSignInSuccess(email: string) {
	await db()('sign_in_throttles').where({ scope: 'account', key: normalizeEmail(email) }).delete();
}

/** Requests a signed-in user may make of each costly endpoint per window. */
export const REQUEST_LIMITS = {
	'layout-preview': { perWindow: 120, windowSeconds: 60, what: 'layout previews' },
	// Sign-up and reset mail to one address (keyed by the address): nobody can flood a mailbox
	// through our forms. Over the limit the mail is left unsent and the page answers as always.
	'account-mail': { perWindow: 10, windowSeconds: 3600, what: 'account e-mails to one address' }
} as const;

const WINDOW_WORDS: Record<number, string> = { 60: 'a minute', 3600: 'an hour' };

/**
 * Counts one request for `key` (a user id) in the bucket's fixed window, atomically in one
 * upsert, and says whether it is within the limit and, if not, when the window ends.
 */
export async function takeRequest(bucket: keyof typeof REQUEST_LIMITS, key: string, now = new Date()): Promise<RateDecision> {
	const { perWindow, windowSeconds, what } = REQUEST_LIMITS[bucket];
	const windowStart = new Date(now.getTime() - windowSeconds * 1000);
	const result = await db().raw(
		`INSERT INTO request_counts AS r (bucket, key, window_start, count) VALUES (:bucket, :key, :now, 1)
		 ON CONFLICT (bucket, key) DO UPDATE SET
		   count = CASE WHEN r.window_start > :windowStart THEN r.count + 1 ELSE 1 END,
		   window_start = CASE WHEN r.window_start > :windowStart THEN r.window_start ELSE :now END
		 RETURNING count, window_start`,
		{ bucket, key, now, windowStart }
	);
	const row = result.rows[0] as { count: number; window_start: Date };
	if (row.count <= perWindow) return { allowed: true, retryAfterSeconds: 0 };
	const retryAfterSeconds = Math.max(1, Math.ceil((new Date(row.window_start).getTime() + windowSeconds * 1000 - now.getTime()) / 1000));
	return {
		allowed: false,
		retryAfterSeconds,
		message: `Too many ${what}: at most ${perWindow} ${WINDOW_WORDS[windowSeconds] ?? `in ${windowSeconds} s`}. Wait ${retryAfterSeconds} second${retryAfterSeconds === 1 ? '' : 's'} and try again.`
	};
}
