import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { acceptInvitation, createInvitation, getInvitation, InvitationError, mayInvite, revokeInvitation } from '$lib/server/invitations';
import { createUser } from '$lib/server/users';
import { ROLES } from '$lib/permissions';
import { createFarm, listFarmsForUser } from '$lib/server/farms';
import { makeFarmWithTeam, makeUser, uniqueEmail } from './helpers';

/** An account whose e-mail is the given address, as the invitee would create it. */
const accountFor = (email: string) => createUser({ email, name: `Holder of ${email}`, password: 'invitee password' });

describe('invitations', () => {
	it('shows the farm and role, and makes a new user a member with that role', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const email = uniqueEmail('invitee');
		const inv = await createInvitation(farm.id, members.owner.id, email, 'advisor');
		expect(await getInvitation(inv.token)).toMatchObject({ farmId: farm.id, farmName: farm.name, role: 'advisor', email, invitedByName: members.owner.name });
		const newcomer = await accountFor(email);
		await acceptInvitation(inv.token, newcomer.id);
		expect(await listFarmsForUser(newcomer.id)).toEqual([{ id: farm.id, name: farm.name, role: 'advisor', timeZone: 'America/Chicago' }]);
	});

	it('lasts 7 days', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const sent = new Date('2026-02-01T08:00:00Z');
		const email = uniqueEmail('late');
		const inv = await createInvitation(farm.id, members.owner.id, email, 'crew', sent);
		expect(inv.expiresAt.toISOString()).toBe('2026-02-08T08:00:00.000Z');
		const u = await accountFor(email);
		await expect(acceptInvitation(inv.token, u.id, new Date('2026-02-08T08:00:01Z'))).rejects.toThrow(/expired \(invitations last 7 days\)/);
		expect(await listFarmsForUser(u.id)).toEqual([]);
	});

	it('cannot be used twice', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const email = uniqueEmail('twice');
		const inv = await createInvitation(farm.id, members.owner.id, email, 'crew');
		const a = await accountFor(email);
		await acceptInvitation(inv.token, a.id);
		await expect(acceptInvitation(inv.token, a.id)).rejects.toThrow(/already been accepted/);
		expect(await listFarmsForUser(a.id)).toEqual([{ id: farm.id, name: farm.name, role: 'crew', timeZone: 'America/Chicago' }]);
	});

	it('grants only the farm it was made for', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const otherOwner = await makeUser('other-owner');
		const otherFarm = await createFarm(otherOwner.id, 'Other farm');
		const email = uniqueEmail('scoped');
		const inv = await createInvitation(farm.id, members.owner.id, email, 'manager');
		const u = await accountFor(email);
		const view = await acceptInvitation(inv.token, u.id);
		expect(view.farmId).toBe(farm.id);
		const farms = await listFarmsForUser(u.id);
		expect(farms.map((f) => f.id)).toEqual([farm.id]);
		expect(farms.map((f) => f.id)).not.toContain(otherFarm.id);
	});

	it('is replaced by a newer invitation to the same address, and can be withdrawn', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const email = uniqueEmail('again');
		const first = await createInvitation(farm.id, members.owner.id, email, 'viewer');
		const second = await createInvitation(farm.id, members.owner.id, email, 'crew');
		await expect(getInvitation(first.token)).rejects.toThrow(/withdrawn or replaced/);
		expect(await revokeInvitation(farm.id, members.owner.id, second.id)).toBe(true);
		await expect(getInvitation(second.token)).rejects.toBeInstanceOf(InvitationError);
	});

	it('refuses to invite someone who is already a member', async () => {
		const { farm, members } = await makeFarmWithTeam();
		await expect(createInvitation(farm.id, members.owner.id, members.crew.email.toUpperCase(), 'manager')).rejects.toThrow(/already a member/);
	});

	it('raises an existing lower role but never lowers a higher one', async () => {
		const { farm, members } = await makeFarmWithTeam();
		// Invitations to existing members are refused at creation, so the invitees join by another
		// way after the invitation was sent.
		const upEmail = uniqueEmail('up');
		const downEmail = uniqueEmail('down');
		const up = await createInvitation(farm.id, members.owner.id, upEmail, 'manager');
		const down = await createInvitation(farm.id, members.owner.id, downEmail, 'viewer');
		const raised = await accountFor(upEmail);
		const kept = await accountFor(downEmail);
		await db()('memberships').insert([
			{ farm_id: farm.id, user_id: raised.id, role: 'viewer' },
			{ farm_id: farm.id, user_id: kept.id, role: 'manager' }
		]);
		await acceptInvitation(up.token, raised.id);
		await acceptInvitation(down.token, kept.id);
		const roles = Object.fromEntries((await db()('memberships').where({ farm_id: farm.id })).map((m) => [m.user_id, m.role]));
		expect(roles[raised.id]).toBe('manager');
		expect(roles[kept.id]).toBe('manager');
	});

	it('is refused once the farm is deleted', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const inv = await createInvitation(farm.id, members.owner.id, uniqueEmail('gone'), 'crew');
		await db()('farms').where({ id: farm.id }).update({ deleted_at: new Date() });
		await expect(getInvitation(inv.token)).rejects.toThrow(/not valid/);
	});

	it('is accepted only by the account with the invited address, in any letter case', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const email = uniqueEmail('addressee');
		const inv = await createInvitation(farm.id, members.owner.id, email, 'crew');
		const stranger = await makeUser('forwarded-to');
		await expect(acceptInvitation(inv.token, stranger.id)).rejects.toThrow(
			`This invitation is for ${email}, but you are signed in as ${stranger.email}. Sign out, then sign in or create an account with ${email} to accept it.`
		);
		expect(await listFarmsForUser(stranger.id)).toEqual([]);
		// The refusal spent nothing: the addressee can still accept, whatever the case of their address.
		const addressee = await createUser({ email: email.toUpperCase(), name: 'Addressee', password: 'invitee password' });
		await acceptInvitation(inv.token, addressee.id);
		expect(await listFarmsForUser(addressee.id)).toEqual([{ id: farm.id, name: farm.name, role: 'crew', timeZone: 'America/Chicago' }]);
	});
});

