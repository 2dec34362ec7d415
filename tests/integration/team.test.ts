import { describe, expect, it } from 'vitest';
import { changeRole, listMembers, removeMember, TeamRuleError } from '$lib/server/team';
import { db } from '$lib/server/db';
import { makeFarmWithTeam } from './helpers';

describe('team rules', () => {
	it('does not let the last owner leave or be demoted', async () => {
		const { farm, members } = await makeFarmWithTeam();
		await expect(removeMember(farm.id, members.owner.id, members.owner.id)).rejects.toThrow(/last owner/);
		await expect(changeRole(farm.id, members.owner.id, members.owner.id, 'manager')).rejects.toBeInstanceOf(TeamRuleError);
		expect((await listMembers(farm.id)).find((m) => m.userId === members.owner.id)?.role).toBe('owner');
	});

	it('lets an owner step down once there is another owner', async () => {
		const { farm, members } = await makeFarmWithTeam();
		await changeRole(farm.id, members.owner.id, members.manager.id, 'owner');
		await changeRole(farm.id, members.manager.id, members.owner.id, 'crew');
		const roles = Object.fromEntries((await listMembers(farm.id)).map((m) => [m.userId, m.role]));
		expect(roles[members.owner.id]).toBe('crew');
		expect(roles[members.manager.id]).toBe('owner');
		const audit = await db()('audit_log').where({ farm_id: farm.id, action: 'change_role' }).orderBy('id');
		expect(audit.map((a) => [a.before.role, a.after.role])).toEqual([['manager', 'owner'], ['owner', 'crew']]);
	});

	it('removes a member and lists the rest by role', async () => {
		const { farm, members } = await makeFarmWithTeam();
		await removeMember(farm.id, members.owner.id, members.crew.id);
		expect((await listMembers(farm.id)).map((m) => m.role)).toEqual(['owner', 'manager', 'advisor', 'viewer']);
		await expect(removeMember(farm.id, members.owner.id, members.crew.id)).rejects.toThrow(/not a member/);
	});
});
