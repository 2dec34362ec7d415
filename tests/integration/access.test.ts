import { describe, expect, it } from 'vitest';
import { requireMember, requireUser, canSeeField } from '$lib/server/access';
import { createFarm, deleteFarm } from '$lib/server/farms';
import { ROLES, type Capability } from '$lib/permissions';
import { fakeEvent, makeFarmWithTeam, makeUser, thrown } from './helpers';

// The product's roles table, written out again by hand so the database path is checked too.
const ALLOWED: Record<Capability, string[]> = {
	manageFarm: ['owner'],
	editPlans: ['owner', 'manager'],
	logRecords: ['owner', 'manager', 'crew'],
	scout: ['owner', 'manager', 'crew', 'advisor'],
	read: ['owner', 'manager', 'crew', 'advisor', 'viewer']
};

describe('requireMember against the database', async () => {
	const { farm, members } = await makeFarmWithTeam();
	for (const capability of Object.keys(ALLOWED) as Capability[]) {
		for (const role of ROLES) {
			const allowed = ALLOWED[capability].includes(role);
			it(`${role}: ${capability} → ${allowed ? 'allowed' : '403'}`, async () => {
				const event = fakeEvent(members[role]);
				if (allowed) {
					const access = await requireMember(event, farm.id, capability);
					expect(access.role).toBe(role);
					expect(access.farm.id).toBe(farm.id);
				} else {
					const e = await thrown(() => requireMember(event, farm.id, capability));
					expect(e.status).toBe(403);
					expect(e.body?.message).toContain(`cannot`);
				}
			});
		}
	}

	it('answers 404, not 403, for a farm the user is not a member of', async () => {
		const stranger = await makeUser('stranger');
		const e = await thrown(() => requireMember(fakeEvent(stranger), farm.id, 'read'));
		expect(e.status).toBe(404);
	});

	it('answers 404 for a malformed or unknown farm id', async () => {
		expect((await thrown(() => requireMember(fakeEvent(members.owner), 'not-a-uuid'))).status).toBe(404);
		expect((await thrown(() => requireMember(fakeEvent(members.owner), '00000000-0000-4000-8000-000000000000'))).status).toBe(404);
	});

	it('answers 404 once the farm is deleted', async () => {
		const owner = await makeUser('deleter');
		const doomed = await createFarm(owner.id, 'Doomed');
		await deleteFarm(doomed.id, owner.id);
		expect((await thrown(() => requireMember(fakeEvent(owner), doomed.id))).status).toBe(404);
	});

	it('answers 401 to API calls without a session, and sends page visitors to sign in', async () => {
		expect((await thrown(() => requireMember(fakeEvent(null, '/api/farms'), farm.id))).status).toBe(401);
		const r = await thrown(() => requireUser(fakeEvent(null, `/farms/${farm.id}/team`)));
		expect(r.status).toBe(303);
		expect(r.location).toBe(`/sign-in?redirectTo=${encodeURIComponent(`/farms/${farm.id}/team`)}`);
		expect((await thrown(() => requireUser(fakeEvent(null, `/farms/${farm.id}/team`, 'POST')))).status).toBe(401);
	});

	it('limits viewers to the fields granted to them', async () => {
		const viewer = await requireMember(fakeEvent(members.viewer), farm.id);
		const owner = await requireMember(fakeEvent(members.owner), farm.id);
		expect(viewer.fieldScope).toEqual([]);
		expect(canSeeField(viewer, '00000000-0000-4000-8000-0000000000f1')).toBe(false);
		expect(canSeeField(owner, '00000000-0000-4000-8000-0000000000f1')).toBe(true);
	});
});
