import { db } from './db';
import { recordAudit } from './audit';
import type { Role } from '../permissions';
import type { FarmAccess } from './access';

export interface Member {
	userId: string;
	name: string;
	email: string;
	role: Role;
	fieldScope: string[] | null;
	since: Date;
}

export class TeamRuleError extends Error {}

export async function listMembers(farmId: string): Promise<Member[]> {
	const rows = await db()('memberships as m')
		.join('users as u', 'u.id', 'm.user_id')
		.where('m.farm_id', farmId)
		.orderByRaw(`array_position(array['owner','manager','crew','advisor','viewer'], m.role), lower(u.name)`)
		.select('u.id', 'u.name', 'u.email', 'm.role', 'm.field_scope', 'm.created_at');
	return rows.map((r) => ({ userId: r.id, name: r.name, email: r.email, role: r.role, fieldScope: r.field_scope, since: r.created_at }));
}

export type VisibleMember = Omit<Member, 'email'> & { email: string | null };

/** The members as this member may see them: a viewer gets no e-mail addresses unless the owner shows them. */
export async function listMembersFor(access: FarmAccess): Promise<VisibleMember[]> {
	const members = await listMembers(access.farm.id);
	return access.sees.memberEmails ? members : members.map((m) => ({ ...m, email: m.userId === access.user.id ? m.email : null }));
}

// Locks the farm's owner rows so two owners cannot demote each other at the same instant.
async function ownerCount(trx: ReturnType<typeof db>, farmId: string): Promise<number> {
	const rows = await trx('memberships').where({ farm_id: farmId, role: 'owner' }).forUpdate().select('user_id');
	return rows.length;
}

export async function changeRole(farmId: string, actorId: string, userId: string, role: Role) {
	await db().transaction(async (trx) => {
		const current = await trx('memberships').where({ farm_id: farmId, user_id: userId }).forUpdate().first();
		if (!current) throw new TeamRuleError('That person is not a member of this farm.');
		if (current.role === role) return;
		if (current.role === 'owner' && (await ownerCount(trx, farmId)) <= 1) {
			throw new TeamRuleError('The farm needs at least one owner. Make someone else an owner first.');
		}
		await trx('memberships')
			.where({ farm_id: farmId, user_id: userId })
			.update({ role, field_scope: role === 'viewer' ? current.field_scope : null });
		await recordAudit(trx, { farmId, userId: actorId, entity: 'membership', entityId: userId, action: 'change_role', before: { role: current.role }, after: { role } });
	});
}

export async function removeMember(farmId: string, actorId: string, userId: string) {
	await db().transaction(async (trx) => {
		const current = await trx('memberships').where({ farm_id: farmId, user_id: userId }).forUpdate().first();
		if (!current) throw new TeamRuleError('That person is not a member of this farm.');
		if (current.role === 'owner' && (await ownerCount(trx, farmId)) <= 1) {
			throw new TeamRuleError(
				actorId === userId
					? 'You are the last owner: make someone else an owner before you leave, or delete the farm.'
					: 'The farm needs at least one owner.'
			);
		}
		await trx('memberships').where({ farm_id: farmId, user_id: userId }).delete();
		await recordAudit(trx, { farmId, userId: actorId, entity: 'membership', entityId: userId, action: actorId === userId ? 'leave' : 'remove', before: { role: current.role } });
	});
}

/** Viewers see only the fields granted to them; null grants every field. */
export async function setFieldScope(farmId: string, actorId: string, userId: string, fieldIds: string[] | null) {
	await db().transaction(async (trx) => {
		await trx('memberships').where({ farm_id: farmId, user_id: userId }).update({ field_scope: fieldIds });
		await recordAudit(trx, { farmId, userId: actorId, entity: 'membership', entityId: userId, action: 'field_scope', after: { fieldIds } });
	});
}
