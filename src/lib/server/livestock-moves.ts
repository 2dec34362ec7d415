// Grazing moves: a group (and its mobile shelter) on a stretch of a pasture lane from one time to
// another. A move keeps a copy of the lane as it stood, and is refused onto a lane still closed
// by a label's grazing interval, by spraying next door, or by harvest, unless acknowledged.
import type { Knex } from 'knex';
import type { MultiPolygon, Polygon } from 'geojson';
import { TZDate } from '@date-fns/tz';
import { addDays } from 'date-fns';
import { centroid } from '@turf/turf';
import { db } from './db';
import { recordAudit } from './audit';
import { canSeeField, isUuid, type FarmAccess } from './access';
import { AppError, invalid, notFound } from './errors';
import { laneApplications } from './restrictions';
import { laneRestrictionsAt } from '../records/restrictions';
import { laneBlocks, blocksDuring, type Block, type HarvestDay, type SprayedProduct, type SprayingPass } from '../livestock/blocks';
import { laneExtent, stretchOutline } from '../livestock/stretch';
import { moveDays, nextStretch, readMoveTime, seasonSpan } from '../livestock/moves';
import { moveFigures, type MoveFigures } from '../livestock/figures';
import type { MoveInput } from '../livestock/schemas';
import type { Species } from '../livestock/species';

export const LIVESTOCK_CAUTION =
	'Computed figures are a record of your own numbers worked through published formulas, not a recommendation. ' +
	'The label is the law: keep animals off a lane until every grazing interval on it has ended. ' +
	'Handle animals calmly and move shelters with care; give free access to clean water, more in hot weather; ' +
	'check fences and guard against predators; follow local rules and your veterinarian’s advice.';