describe('who may invite whom', () => {
	it('lets only owners invite, and only owners hand out the owner role', () => {
		const allowed = ROLES.flatMap((inviter) => ROLES.filter((invited) => mayInvite(inviter, invited)).map((invited) => `${inviter}→${invited}`));
		expect(allowed).toEqual(['owner→owner', 'owner→manager', 'owner→crew', 'owner→advisor', 'owner→viewer']);
	});

	it('refuses an owner invitation from a manager, and any invitation from lower roles, storing nothing', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const email = uniqueEmail('would-be-owner');
		await expect(createInvitation(farm.id, members.manager.id, email, 'owner')).rejects.toThrow('Only an owner of this farm can invite another owner.');
		await expect(createInvitation(farm.id, members.crew.id, email, 'viewer')).rejects.toThrow('Your role on this farm (Crew) cannot invite members; ask an owner.');
		await expect(createInvitation(farm.id, (await makeUser('outsider')).id, email, 'viewer')).rejects.toThrow('Your role on this farm (none) cannot invite members; ask an owner.');
		expect(await db()('invitations').where({ farm_id: farm.id, email })).toEqual([]);
	});

	it('lets an owner invite another owner', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const email = uniqueEmail('co-owner');
		const inv = await createInvitation(farm.id, members.owner.id, email, 'owner');
		const coOwner = await accountFor(email);
		await acceptInvitation(inv.token, coOwner.id);
		expect(await listFarmsForUser(coOwner.id)).toEqual([{ id: farm.id, name: farm.name, role: 'owner', timeZone: 'America/Chicago' }]);
	});
});
