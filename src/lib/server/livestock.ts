// Livestock groups and the events that change their head count. The count on the group is kept
// in step with its events inside one transaction, so it is always current.
import type { Knex } from 'knex';
import { db } from './db';
import { recordAudit } from './audit';
import { isUuid, type FarmAccess } from './access';
import { AppError, invalid, notFound, versionConflict } from './errors';
import { groupFigures, type GroupFigures } from '../livestock/figures';
import { readMoveTime } from '../livestock/moves';
import { EVENTS_OUT, type EventInput, type EventKind, type GroupCreateInput, type GroupPatchInput } from '../livestock/schemas';
import type { Species } from '../livestock/species';

export interface LivestockGroup extends GroupFigures {
	id: string;
	name: string;
	species: Species;
	head: number;
	averageWeightLb: number;
	notes: string | null;
	version: number;
	createdAt: string;
}

export interface LivestockEvent {
	id: string;
	groupId: string;
	kind: EventKind;
	head: number;
	headAfter: number;
	cause: string | null;
	occurredAt: string;
	notes: string | null;
	createdBy: string | null;
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function toGroup(r: any): LivestockGroup {
	return {
		id: r.id,
		name: r.name,
		species: r.species,
		head: r.head,
		averageWeightLb: r.average_weight_lb,
		notes: r.notes,
		version: r.version,
		createdAt: new Date(r.created_at).toISOString(),
		...groupFigures(r.species, r.head, r.average_weight_lb)
	};
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function toEvent(r: any): LivestockEvent {
	return {
		id: r.id,
		groupId: r.group_id,
		kind: r.kind,
		head: r.head,
		headAfter: r.head_after,
		cause: r.cause,
		occurredAt: new Date(r.occurred_at).toISOString(),
		notes: r.notes,
		createdBy: r.created_by_name ?? null
	};
}

function duplicateName(e: unknown, name: string) {
	if ((e as { code?: string }).code === '23505') {
		const message = `The farm already has a group named ${name}.`;
		return invalid(message, { name: [message] });
	}
	return e;
}

export async function listGroups(access: FarmAccess, q: Knex = db()): Promise<LivestockGroup[]> {
	const rows = await q('livestock_groups').where({ farm_id: access.farm.id }).whereNull('deleted_at').orderBy('name');
	return rows.map(toGroup);
}

async function groupRow(q: Knex, access: FarmAccess, groupId: string, lock = false) {
	if (!isUuid(groupId)) throw notFound('livestock group');
	const query = q('livestock_groups').where({ id: groupId, farm_id: access.farm.id }).whereNull('deleted_at').first();
	const row = await (lock ? query.forUpdate() : query);
	if (!row) throw notFound('livestock group');
	return row;
}

export async function getGroup(access: FarmAccess, groupId: string): Promise<LivestockGroup> {
	return toGroup(await groupRow(db(), access, groupId));
}

export async function createGroup(access: FarmAccess, input: GroupCreateInput): Promise<LivestockGroup> {
	try {
		return await db().transaction(async (trx) => {
			const [row] = await trx('livestock_groups')
				.insert({
					farm_id: access.farm.id,
					name: input.name,
					species: input.species,
					head: input.head,
					average_weight_lb: input.averageWeightLb,
					notes: input.notes,
					created_by: access.user.id,
					updated_by: access.user.id
				})
				.returning('*');
			const group = toGroup(row);
			await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'livestock_group', entityId: group.id, action: 'create', after: { name: group.name, species: group.species, head: group.head, averageWeightLb: group.averageWeightLb } });
			return group;
		});
	} catch (e) {
		throw duplicateName(e, input.name);
	}
}

