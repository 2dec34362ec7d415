// The one gate to a farm's data. Every load, action and API route calls these before reading rows.
import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import { db } from './db';
import { can, CAPABILITY_LABELS, ROLE_LABELS, type Capability, type Role } from '../permissions';
import type { SessionUser } from './auth';
import { notFound } from './errors';
import { WatchedCache } from './watched-cache';

export interface FarmAccess {
	user: SessionUser;
	farm: { id: string; name: string; units: 'us' | 'metric'; timeZone: string };
	role: Role;
	/** Field ids a viewer may read; null = every field of the farm. */
	fieldScope: string[] | null;
	/** What this member may see beyond fields: viewers only what the owner chose to show them. */
	sees: { memberEmails: boolean; equipment: boolean };
	can: (capability: Capability) => boolean;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function isUuid(value: string | undefined | null): value is string {
	return typeof value === 'string' && UUID.test(value);
}

type Event = Pick<RequestEvent, 'locals' | 'url' | 'request'>;

/** The signed-in user; pages redirect to sign-in, everything else gets 401. */
export function requireUser(event: Event): SessionUser {
	const user = event.locals.user;
	if (user) return user;
	const isPageRead = event.request.method === 'GET' && !event.url.pathname.startsWith('/api/');
	if (isPageRead) {
		redirect(303, `/sign-in?redirectTo=${encodeURIComponent(event.url.pathname + event.url.search)}`);
	}
	error(401, { message: 'Sign in first: your session has ended or you are not signed in.', code: 'unauthenticated' });
}

export const FARM_NOT_FOUND = 'No farm here: it does not exist, was deleted, or you are not a member.';

// A page read runs the layout's and the page's loads on one request; both ask for the same
// membership, so a GET reads it once. Writes always read it afresh: an action may change it.
const readsOfRequest = new WeakMap<object, Map<string, Promise<MembershipRow | undefined>>>();

interface MembershipRow {
	id: string;
	name: string;
	units: 'us' | 'metric';
	time_zone: string;
	viewers_see_member_emails: boolean;
	viewers_see_equipment: boolean;
	role: string;
	field_scope: string[] | null;
}

// Reads keep a membership for a few seconds, so a burst of requests does not read it each time. Any
// change to memberships or farms, by this process or another (watched-cache.ts), empties it at once;
// a member removed or demoted is refused on the very next request.
const kept = new WatchedCache<MembershipRow>({ tables: ['memberships', 'farms'], ttlMs: 5_000, limit: 10_000 });

function membershipRow(event: Event, farmId: string, userId: string): Promise<MembershipRow | undefined> {
	// A Knex builder runs again on every await: settle it into one promise that can be shared.
	const fromDb = (): Promise<MembershipRow | undefined> =>
		Promise.resolve(db()('memberships as m')
			.join('farms as f', 'f.id', 'm.farm_id')
			.where({ 'm.farm_id': farmId, 'm.user_id': userId })
			.whereNull('f.deleted_at')
			.first('f.id', 'f.name', 'f.units', 'f.time_zone', 'f.viewers_see_member_emails', 'f.viewers_see_equipment', 'm.role', 'm.field_scope'));
	// Writes always read it afresh: an action may change it.
	if (event.request.method !== 'GET') return fromDb();
	kept.watch(db());
	const read = async () => {
		const row = await kept.get(`${userId}:${farmId}`, async () => (await fromDb()) ?? null);
		// Each request gets its own copy: nothing one request does to it reaches the next.
		return row ? { ...row, field_scope: row.field_scope ? [...row.field_scope] : null } : undefined;
	};
	let reads = readsOfRequest.get(event.locals);
	if (!reads) readsOfRequest.set(event.locals, (reads = new Map()));
	const key = `${userId}:${farmId}`;
	let pending = reads.get(key);
	if (!pending) reads.set(key, (pending = read()));
	return pending;
}

/**
 * The signed-in user's membership of the farm, refused unless the role holds the capability.
 * Another farm's id answers exactly like a missing one (404), so ids reveal nothing.
 */
export async function requireMember(event: Event, farmId: string | undefined, capability: Capability = 'read'): Promise<FarmAccess> {
	const user = requireUser(event);
	if (!isUuid(farmId)) error(404, { message: FARM_NOT_FOUND, code: 'not_found' });
	const row = await membershipRow(event, farmId, user.id);
	if (!row) error(404, { message: FARM_NOT_FOUND, code: 'not_found' });
	const role = row.role as Role;
	if (!can(role, capability)) {
		error(403, {
			message: `Your role on ${row.name} is ${ROLE_LABELS[role]}, which cannot ${CAPABILITY_LABELS[capability]}. Ask the farm's owner if you need it.`,
			code: 'forbidden'
		});
	}
	return {
		user,
		farm: { id: row.id, name: row.name, units: row.units, timeZone: row.time_zone },
		role,
		fieldScope: role === 'viewer' ? (row.field_scope ?? []) : null,
		sees: role === 'viewer' ? { memberEmails: row.viewers_see_member_emails, equipment: row.viewers_see_equipment } : { memberEmails: true, equipment: true },
		can: (c) => can(role, c)
	};
}

/** Whether this member may see the field (viewers: only the fields granted to them). */
export function canSeeField(access: FarmAccess, fieldId: string): boolean {
	return access.fieldScope === null || access.fieldScope.includes(fieldId);
}

/**
 * A field named by the caller (in a path or a query): it must be this farm's, not deleted, and
 * visible to this member; anything else answers 404 exactly like a missing field.
 */
export async function requireField(access: FarmAccess, fieldId: string | undefined | null): Promise<{ id: string; name: string }> {
	if (!isUuid(fieldId) || !canSeeField(access, fieldId)) throw notFound('field');
	const row = await db()('fields').where({ id: fieldId, farm_id: access.farm.id }).whereNull('deleted_at').first('id', 'name');
	if (!row) throw notFound('field');
	return row;
}