export interface GrazingMove {
	id: string;
	groupId: string;
	groupName: string;
	species: Species;
	shelterId: string | null;
	shelterName: string | null;
	fieldId: string;
	fieldName: string;
	season: number;
	laneIndex: number;
	laneKind: string;
	laneCrop: string;
	laneAcres: number;
	laneLengthFt: number;
	fromFt: number;
	toFt: number;
	stretchAcres: number;
	stretchGeometry: Polygon | MultiPolygon | null;
	/** Where the shelter stands: the middle of the stretch, [lng, lat]. */
	position: [number, number] | null;
	from: string;
	to: string;
	head: number;
	averageWeightLb: number;
	forageLbPerAcre: number | null;
	utilization: number | null;
	intakePct: number | null;
	figures: MoveFigures;
	acknowledgedRestriction: unknown;
	notes: string | null;
	createdBy: string | null;
	version: number;
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function toMove(r: any, access: FarmAccess): GrazingMove {
	const startsAt = new Date(r.starts_at);
	const endsAt = new Date(r.ends_at);
	const geometry = r.stretch_geometry as Polygon | MultiPolygon | null;
	const acres = Number(r.stretch_acres);
	return {
		id: r.id,
		groupId: r.group_id,
		groupName: r.group_name,
		species: r.species,
		shelterId: access.sees.equipment ? r.shelter_id : null,
		shelterName: access.sees.equipment ? r.shelter_name : null,
		fieldId: r.field_id,
		fieldName: r.field_name,
		season: r.season,
		laneIndex: r.lane_index,
		laneKind: r.lane_kind,
		laneCrop: r.lane_crop,
		laneAcres: r.lane_acres,
		laneLengthFt: r.lane_length_ft,
		fromFt: r.from_ft,
		toFt: r.to_ft,
		stretchAcres: acres,
		stretchGeometry: geometry,
		position: geometry ? (centroid(geometry).geometry.coordinates as [number, number]) : null,
		from: startsAt.toISOString(),
		to: endsAt.toISOString(),
		head: r.head,
		averageWeightLb: r.average_weight_lb,
		forageLbPerAcre: r.forage_lb_per_acre,
		utilization: r.utilization,
		intakePct: r.intake_pct,
		figures: moveFigures({
			species: r.species,
			head: r.head,
			averageWeightLb: r.average_weight_lb,
			acres: acres > 0 ? acres : Number(r.lane_acres),
			forageLbPerAcre: r.forage_lb_per_acre,
			utilization: r.utilization,
			intakePct: r.intake_pct,
			days: moveDays(startsAt, endsAt)
		}),
		acknowledgedRestriction: r.acknowledged_restriction,
		notes: r.notes,
		createdBy: r.created_by_name ?? null,
		version: r.version
	};
}

function movesQuery(q: Knex, access: FarmAccess) {
	const query = q('grazing_moves as m')
		.join('livestock_groups as g', 'g.id', 'm.group_id')
		.join('fields as f', 'f.id', 'm.field_id')
		.leftJoin('users as u', 'u.id', 'm.created_by')
		.where({ 'm.farm_id': access.farm.id })
		.whereNull('m.deleted_at')
		.whereNull('f.deleted_at')
		.select('m.*', 'g.name as group_name', 'g.species', 'f.name as field_name', 'u.name as created_by_name');
	// Viewers see moves on the fields granted to them only.
	if (access.fieldScope !== null) query.whereIn('m.field_id', access.fieldScope);
	return query;
}

export async function listMoves(access: FarmAccess, filter: { season?: number; fieldId?: string; groupId?: string } = {}): Promise<GrazingMove[]> {
	const q = movesQuery(db(), access);
	if (filter.season !== undefined) q.where('m.season', filter.season);
	if (filter.fieldId) q.where('m.field_id', filter.fieldId);
	if (filter.groupId) q.where('m.group_id', filter.groupId);
	const rows = await q.orderBy([{ column: 'm.starts_at' }, { column: 'm.created_at' }]);
	return rows.map((r) => toMove(r, access));
}

export async function getMove(access: FarmAccess, moveId: string): Promise<GrazingMove> {
	if (!isUuid(moveId)) throw notFound('grazing move');
	const row = await movesQuery(db(), access).where('m.id', moveId).first();
	if (!row) throw notFound('grazing move');
	return toMove(row, access);
}

/** Every block on the lanes of a field's season: grazing intervals, spraying next door, harvest. */
export async function seasonBlocks(q: Knex, access: FarmAccess, fieldId: string, season: number, laneIndexes: number[]): Promise<Block[]> {
	const rows = await q('operations as o')
		.join('operation_lanes as ol', 'ol.operation_id', 'o.id')
		.leftJoin('operation_products as op', 'op.operation_id', 'o.id')
		.where({ 'o.farm_id': access.farm.id, 'o.field_id': fieldId, 'o.season': season })
		.whereNull('o.deleted_at')
		.select('o.id', 'o.type', 'o.started_at', 'o.ended_at', 'ol.lane_index', 'op.product_name', 'op.grazing_days');
	const products: SprayedProduct[] = [];
	const sprayings: SprayingPass[] = [];
	for (const r of rows) {
		const startedAt = new Date(r.started_at);
		const endedAt = new Date(r.ended_at);
		if (r.product_name != null && r.grazing_days != null) products.push({ laneIndex: r.lane_index, productName: r.product_name, startedAt, endedAt, grazingDays: r.grazing_days });
		if (r.type === 'spraying') sprayings.push({ laneIndex: r.lane_index, startedAt, endedAt });
	}
	return laneBlocks(laneIndexes, products, sprayings, await harvestDays(q, access, fieldId, season), access.farm.timeZone);
}

/** Harvest entries of the season's lanes, each closing its lane for that whole day (farm's zone). */
async function harvestDays(q: Knex, access: FarmAccess, fieldId: string, season: number): Promise<HarvestDay[]> {
	const present = await q.raw(`select to_regclass('public.harvest_entries') is not null and to_regclass('public.harvest_entry_lanes') is not null as ok`);
	if (!present.rows[0]?.ok) return [];
	const rows = await q('harvest_entries as h')
		.join('harvest_entry_lanes as hl', 'hl.entry_id', 'h.id')
		.where({ 'h.farm_id': access.farm.id, 'h.field_id': fieldId, 'h.season': season })
		.whereNull('h.deleted_at')
		.select('hl.lane_index', q.raw(`to_char(coalesce(h.harvested_on, (h.created_at at time zone ?)::date), 'YYYY-MM-DD') as day`, [access.farm.timeZone]));
	return rows.map((r) => {
		const [y, m, d] = String(r.day).split('-').map(Number);
		const start = new TZDate(y, m - 1, d, access.farm.timeZone);
		return { laneIndex: r.lane_index, startsAt: new Date(start.getTime()), endsAt: new Date(addDays(start, 1).getTime()) };
	});
}

function when(iso: string, timeZone: string): string {
	return new Intl.DateTimeFormat('en-US', { timeZone, month: 'short', day: 'numeric', year: 'numeric', hour: 'numeric', minute: '2-digit', timeZoneName: 'short' }).format(new Date(iso));
}

/** The caution a refused move answers with: what closes the lane and until when. */
export function restrictionMessage(laneIndex: number, blocks: Block[], timeZone: string): string {
	const reasons = blocks.map((b) => `${b.cause}, until ${when(b.endsAt, timeZone)}`).join('; ');
	return (
		`Lane ${laneIndex + 1} is closed to animals for this move: ${reasons}. ` +
		'The label is the law: keep animals off the lane until the interval ends. ' +
		'This is a record, not a recommendation; follow the label, local rules and your veterinarian’s advice. ' +
		'To log the move anyway, confirm that you have checked (acknowledge: true); the acknowledgement is kept with your name.'
	);
}

function field(name: string, message: string) {
	return invalid(message, { [name]: [message] });
}

/**
 * Logs a move. Refused with a clear 400 for a crop lane, a time outside the season, a stretch off
 * the lane, or a group or shelter already somewhere else then; 409 `grazing_restricted` when the
 * lane is closed and the user has not acknowledged it.
 */
export async function createMove(access: FarmAccess, input: MoveInput): Promise<GrazingMove> {
	const tz = access.farm.timeZone;
	const startsAt = readMoveTime(input.from, tz);
	const endsAt = readMoveTime(input.to, tz, true);
	if (!startsAt) throw field('from', 'The start is not a time we can read: use YYYY-MM-DD or an ISO 8601 time with an offset.');
	if (!endsAt) throw field('to', 'The end is not a time we can read: use YYYY-MM-DD or an ISO 8601 time with an offset.');
	if (endsAt.getTime() <= startsAt.getTime()) throw field('to', 'The move must end after it starts.');
	const season = seasonSpan(input.season, tz);
	if (startsAt < season.startsAt || endsAt > season.endsAt) {
		throw field('from', `The move must lie within the ${input.season} season (1 January to 31 December ${input.season}, farm time).`);
	}
	const groupSeen = await db()('livestock_groups').where({ id: input.groupId, farm_id: access.farm.id }).whereNull('deleted_at').first('id');
	if (!groupSeen) throw notFound('livestock group');
	if (!canSeeField(access, input.fieldId)) throw notFound('field');
	const fieldRow = await db()('fields').where({ id: input.fieldId, farm_id: access.farm.id }).whereNull('deleted_at').first('id', 'name');
	if (!fieldRow) throw notFound('field');
	const plan = await db()('plans').where({ farm_id: access.farm.id, field_id: input.fieldId, season: input.season, adopted: true }).whereNull('deleted_at').first('id', 'version', 'guidance');
	if (!plan) throw field('season', `${fieldRow.name} has no adopted plan for ${input.season}: lay out its lanes first.`);
	const lane = await db()('plan_lanes').where({ plan_id: plan.id, lane_index: input.laneIndex }).first();
	if (!lane) throw field('laneIndex', `${fieldRow.name} has no lane ${input.laneIndex + 1} in ${input.season} (laneIndex ${input.laneIndex}).`);
	if (lane.kind !== 'pasture' && lane.kind !== 'cover') {
		throw field('laneIndex', `Lane ${input.laneIndex + 1} is a ${lane.kind} lane (${lane.crop}): animals go on pasture or cover lanes only.`);
	}
	const extent = laneExtent(lane.geometry, plan.guidance);
	const fromFt = input.fromFt ?? 0;
	const toFt = input.toFt ?? extent.lengthFt;
	if (toFt <= fromFt) throw field('toFt', 'The stretch must end further along the lane than it starts.');
	if (fromFt >= extent.lengthFt || toFt > extent.lengthFt + 1) {
		throw field('toFt', `Lane ${input.laneIndex + 1} is ${Math.round(extent.lengthFt).toLocaleString('en-US')} ft long; the stretch must lie on it.`);
	}
	const stretch = stretchOutline(lane.geometry, plan.guidance, fromFt, Math.min(toFt, extent.lengthFt));
	// Read outside the write: a record logged in the same instant is the only thing this can miss.
	const laneIndexes = [input.laneIndex];
	const blocks = blocksDuring(await seasonBlocks(db(), access, input.fieldId, input.season, laneIndexes), input.laneIndex, startsAt, endsAt);
	const inForce = laneRestrictionsAt(laneIndexes, await laneApplications(db(), access.farm.id, input.fieldId, input.season, startsAt), startsAt, tz)[0];
	if (inForce.grazingAt && !blocks.some((b) => b.reason === 'grazing-interval')) {
		blocks.push({ laneIndex: input.laneIndex, reason: 'grazing-interval', startsAt: startsAt.toISOString(), endsAt: inForce.grazingAt, cause: 'a label grazing interval' });
	}
	if (blocks.length && !input.acknowledge) throw new AppError(409, restrictionMessage(input.laneIndex, blocks, tz), 'grazing_restricted');

	return db().transaction(async (trx) => {
		// Locks keep two moves of one group, or of one shelter, from landing at once.
		const group = await trx('livestock_groups').where({ id: input.groupId, farm_id: access.farm.id }).whereNull('deleted_at').forUpdate().first();
		if (!group) throw notFound('livestock group');
		if (group.head === 0) throw field('groupId', `${group.name} has no animals left to move.`);
		let shelterId = input.shelterId ?? null;
		if (input.shelterId === undefined) {
			// The shelter travels with the group unless another is named.
			const last = await trx('grazing_moves').where({ group_id: group.id }).whereNull('deleted_at').orderBy('starts_at', 'desc').first('shelter_id');
			shelterId = last?.shelter_id ?? null;
		}
		let shelterName: string | null = null;
		if (shelterId) {
			const shelter = await trx('equipment').where({ id: shelterId, farm_id: access.farm.id }).whereNull('deleted_at').forUpdate().first('id', 'name', 'kind');
			if (!shelter || shelter.kind !== 'shelter') throw field('shelterId', 'Choose a mobile shelter from the farm’s equipment list.');
			shelterName = shelter.name;
		}
		const overlapping = (column: 'group_id' | 'shelter_id', id: string) =>
			trx('grazing_moves as m')
				.join('fields as f', 'f.id', 'm.field_id')
				.where({ [`m.${column}`]: id, 'm.farm_id': access.farm.id })
				.whereNull('m.deleted_at')
				.where('m.starts_at', '<', endsAt)
				.where('m.ends_at', '>', startsAt)
				.first('m.lane_index', 'm.starts_at', 'm.ends_at', 'f.name as field_name');
		const groupClash = await overlapping('group_id', group.id);
		if (groupClash) {
			throw field('from', `${group.name} is already on lane ${groupClash.lane_index + 1} of ${groupClash.field_name} from ${when(new Date(groupClash.starts_at).toISOString(), tz)} to ${when(new Date(groupClash.ends_at).toISOString(), tz)}; moves of one group cannot overlap.`);
		}
		if (shelterId) {
			const shelterClash = await overlapping('shelter_id', shelterId);
			if (shelterClash) {
				throw field('shelterId', `${shelterName} already stands on lane ${shelterClash.lane_index + 1} of ${shelterClash.field_name} from ${when(new Date(shelterClash.starts_at).toISOString(), tz)} to ${when(new Date(shelterClash.ends_at).toISOString(), tz)}; a shelter cannot be in two places.`);
			}
		}
		const acknowledged = blocks.length ? { blocks, acknowledgedBy: { id: access.user.id, name: access.user.name }, acknowledgedAt: new Date().toISOString() } : null;
		const [row] = await trx('grazing_moves')
			.insert({
				farm_id: access.farm.id,
				group_id: group.id,
				shelter_id: shelterId,
				shelter_name: shelterName,
				field_id: input.fieldId,
				season: input.season,
				plan_id: plan.id,
				plan_version: plan.version,
				lane_index: lane.lane_index,
				lane_kind: lane.kind,
				lane_crop: lane.crop,
				lane_acres: lane.acres,
				lane_length_ft: extent.lengthFt,
				lane_geometry: JSON.stringify(lane.geometry),
				from_ft: fromFt,
				to_ft: Math.min(toFt, extent.lengthFt),
				stretch_geometry: stretch.geometry ? JSON.stringify(stretch.geometry) : null,
				stretch_acres: stretch.acres,
				starts_at: startsAt,
				ends_at: endsAt,
				head: group.head,
				average_weight_lb: group.average_weight_lb,
				forage_lb_per_acre: input.forageLbPerAcre ?? null,
				utilization: input.utilization ?? null,
				intake_pct: input.intakePct ?? null,
				acknowledged_restriction: acknowledged ? JSON.stringify(acknowledged) : null,
				notes: input.notes,
				created_by: access.user.id,
				updated_by: access.user.id
			})
			.returning('*');
		const summary = { groupId: group.id, fieldId: input.fieldId, season: input.season, laneIndex: lane.lane_index, fromFt: row.from_ft, toFt: row.to_ft, from: startsAt.toISOString(), to: endsAt.toISOString(), shelterId };
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'grazing_move', entityId: row.id, action: 'create', after: summary });
		if (acknowledged) {
			await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'grazing_move', entityId: row.id, action: 'acknowledge_restriction', after: acknowledged });
		}
		return toMove({ ...row, group_name: group.name, species: group.species, field_name: fieldRow.name, created_by_name: access.user.name }, access);
	});
}