export async function updateGroup(access: FarmAccess, groupId: string, patch: GroupPatchInput): Promise<LivestockGroup> {
	try {
		return await db().transaction(async (trx) => {
			const before = await groupRow(trx, access, groupId, true);
			if (before.version !== patch.version) throw versionConflict('group', before.version, patch.version);
			const [row] = await trx('livestock_groups')
				.where({ id: before.id })
				.update({
					...(patch.name !== undefined ? { name: patch.name } : {}),
					...(patch.averageWeightLb !== undefined ? { average_weight_lb: patch.averageWeightLb } : {}),
					...(patch.notes !== undefined ? { notes: patch.notes } : {}),
					version: before.version + 1,
					updated_by: access.user.id,
					updated_at: trx.fn.now()
				})
				.returning('*');
			await recordAudit(trx, {
				farmId: access.farm.id,
				userId: access.user.id,
				entity: 'livestock_group',
				entityId: before.id,
				action: 'update',
				before: { name: before.name, averageWeightLb: before.average_weight_lb, notes: before.notes },
				after: { name: row.name, averageWeightLb: row.average_weight_lb, notes: row.notes }
			});
			return toGroup(row);
		});
	} catch (e) {
		throw duplicateName(e, patch.name ?? '');
	}
}

/** Soft delete: its events and moves stay on record. */
export async function deleteGroup(access: FarmAccess, groupId: string): Promise<void> {
	await db().transaction(async (trx) => {
		const before = await groupRow(trx, access, groupId, true);
		await trx('livestock_groups').where({ id: before.id }).update({ deleted_at: trx.fn.now(), deleted_by: access.user.id });
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'livestock_group', entityId: before.id, action: 'delete', before: { name: before.name, head: before.head } });
	});
}

export async function listEvents(access: FarmAccess, groupId: string): Promise<LivestockEvent[]> {
	const group = await groupRow(db(), access, groupId);
	const rows = await db()('livestock_events as e')
		.leftJoin('users as u', 'u.id', 'e.created_by')
		.where({ 'e.farm_id': access.farm.id, 'e.group_id': group.id })
		.whereNull('e.deleted_at')
		.orderBy([{ column: 'e.occurred_at', order: 'desc' }, { column: 'e.created_at', order: 'desc' }])
		.select('e.*', 'u.name as created_by_name');
	return rows.map(toEvent);
}

/**
 * Logs a birth, purchase, sale, death or loss and moves the head count with it. Taking out more
 * animals than the group has is refused and nothing is saved.
 */
export async function logEvent(access: FarmAccess, groupId: string, input: EventInput): Promise<{ event: LivestockEvent; group: LivestockGroup }> {
	const occurredAt = readMoveTime(input.occurredAt, access.farm.timeZone);
	if (!occurredAt) throw invalid('The date is not one we can read: use YYYY-MM-DD or an ISO 8601 time with an offset.', { occurredAt: ['Use YYYY-MM-DD or an ISO 8601 time with an offset.'] });
	if (occurredAt.getTime() > Date.now() + 86_400_000) throw invalid('An event cannot be logged for a day still to come.', { occurredAt: ['An event cannot be logged for a day still to come.'] });
	return db().transaction(async (trx) => {
		// The row lock makes two losses logged at once count one after the other.
		const group = await groupRow(trx, access, groupId, true);
		const out = EVENTS_OUT.includes(input.kind);
		if (out && input.head > group.head) {
			const message = `${group.name} has ${group.head} head; a ${input.kind} of ${input.head} is more than the group has. Nothing was saved.`;
			throw new AppError(400, message, 'invalid', { head: [message] });
		}
		const headAfter = out ? group.head - input.head : group.head + input.head;
		const [row] = await trx('livestock_events')
			.insert({
				farm_id: access.farm.id,
				group_id: group.id,
				kind: input.kind,
				head: input.head,
				head_after: headAfter,
				cause: input.cause,
				occurred_at: occurredAt,
				notes: input.notes,
				created_by: access.user.id,
				updated_by: access.user.id
			})
			.returning('*');
		const [updated] = await trx('livestock_groups')
			.where({ id: group.id })
			.update({ head: headAfter, version: group.version + 1, updated_by: access.user.id, updated_at: trx.fn.now() })
			.returning('*');
		await recordAudit(trx, {
			farmId: access.farm.id,
			userId: access.user.id,
			entity: 'livestock_event',
			entityId: row.id,
			action: 'create',
			before: { head: group.head },
			after: { kind: input.kind, head: input.head, cause: input.cause, headAfter }
		});
		return { event: toEvent({ ...row, created_by_name: access.user.name }), group: toGroup(updated) };
	});
}
