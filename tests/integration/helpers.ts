import { randomUUID } from 'node:crypto';
import { afterAll } from 'vitest';
import { db, closeDb } from '$lib/server/db';
import { createUser } from '$lib/server/users';
import { createFarm } from '$lib/server/farms';
import type { SessionUser } from '$lib/server/auth';
import type { Role } from '$lib/permissions';

afterAll(async () => {
	await closeDb();
});

export function uniqueEmail(tag = 'user') {
	return `${tag}-${randomUUID().slice(0, 8)}@example.test`;
}

export async function makeUser(tag = 'user', password = 'correct horse battery'): Promise<SessionUser> {
	return createUser({ email: uniqueEmail(tag), name: `Test ${tag}`, password });
}

/** A farm with one member per role (the owner created it). */
export async function makeFarmWithTeam() {
	const owner = await makeUser('owner');
	const farm = await createFarm(owner.id, `Test farm ${randomUUID().slice(0, 6)}`);
	const members: Record<Role, SessionUser> = { owner } as Record<Role, SessionUser>;
	for (const role of ['manager', 'crew', 'advisor', 'viewer'] as const) {
		const u = await makeUser(role);
		await db()('memberships').insert({ farm_id: farm.id, user_id: u.id, role });
		members[role] = u;
	}
	return { farm, members };
}

/** The parts of a SvelteKit RequestEvent the access module reads. */
export function fakeEvent(user: SessionUser | null, path = '/api/test', method = 'GET') {
	const url = new URL(`http://127.0.0.1${path}`);
	return { locals: { user, session: null }, url, request: new Request(url, { method }) };
}

/** Runs fn and returns the thrown SvelteKit error/redirect (or fails if nothing was thrown). */
export async function thrown(fn: () => unknown): Promise<{ status: number; body?: { message: string; code?: string }; location?: string }> {
	try {
		await fn();
	} catch (e) {
		return e as { status: number; body?: { message: string; code?: string }; location?: string };
	}
	throw new Error('expected the call to throw');
}
