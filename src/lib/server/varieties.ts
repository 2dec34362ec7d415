// The farm's seed catalogue: varieties of each crop, and the seed lots bought of them.
import type { Knex } from 'knex';
import { db } from './db';
import { recordAudit } from './audit';
import { isUuid, type FarmAccess } from './access';
import { invalid, notFound, versionConflict } from './errors';
import type { SeedLotInput, VarietyInput, VarietyPatch } from '../schemas/varieties';
import type { LaneAssignment } from '../plans/types';
import { checkAssignmentVarieties, type CatalogueVariety } from '../catalog/variety-check';

export interface SeedLot {
	id: string;
	varietyId: string;
	lotNumber: string;
	germinationPct: number | null;
	treatment: string | null;
	unitsOnHand: number | null;
	notes: string | null;
	version: number;
	createdAt: Date;
}

export interface Variety {
	id: string;
	crop: string;
	name: string;
	relativeMaturity: number | null;
	seedsPerUnit: number | null;
	traits: string | null;
	notes: string | null;
	version: number;
	createdAt: Date;
	updatedAt: Date;
	lots: SeedLot[];
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Row = any;
type Db = Knex | Knex.Transaction;

const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));

function toLot(r: Row): SeedLot {
	return {
		id: r.id,
		varietyId: r.variety_id,
		lotNumber: r.lot_number,
		germinationPct: num(r.germination_pct),
		treatment: r.treatment,
		unitsOnHand: num(r.units_on_hand),
		notes: r.notes,
		version: r.version,
		createdAt: r.created_at
	};
}

function toVariety(r: Row, lots: SeedLot[] = []): Variety {
	return {
		id: r.id,
		crop: r.crop,
		name: r.name,
		relativeMaturity: num(r.relative_maturity),
		seedsPerUnit: r.seeds_per_unit,
		traits: r.traits,
		notes: r.notes,
		version: r.version,
		createdAt: r.created_at,
		updatedAt: r.updated_at,
		lots
	};
}

const COLUMNS: Record<keyof VarietyInput, string> = {
	crop: 'crop',
	name: 'name',
	relativeMaturity: 'relative_maturity',
	seedsPerUnit: 'seeds_per_unit',
	traits: 'traits',
	notes: 'notes'
};

function rowValues(input: Partial<VarietyInput>): Record<string, unknown> {
	const values: Record<string, unknown> = {};
	for (const [key, column] of Object.entries(COLUMNS)) {
		const v = input[key as keyof VarietyInput];
		if (v !== undefined) values[column] = v;
	}
	return values;
}

const live = (q: Db, access: FarmAccess) => q('varieties').where({ farm_id: access.farm.id }).whereNull('deleted_at');
const liveLots = (q: Db, access: FarmAccess) => q('seed_lots').where({ farm_id: access.farm.id }).whereNull('deleted_at');

function duplicateName(crop: string, name: string) {
	const message = `The catalogue already has a ${crop} variety named "${name}".`;
	return invalid(message, { name: [message] });
}

async function refuseDuplicate(trx: Knex.Transaction, access: FarmAccess, crop: string, name: string, exceptId?: string) {
	const q = live(trx, access).whereRaw('lower(crop) = lower(?) and lower(name) = lower(?)', [crop, name]);
	if (exceptId) q.whereNot({ id: exceptId });
	if (await q.first('id')) throw duplicateName(crop, name);
}

function fromUniqueViolation(e: unknown, crop: string, name: string): unknown {
	const err = e as { code?: string; constraint?: string };
	return err.code === '23505' && err.constraint === 'varieties_name_key' ? duplicateName(crop, name) : e;
}

async function lotsOf(q: Db, access: FarmAccess, varietyIds: string[]): Promise<Map<string, SeedLot[]>> {
	const byVariety = new Map<string, SeedLot[]>();
	if (!varietyIds.length) return byVariety;
	const rows = await liveLots(q, access).whereIn('variety_id', varietyIds).orderBy([{ column: 'created_at' }, { column: 'lot_number' }]);
	for (const r of rows) {
		const list = byVariety.get(r.variety_id) ?? [];
		list.push(toLot(r));
		byVariety.set(r.variety_id, list);
	}
	return byVariety;
}

/** The catalogue, by crop and name, each variety with its lots. */
export async function listVarieties(access: FarmAccess): Promise<Variety[]> {
	const rows = await live(db(), access).orderByRaw('lower(crop), lower(name)');
	const lots = await lotsOf(db(), access, rows.map((r: Row) => r.id));
	return rows.map((r: Row) => toVariety(r, lots.get(r.id) ?? []));
}

export async function getVariety(access: FarmAccess, id: string): Promise<Variety> {
	const row = isUuid(id) ? await live(db(), access).where({ id }).first() : undefined;
	if (!row) throw notFound('variety');
	const lots = await lotsOf(db(), access, [id]);
	return toVariety(row, lots.get(id) ?? []);
}

export async function createVariety(access: FarmAccess, input: VarietyInput): Promise<Variety> {
	try {
		return await db().transaction(async (trx) => {
			await refuseDuplicate(trx, access, input.crop, input.name);
			const [row] = await trx('varieties')
				.insert({ ...rowValues(input), farm_id: access.farm.id, created_by: access.user.id, updated_by: access.user.id })
				.returning('*');
			const variety = toVariety(row);
			await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'variety', entityId: row.id, action: 'create', after: variety });
			return variety;
		});
	} catch (e) {
		throw fromUniqueViolation(e, input.crop, input.name);
	}
}