/**
 * Moves the group on to the next stretch of its lane: the same length straight on, for the same
 * time, starting when the last move ends, with the same shelter and forage figures.
 */
export async function moveToNextStretch(access: FarmAccess, groupId: string, acknowledge = false): Promise<GrazingMove> {
	if (!isUuid(groupId)) throw notFound('livestock group');
	const last = await movesQuery(db(), access).where('m.group_id', groupId).orderBy('m.starts_at', 'desc').first();
	if (!last) {
		await db()('livestock_groups').where({ id: groupId, farm_id: access.farm.id }).whereNull('deleted_at').first('id').then((g) => {
			if (!g) throw notFound('livestock group');
		});
		throw field('groupId', 'This group has no move yet: place it on a lane first.');
	}
	const next = nextStretch(
		{ laneIndex: last.lane_index, fromFt: last.from_ft, toFt: last.to_ft, startsAt: new Date(last.starts_at), endsAt: new Date(last.ends_at) },
		last.lane_length_ft
	);
	if (!next) throw field('groupId', `${last.group_name} has reached the end of lane ${last.lane_index + 1}: choose the next lane.`);
	return createMove(access, {
		groupId,
		fieldId: last.field_id,
		season: last.season,
		laneIndex: next.laneIndex,
		from: next.startsAt.toISOString(),
		to: next.endsAt.toISOString(),
		fromFt: next.fromFt,
		toFt: next.toFt,
		shelterId: last.shelter_id,
		forageLbPerAcre: last.forage_lb_per_acre,
		utilization: last.utilization,
		intakePct: last.intake_pct,
		acknowledge,
		notes: null
	});
}

/** Soft-deletes a move logged by mistake; the audit log keeps what it was. */
export async function deleteMove(access: FarmAccess, moveId: string): Promise<void> {
	if (!isUuid(moveId)) throw notFound('grazing move');
	await db().transaction(async (trx) => {
		const row = await trx('grazing_moves').where({ id: moveId, farm_id: access.farm.id }).whereNull('deleted_at').forUpdate().first();
		if (!row) throw notFound('grazing move');
		await trx('grazing_moves').where({ id: row.id }).update({ deleted_at: trx.fn.now(), deleted_by: access.user.id });
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'grazing_move', entityId: row.id, action: 'delete', before: { laneIndex: row.lane_index, fromFt: row.from_ft, toFt: row.to_ft, from: row.starts_at, to: row.ends_at } });
	});
}
