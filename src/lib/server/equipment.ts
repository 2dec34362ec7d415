import { db } from './db';
import { recordAudit } from './audit';
import { isUuid, type FarmAccess } from './access';
import { invalid, notFound, versionConflict } from './errors';
import type { Equipment } from '../equipment/types';
import type { EquipmentInput } from '../schemas/equipment';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function toEquipment(r: any): Equipment {
	return {
		id: r.id,
		name: r.name,
		kind: r.kind,
		workingWidthFt: r.working_width_ft,
		planter: r.planter,
		sections: r.sections,
		rows: r.rows,
		lengthFt: r.length_ft,
		notes: r.notes,
		isDefaultPlanter: r.is_default_planter,
		version: r.version
	};
}

/** A planter's width is its row units × spacing; what the form says otherwise does not count. */
function widthOf(input: EquipmentInput): number {
	return input.planter ? (input.planter.rowUnits.length * input.planter.rowSpacingIn) / 12 : input.workingWidthFt!;
}

function rowValues(input: EquipmentInput) {
	return {
		name: input.name,
		kind: input.kind,
		working_width_ft: widthOf(input),
		planter: input.planter ? JSON.stringify(input.planter) : null,
		sections: input.sections,
		rows: input.kind === 'combine_head' ? input.rows : input.planter ? input.planter.rowUnits.length : input.rows,
		length_ft: input.lengthFt,
		notes: input.notes,
		is_default_planter: input.isDefaultPlanter
	};
}

function duplicate(e: unknown, name: string) {
	if ((e as { code?: string; constraint?: string }).code === '23505') {
		return (e as { constraint?: string }).constraint === 'equipment_default_planter_key'
			? invalid('Another planter is already the default.', { isDefaultPlanter: ['Another planter is already the default.'] })
			: invalid(`The farm already has an implement named ${name}.`, { name: [`The farm already has an implement named ${name}.`] });
	}
	return e;
}

export async function listEquipment(access: FarmAccess): Promise<Equipment[]> {
	// Viewers see the farm's implements only when the owner chose to show them.
	if (!access.sees.equipment) return [];
	const rows = await db()('equipment').where({ farm_id: access.farm.id }).whereNull('deleted_at').orderBy([{ column: 'kind' }, { column: 'name' }]);
	return rows.map(toEquipment);
}

export async function getEquipment(access: FarmAccess, id: string): Promise<Equipment> {
	const row = isUuid(id) && access.sees.equipment ? await db()('equipment').where({ id, farm_id: access.farm.id }).whereNull('deleted_at').first() : undefined;
	if (!row) throw notFound('implement');
	return toEquipment(row);
}

/** From the farm's implements, the planter the sheet uses: the one asked for, else the default, else the only planter. */
export function choosePlanter(equipment: Equipment[], id?: string | null): Equipment | null {
	if (id) {
		const e = equipment.find((x) => x.id === id);
		if (!e) throw notFound('implement');
		if (e.kind !== 'planter') throw invalid(`${e.name} is not a planter.`);
		return e;
	}
	const planters = equipment.filter((e) => e.kind === 'planter');
	return planters.find((p) => p.isDefaultPlanter) ?? (planters.length === 1 ? planters[0] : null);
}

export async function findPlanter(access: FarmAccess, id?: string | null): Promise<Equipment | null> {
	return choosePlanter(await listEquipment(access), id);
}

export async function createEquipment(access: FarmAccess, input: EquipmentInput): Promise<Equipment> {
	try {
		return await db().transaction(async (trx) => {
			if (input.isDefaultPlanter) await trx('equipment').where({ farm_id: access.farm.id }).update({ is_default_planter: false });
			const [row] = await trx('equipment').insert({ ...rowValues(input), farm_id: access.farm.id, created_by: access.user.id }).returning('*');
			await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'equipment', entityId: row.id, action: 'create', after: rowValues(input) });
			return toEquipment(row);
		});
	} catch (e) {
		throw duplicate(e, input.name);
	}
}

export async function updateEquipment(access: FarmAccess, id: string, input: EquipmentInput): Promise<Equipment> {
	await getEquipment(access, id);
	const sent = input.version;
	if (sent === undefined) {
		const message = 'Send the version of the implement you edited, so a newer save is not overwritten.';
		throw invalid(message, { version: [message] });
	}
	try {
		return await db().transaction(async (trx) => {
			const current = await trx('equipment').where({ id, farm_id: access.farm.id }).forUpdate().first();
			if (sent !== current.version) throw versionConflict('implement', current.version, sent);
			if (input.isDefaultPlanter) await trx('equipment').where({ farm_id: access.farm.id }).whereNot({ id }).update({ is_default_planter: false });
			const [row] = await trx('equipment').where({ id }).update({ ...rowValues(input), version: current.version + 1, updated_at: trx.fn.now() }).returning('*');
			await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'equipment', entityId: id, action: 'update', before: toEquipment(current), after: toEquipment(row) });
			return toEquipment(row);
		});
	} catch (e) {
		throw duplicate(e, input.name);
	}
}

export async function deleteEquipment(access: FarmAccess, id: string) {
	await getEquipment(access, id);
	await db().transaction(async (trx) => {
		await trx('equipment').where({ id, farm_id: access.farm.id }).update({ deleted_at: trx.fn.now(), is_default_planter: false });
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'equipment', entityId: id, action: 'delete' });
	});
}
