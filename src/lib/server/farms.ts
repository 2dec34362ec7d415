import { db } from './db';
import { recordAudit } from './audit';
import type { Role } from '../permissions';

export interface FarmSummary {
	id: string;
	name: string;
	role: Role;
	timeZone: string;
}

export async function createFarm(userId: string, name: string): Promise<FarmSummary> {
	return db().transaction(async (trx) => {
		const [farm] = await trx('farms').insert({ name: name.trim() }).returning(['id', 'name', 'time_zone']);
		await trx('memberships').insert({ farm_id: farm.id, user_id: userId, role: 'owner' });
		await recordAudit(trx, { farmId: farm.id, userId, entity: 'farm', entityId: farm.id, action: 'create', after: { name: farm.name } });
		return { id: farm.id, name: farm.name, role: 'owner' as const, timeZone: farm.time_zone };
	});
}

/** The farms a user belongs to, with the user's role on each. */
export async function listFarmsForUser(userId: string): Promise<FarmSummary[]> {
	return db()('memberships as m')
		.join('farms as f', 'f.id', 'm.farm_id')
		.where('m.user_id', userId)
		.whereNull('f.deleted_at')
		.orderBy('f.name')
		.select('f.id', 'f.name', 'm.role', 'f.time_zone as timeZone');
}

export async function renameFarm(farmId: string, userId: string, name: string) {
	await db().transaction(async (trx) => {
		const before = await trx('farms').where({ id: farmId }).first('name');
		await trx('farms').where({ id: farmId }).update({ name: name.trim(), updated_at: trx.fn.now() });
		await recordAudit(trx, { farmId, userId, entity: 'farm', entityId: farmId, action: 'rename', before, after: { name } });
	});
}

/** Soft delete: the farm disappears for everyone; rows stay for the audit trail. */
export async function deleteFarm(farmId: string, userId: string) {
	await db().transaction(async (trx) => {
		await trx('farms').where({ id: farmId }).update({ deleted_at: trx.fn.now() });
		await trx('invitations').where({ farm_id: farmId }).whereNull('accepted_at').update({ revoked_at: trx.fn.now() });
		await recordAudit(trx, { farmId, userId, entity: 'farm', entityId: farmId, action: 'delete' });
	});
}

export interface ViewerPrivacy {
	/** Viewers see members' e-mail addresses on the team page. */
	memberEmails: boolean;
	/** Viewers see the farm's implements (equipment pages, planter checks, the sheet's setup). */
	equipment: boolean;
}

export async function getViewerPrivacy(farmId: string): Promise<ViewerPrivacy> {
	const row = await db()('farms').where({ id: farmId }).first('viewers_see_member_emails', 'viewers_see_equipment');
	return { memberEmails: row.viewers_see_member_emails, equipment: row.viewers_see_equipment };
}

export async function setViewerPrivacy(farmId: string, userId: string, privacy: ViewerPrivacy) {
	await db().transaction(async (trx) => {
		const before = await trx('farms').where({ id: farmId }).forUpdate().first('viewers_see_member_emails', 'viewers_see_equipment');
		await trx('farms')
			.where({ id: farmId })
			.update({ viewers_see_member_emails: privacy.memberEmails, viewers_see_equipment: privacy.equipment, updated_at: trx.fn.now() });
		await recordAudit(trx, {
			farmId, userId, entity: 'farm', entityId: farmId, action: 'viewer_privacy',
			before: { memberEmails: before.viewers_see_member_emails, equipment: before.viewers_see_equipment },
			after: privacy
		});
	});
}

/** Units the farm's pages show numbers in. Stored values stay in US customary units. */
export async function setFarmUnits(farmId: string, userId: string, units: 'us' | 'metric') {
	await db().transaction(async (trx) => {
		const before = await trx('farms').where({ id: farmId }).forUpdate().first('units');
		await trx('farms').where({ id: farmId }).update({ units, updated_at: trx.fn.now() });
		await recordAudit(trx, { farmId, userId, entity: 'farm', entityId: farmId, action: 'units', before: { units: before.units }, after: { units } });
	});
}

/**
 * The zone the farm's days and clock times are shown in. Records keep the instants they were
 * given, so only how they read changes; nothing stored is rewritten.
 */
export async function setFarmTimeZone(farmId: string, userId: string, timeZone: string) {
	await db().transaction(async (trx) => {
		const before = await trx('farms').where({ id: farmId }).forUpdate().first('time_zone');
		await trx('farms').where({ id: farmId }).update({ time_zone: timeZone, updated_at: trx.fn.now() });
		await recordAudit(trx, { farmId, userId, entity: 'farm', entityId: farmId, action: 'time_zone', before: { timeZone: before.time_zone }, after: { timeZone } });
	});
}
