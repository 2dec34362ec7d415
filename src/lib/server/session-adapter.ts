import type { Adapter, DatabaseSession, DatabaseUser } from 'lucia';
import type { Knex } from 'knex';
import { sha256Hex } from './tokens';
import { SessionCache } from './session-cache';

interface SessionRow {
	id: string;
	user_id: string;
	expires_at: Date;
}

/**
 * Lucia adapter on Knex. Lucia hands us the raw session id from the cookie; only its SHA-256 is
 * ever written or compared, so the sessions table alone cannot be used to sign in.
 */
export class KnexSessionAdapter implements Adapter {
	/** Session rows of the last few seconds; see session-cache.ts for when they are dropped. */
	readonly cache = new SessionCache();

	constructor(private readonly knex: () => Knex) {}

	async getSessionAndUser(sessionId: string): Promise<[DatabaseSession | null, DatabaseUser | null]> {
		const knex = this.knex();
		this.cache.watch(knex);
		const key = sha256Hex(sessionId);
		const row = await this.cache.get(key, async () => {
			const r = await knex('sessions as s')
				.join('users as u', 'u.id', 's.user_id')
				.where('s.id', key)
				// Prepared once per connection: this runs on nearly every request.
				.options({ name: 'session_and_user' })
				.first('s.user_id', 's.expires_at', 'u.email', 'u.name');
			return r ? { userId: r.user_id, expiresAt: new Date(r.expires_at), email: r.email, name: r.name } : null;
		});
		if (!row) return [null, null];
		return [
			{ id: sessionId, userId: row.userId, expiresAt: row.expiresAt, attributes: {} },
			{ id: row.userId, attributes: { email: row.email, name: row.name } }
		];
	}

	async getUserSessions(userId: string): Promise<DatabaseSession[]> {
		const rows: SessionRow[] = await this.knex()('sessions').where({ user_id: userId });
		// Only hashes are stored; these ids cannot be turned back into cookies.
		return rows.map((r) => ({ id: r.id, userId: r.user_id, expiresAt: new Date(r.expires_at), attributes: {} }));
	}

	async setSession(session: DatabaseSession): Promise<void> {
		await this.knex()('sessions').insert({
			id: sha256Hex(session.id),
			user_id: session.userId,
			expires_at: session.expiresAt
		});
	}

	async updateSessionExpiration(sessionId: string, expiresAt: Date): Promise<void> {
		await this.knex()('sessions').where({ id: sha256Hex(sessionId) }).update({ expires_at: expiresAt });
		this.cache.expiryMoved(sha256Hex(sessionId), expiresAt);
	}

	async deleteSession(sessionId: string): Promise<void> {
		this.cache.forget(sha256Hex(sessionId));
		await this.knex()('sessions').where({ id: sha256Hex(sessionId) }).delete();
	}

	async deleteUserSessions(userId: string): Promise<void> {
		this.cache.forgetUser(userId);
		await this.knex()('sessions').where({ user_id: userId }).delete();
	}

	async deleteExpiredSessions(): Promise<void> {
		await this.knex()('sessions').where('expires_at', '<=', new Date()).delete();
	}
}