export async function updateVariety(access: FarmAccess, id: string, patch: VarietyPatch): Promise<Variety> {
	const before = await getVariety(access, id);
	const { version, ...changes } = patch;
	const crop = changes.crop ?? before.crop;
	const name = changes.name ?? before.name;
	try {
		const row = await db().transaction(async (trx) => {
			const current = await live(trx, access).where({ id }).forUpdate().first();
			if (!current) throw notFound('variety');
			if (current.version !== version) throw versionConflict('variety', current.version, version);
			if (changes.crop !== undefined || changes.name !== undefined) await refuseDuplicate(trx, access, crop, name, id);
			const [updated] = await trx('varieties')
				.where({ id })
				.update({ ...rowValues(changes), version: current.version + 1, updated_by: access.user.id, updated_at: trx.fn.now() })
				.returning('*');
			await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'variety', entityId: id, action: 'update', before: toVariety(current), after: toVariety(updated) });
			return updated;
		});
		return toVariety(row, before.lots);
	} catch (e) {
		throw fromUniqueViolation(e, crop, name);
	}
}

/** Soft delete. Plans keep the variety name they were given; the name is then free text. */
export async function deleteVariety(access: FarmAccess, id: string, version?: number): Promise<void> {
	await getVariety(access, id);
	await db().transaction(async (trx) => {
		const current = await live(trx, access).where({ id }).forUpdate().first();
		if (!current) throw notFound('variety');
		if (version !== undefined && current.version !== version) throw versionConflict('variety', current.version, version);
		await trx('varieties').where({ id }).update({ deleted_at: trx.fn.now(), deleted_by: access.user.id });
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'variety', entityId: id, action: 'delete', before: toVariety(current) });
	});
}

export async function listSeedLots(access: FarmAccess, varietyId: string): Promise<SeedLot[]> {
	return (await getVariety(access, varietyId)).lots;
}

export async function createSeedLot(access: FarmAccess, varietyId: string, input: SeedLotInput): Promise<SeedLot> {
	await getVariety(access, varietyId);
	return db().transaction(async (trx) => {
		// The variety may not be deleted while its lot is being added.
		const variety = await live(trx, access).where({ id: varietyId }).forShare().first('id');
		if (!variety) throw notFound('variety');
		const duplicate = await liveLots(trx, access).where({ variety_id: varietyId }).whereRaw('lower(lot_number) = lower(?)', [input.lotNumber]).first('id');
		if (duplicate) {
			const message = `Lot ${input.lotNumber} is already listed for this variety.`;
			throw invalid(message, { lotNumber: [message] });
		}
		const [row] = await trx('seed_lots')
			.insert({
				farm_id: access.farm.id,
				variety_id: varietyId,
				lot_number: input.lotNumber,
				germination_pct: input.germinationPct,
				treatment: input.treatment,
				units_on_hand: input.unitsOnHand,
				notes: input.notes,
				created_by: access.user.id,
				updated_by: access.user.id
			})
			.returning('*');
		const lot = toLot(row);
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'seed_lot', entityId: row.id, action: 'create', after: lot });
		return lot;
	});
}

export async function deleteSeedLot(access: FarmAccess, varietyId: string, lotId: string): Promise<void> {
	await getVariety(access, varietyId);
	await db().transaction(async (trx) => {
		const current = isUuid(lotId) ? await liveLots(trx, access).where({ id: lotId, variety_id: varietyId }).forUpdate().first() : undefined;
		if (!current) throw notFound('seed lot');
		await trx('seed_lots').where({ id: lotId }).update({ deleted_at: trx.fn.now(), deleted_by: access.user.id });
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'seed_lot', entityId: lotId, action: 'delete', before: toLot(current) });
	});
}

/** The catalogue as plans use it: id, crop, name, maturity and seeds per unit. */
export async function catalogueForPlans(access: FarmAccess): Promise<CatalogueVariety[]> {
	const rows = await live(db(), access).orderByRaw('lower(crop), lower(name)').select('id', 'crop', 'name', 'relative_maturity', 'seeds_per_unit');
	return rows.map((r: Row) => ({ id: r.id, crop: r.crop, name: r.name, relativeMaturity: num(r.relative_maturity), seedsPerUnit: r.seeds_per_unit }));
}

/**
 * Lane assignments checked against the seed catalogue: 400 with a field error on each lane given
 * a catalogue variety of another crop. Returns the assignments as the plan keeps them: a variety
 * picked by id carries its catalogue name, and the id itself is not stored.
 */
export async function checkVarietyCrops<A extends LaneAssignment & { varietyId?: string | null }>(
	access: FarmAccess,
	lanes: readonly { index: number; crop: string }[],
	assignments: readonly A[]
): Promise<LaneAssignment[]> {
	const needsCatalogue = assignments.some((a) => a.variety || a.varietyId);
	const catalogue = needsCatalogue ? await catalogueForPlans(access) : [];
	const { varieties, fields } = checkAssignmentVarieties(lanes, assignments, catalogue);
	const problems = Object.values(fields).flat();
	if (problems.length) {
		throw invalid(problems.length === 1 ? problems[0] : `${problems.length} lanes are given a variety the seed catalogue lists for another crop. ${problems[0]}`, fields);
	}
	return assignments.map(({ varietyId: _, ...a }, i) => ({ ...a, variety: varieties[i] }));
}
