// Scouting notes: what was seen at a point in a lane of the season's adopted plan, with stand
// counts and photos. A note keeps a copy of its lane; the plan may be laid out again later.
import type { Knex } from 'knex';
import { TZDate } from '@date-fns/tz';
import { db } from './db';
import { recordAudit } from './audit';
import { canSeeField, isUuid, type FarmAccess } from './access';
import { AppError, invalid, notFound, versionConflict } from './errors';
import { getField } from './fields';
import { discardPhotos, photosOf, preparePhoto, recordPhotos, storePhotos, type PhotoSummary, type StoredPhoto } from './photos';
import { plantsPerAcreFromStandCount, rowFeetPerThousandthAcre } from '../agronomy/index';
import { isInLane, laneAtPoint, laneExtent, pointAlongLane, positionAlongLane } from '../scouting/lane-point';
import type { ScoutingNoteInput, ScoutingNotePatch } from '../schemas/scouting';
import type { MultiPolygon, Polygon } from 'geojson';

export interface StandCount {
	plantsCounted: number;
	rowFeetCounted: number;
	rowSpacingIn: number;
	plantsPerAcre: number;
}

export interface ScoutingNote {
	id: string;
	fieldId: string;
	season: number;
	laneIndex: number;
	lane: { kind: string; crop: string; variety: string | null };
	location: { lng: number; lat: number };
	positionFt: number | null;
	observedAt: string;
	growthStage: string | null;
	pests: string | null;
	diseases: string | null;
	weeds: string | null;
	standCount: StandCount | null;
	notes: string | null;
	author: { id: string | null; name: string | null };
	version: number;
	createdAt: string;
	updatedAt: string;
	/** Set only on deleted notes, which owners and managers may list and restore. */
	deletedAt?: string;
	photos: PhotoSummary[];
}

type Row = Record<string, any>;

function toNote(r: Row, photos: PhotoSummary[]): ScoutingNote {
	const [lng, lat] = r.location.coordinates as [number, number];
	return {
		id: r.id,
		fieldId: r.field_id,
		season: r.season,
		laneIndex: r.lane_index,
		lane: { kind: r.lane_kind, crop: r.lane_crop, variety: r.lane_variety },
		location: { lng, lat },
		positionFt: r.position_ft,
		observedAt: new Date(r.observed_at).toISOString(),
		growthStage: r.growth_stage,
		pests: r.pests,
		diseases: r.diseases,
		weeds: r.weeds,
		standCount:
			r.plants_counted === null
				? null
				: { plantsCounted: r.plants_counted, rowFeetCounted: r.row_feet_counted, rowSpacingIn: r.row_spacing_in, plantsPerAcre: r.plants_per_acre },
		notes: r.notes,
		author: { id: r.created_by, name: r.author_name },
		version: r.version,
		createdAt: new Date(r.created_at).toISOString(),
		updatedAt: new Date(r.updated_at).toISOString(),
		...(r.deleted_at ? { deletedAt: new Date(r.deleted_at).toISOString() } : {}),
		photos
	};
}

/** The field, or 404 when this member may not read it. */
async function readableField(access: FarmAccess, fieldId: string) {
	if (!canSeeField(access, fieldId)) throw notFound('field');
	return getField(access, fieldId);
}

export async function listScoutingNotes(access: FarmAccess, fieldId: string, season: number, opts: { deleted?: boolean } = {}): Promise<ScoutingNote[]> {
	await readableField(access, fieldId);
	const q = db()('scouting_notes').where({ farm_id: access.farm.id, field_id: fieldId, season });
	if (opts.deleted) q.whereNotNull('deleted_at');
	else q.whereNull('deleted_at');
	const rows = await q.orderBy([{ column: 'observed_at', order: 'desc' }, { column: 'id' }]);
	const photos = await photosOf(db(), access.farm.id, 'scouting_note', rows.map((r) => r.id));
	return rows.map((r) => toNote(r, photos.get(r.id) ?? []));
}

export async function getScoutingNote(access: FarmAccess, fieldId: string, season: number, noteId: string, q: Knex = db()): Promise<ScoutingNote> {
	if (!canSeeField(access, fieldId) || !isUuid(noteId)) throw notFound('scouting note');
	const row = await q('scouting_notes').where({ id: noteId, farm_id: access.farm.id, field_id: fieldId, season }).whereNull('deleted_at').first();
	if (!row) throw notFound('scouting note');
	const photos = await photosOf(q, access.farm.id, 'scouting_note', [row.id]);
	return toNote(row, photos.get(row.id) ?? []);
}

interface PlanLaneRow {
	lane_index: number;
	kind: string;
	crop: string;
	variety: string | null;
	width_ft: number;
	rows: number;
	geometry: Polygon | MultiPolygon;
}

async function adoptedPlan(q: Knex, access: FarmAccess, fieldId: string, season: number) {
	const plan: { id: string; version: number; guidance: { a: [number, number]; b: [number, number] } } | undefined = await q('plans')
		.where({ farm_id: access.farm.id, field_id: fieldId, season, adopted: true })
		.whereNull('deleted_at')
		.first('id', 'version', 'guidance');
	if (!plan) return null;
	const lanes: PlanLaneRow[] = await q('plan_lanes').where({ plan_id: plan.id }).orderBy('lane_index').select('lane_index', 'kind', 'crop', 'variety', 'width_ft', 'rows', 'geometry');
	return { ...plan, lanes };
}

/** Row spacing of a lane as laid out: its width over its rows (a twin pair counts as one row). */
function laneRowSpacingIn(lane: PlanLaneRow): number | null {
	return lane.rows > 0 ? (Number(lane.width_ft) * 12) / lane.rows : null;
}

const MINUTES_OF_CLOCK_SKEW = 10;

/** Works out where the note is and its stand count, refusing what cannot be so. */
function placeNote(input: ScoutingNoteInput, plan: NonNullable<Awaited<ReturnType<typeof adoptedPlan>>>, season: number, timeZone: string) {
	const fields: Record<string, string[]> = {};
	const observed = new Date(input.observedAt);
	if (observed.getTime() > Date.now() + MINUTES_OF_CLOCK_SKEW * 60_000) {
		fields.observedAt = ['A scouting note records what was seen: its time cannot be in the future.'];
	}
	const year = new TZDate(observed, timeZone).getFullYear();
	if (!fields.observedAt && year !== season && year !== season - 1) {
		fields.observedAt = [`A note for the ${season} season is dated in ${season - 1} or ${season}; this one is in ${year}.`];
	}

	let lane: PlanLaneRow | undefined;
	let point: [number, number] | null = input.location ? [input.location.lng, input.location.lat] : null;
	let positionFt: number | null = input.positionFt ?? null;
	const lanesNamed = `lanes 1–${plan.lanes.length}`;
	if (input.laneIndex !== undefined) {
		lane = plan.lanes.find((l) => l.lane_index === input.laneIndex);
		if (!lane) fields.laneIndex = [`Lane ${input.laneIndex + 1} is not in the season's plan (${lanesNamed}).`];
	} else if (point) {
		const index = laneAtPoint(plan.lanes.map((l) => ({ index: l.lane_index, geometry: l.geometry })), point);
		if (index === null) fields.location = ['That point is not on a lane of the season\'s plan; pick a point inside a lane.'];
		else lane = plan.lanes.find((l) => l.lane_index === index);
	}
	if (lane) {
		const shape = { index: lane.lane_index, geometry: lane.geometry };
		if (point) {
			if (!isInLane(shape, point)) fields.location = [`That point is not inside lane ${lane.lane_index + 1}.`];
			else if (positionFt === null) positionFt = positionAlongLane(lane.geometry, plan.guidance, point);
		} else {
			// A lane alone puts the note in the lane's middle.
			const at = pointAlongLane(lane.geometry, plan.guidance, positionFt ?? laneExtent(lane.geometry, plan.guidance).lengthFt / 2);
			if (at.ok) {
				point = at.point;
				positionFt ??= positionAlongLane(lane.geometry, plan.guidance, point);
			}
			else fields.positionFt = [at.reason];
		}
	}

	let standCount: StandCount | null = null;
	if (input.standCount && lane) {
		const spacing = input.standCount.rowSpacingIn ?? laneRowSpacingIn(lane);
		if (spacing === null) {
			fields['standCount.rowSpacingIn'] = ['This lane has no rows; give the row spacing of the count.'];
		} else {
			const rowFeet = input.standCount.rowFeetCounted ?? rowFeetPerThousandthAcre(spacing);
			standCount = {
				plantsCounted: input.standCount.plantsCounted,
				rowFeetCounted: Math.round(rowFeet * 1000) / 1000,
				rowSpacingIn: Math.round(spacing * 100) / 100,
				plantsPerAcre: Math.round(plantsPerAcreFromStandCount(input.standCount.plantsCounted, rowFeet, spacing) * 10) / 10
			};
		}
	}
	if (Object.keys(fields).length) throw invalid('Some values cannot be recorded; see fields.', fields);
	const rowSpacingIn = lane ? laneRowSpacingIn(lane) : null;
	return { lane: lane!, point: point!, positionFt, standCount, rowSpacingIn: rowSpacingIn === null ? null : Math.round(rowSpacingIn * 100) / 100 };
}

/**
 * Records a note and its photos in one transaction. Photos are checked and resized first and
 * written to the file store before the rows; if the rows cannot be written the copies are removed.
 */
export async function createScoutingNote(
	access: FarmAccess,
	fieldId: string,
	season: number,
	input: ScoutingNoteInput,
	photos: { name: string | null; bytes: Uint8Array }[] = []
): Promise<ScoutingNote> {
	await readableField(access, fieldId);
	const plan = await adoptedPlan(db(), access, fieldId, season);
	if (!plan) throw invalid(`The field has no adopted plan for ${season}, so there are no lanes to put a note on.`, { laneIndex: [`No adopted plan for ${season}.`] });
	const placed = placeNote(input, plan, season, access.farm.timeZone);
	const prepared = [];
	for (const p of photos) prepared.push(await preparePhoto(p.bytes, p.name));
	const stored = await storePhotos(access.farm.id, prepared);
	try {
		return await db().transaction(async (trx) => {
			const [row] = await trx('scouting_notes')
				.insert({
					farm_id: access.farm.id,
					field_id: fieldId,
					season,
					plan_id: plan.id,
					plan_version: plan.version,
					lane_index: placed.lane.lane_index,
					lane_kind: placed.lane.kind,
					lane_crop: placed.lane.crop,
					lane_variety: placed.lane.variety,
					location: JSON.stringify({ type: 'Point', coordinates: placed.point }),
					position_ft: placed.positionFt === null ? null : Math.round(placed.positionFt * 100) / 100,
					observed_at: input.observedAt,
					growth_stage: input.growthStage,
					pests: input.pests,
					diseases: input.diseases,
					weeds: input.weeds,
					notes: input.notes,
					plants_counted: placed.standCount?.plantsCounted ?? null,
					row_feet_counted: placed.standCount?.rowFeetCounted ?? null,
					// The lane's spacing is kept even without a count, so a count added later can use it.
					row_spacing_in: placed.standCount?.rowSpacingIn ?? placed.rowSpacingIn,
					plants_per_acre: placed.standCount?.plantsPerAcre ?? null,
					author_name: access.user.name ?? access.user.email,
					created_by: access.user.id,
					updated_by: access.user.id
				})
				.returning('*');
			await recordPhotos(trx, { farmId: access.farm.id, fieldId, entity: 'scouting_note', entityId: row.id, userId: access.user.id }, stored);
			const note = await getScoutingNote(access, fieldId, season, row.id, trx);
			await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'scouting_note', entityId: row.id, action: 'create', after: { ...note, photos: note.photos.map((p) => p.id) } });
			return note;
		});
	} catch (e) {
		await discardPhotos(stored);
		throw e;
	}
}

/** Only the author and those who edit the farm's plans may change or delete a note. */
function requireMayChange(access: FarmAccess, row: Row) {
	if (row.created_by !== access.user.id && !access.can('editPlans')) {
		throw new AppError(403, 'Only the note\'s author, an owner or a manager can change or delete this note.', 'forbidden');
	}
}

async function lockedNote(trx: Knex.Transaction, access: FarmAccess, fieldId: string, season: number, noteId: string) {
	if (!canSeeField(access, fieldId) || !isUuid(noteId)) throw notFound('scouting note');
	const row = await trx('scouting_notes').where({ id: noteId, farm_id: access.farm.id, field_id: fieldId, season }).whereNull('deleted_at').forUpdate().first();
	if (!row) throw notFound('scouting note');
	requireMayChange(access, row);
	return row;
}

export async function updateScoutingNote(access: FarmAccess, fieldId: string, season: number, noteId: string, patch: ScoutingNotePatch): Promise<ScoutingNote> {
	return db().transaction(async (trx) => {
		const row = await lockedNote(trx, access, fieldId, season, noteId);
		if (row.version !== patch.version) throw versionConflict('scouting note', row.version, patch.version);
		const before = await getScoutingNote(access, fieldId, season, noteId, trx);
		const changes: Record<string, unknown> = {};
		if (patch.observedAt !== undefined) {
			if (new Date(patch.observedAt).getTime() > Date.now() + MINUTES_OF_CLOCK_SKEW * 60_000) {
				throw invalid('Some values cannot be recorded; see fields.', { observedAt: ['A scouting note records what was seen: its time cannot be in the future.'] });
			}
			changes.observed_at = patch.observedAt;
		}
		for (const [key, column] of [['growthStage', 'growth_stage'], ['pests', 'pests'], ['diseases', 'diseases'], ['weeds', 'weeds'], ['notes', 'notes']] as const) {
			if (patch[key] !== undefined) changes[column] = patch[key];
		}
		if (patch.standCount !== undefined) {
			if (patch.standCount === null) Object.assign(changes, { plants_counted: null, row_feet_counted: null, row_spacing_in: null, plants_per_acre: null });
			else {
				const spacing = patch.standCount.rowSpacingIn ?? row.row_spacing_in;
				if (!spacing) throw invalid('Some values cannot be recorded; see fields.', { 'standCount.rowSpacingIn': ['Give the row spacing of the count.'] });
				const rowFeet = patch.standCount.rowFeetCounted ?? rowFeetPerThousandthAcre(spacing);
				Object.assign(changes, {
					plants_counted: patch.standCount.plantsCounted,
					row_feet_counted: Math.round(rowFeet * 1000) / 1000,
					row_spacing_in: Math.round(spacing * 100) / 100,
					plants_per_acre: Math.round(plantsPerAcreFromStandCount(patch.standCount.plantsCounted, rowFeet, spacing) * 10) / 10
				});
			}
		}
		await trx('scouting_notes').where({ id: noteId }).update({ ...changes, version: row.version + 1, updated_by: access.user.id, updated_at: trx.fn.now() });
		const after = await getScoutingNote(access, fieldId, season, noteId, trx);
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'scouting_note', entityId: noteId, action: 'update', before: { ...before, photos: undefined }, after: { ...after, photos: undefined } });
		return after;
	});
}

export async function deleteScoutingNote(access: FarmAccess, fieldId: string, season: number, noteId: string): Promise<void> {
	await db().transaction(async (trx) => {
		const row = await lockedNote(trx, access, fieldId, season, noteId);
		await trx('scouting_notes').where({ id: noteId }).update({ deleted_at: trx.fn.now(), deleted_by: access.user.id });
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'scouting_note', entityId: noteId, action: 'delete', before: { laneIndex: row.lane_index, observedAt: row.observed_at } });
	});
}

/** Adds photos to an existing note (its author, an owner or a manager). */
export async function addNotePhotos(access: FarmAccess, fieldId: string, season: number, noteId: string, photos: { name: string | null; bytes: Uint8Array }[]): Promise<PhotoSummary[]> {
	if (photos.length === 0) throw invalid('Choose a photo to upload.', { photo: ['Choose a photo.'] });
	// Check the note and the right to change it before doing the image work.
	await db().transaction(async (trx) => lockedNote(trx, access, fieldId, season, noteId));
	const prepared = [];
	for (const p of photos) prepared.push(await preparePhoto(p.bytes, p.name));
	const stored: StoredPhoto[] = await storePhotos(access.farm.id, prepared);
	try {
		await db().transaction(async (trx) => {
			await lockedNote(trx, access, fieldId, season, noteId);
			await recordPhotos(trx, { farmId: access.farm.id, fieldId, entity: 'scouting_note', entityId: noteId, userId: access.user.id }, stored);
			await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'scouting_note', entityId: noteId, action: 'add_photos', after: { photos: stored.map((s) => s.id) } });
		});
	} catch (e) {
		await discardPhotos(stored);
		throw e;
	}
	const all = await photosOf(db(), access.farm.id, 'scouting_note', [noteId]);
	const added = new Set(stored.map((s) => s.id));
	return (all.get(noteId) ?? []).filter((p) => added.has(p.id));
}

/** Removes a photo from its note (soft: the stored copy stays for the record's history). */
export async function deletePhoto(access: FarmAccess, photoId: string): Promise<void> {
	await db().transaction(async (trx) => {
		const photo = await trx('attachments').where({ id: photoId, farm_id: access.farm.id }).whereNull('deleted_at').forUpdate().first();
		if (!photo || (photo.field_id && !canSeeField(access, photo.field_id))) throw notFound('photo');
		if (photo.created_by !== access.user.id && !access.can('editPlans')) {
			throw new AppError(403, 'Only the person who added the photo, an owner or a manager can remove it.', 'forbidden');
		}
		await trx('attachments').where({ id: photoId }).update({ deleted_at: trx.fn.now(), deleted_by: access.user.id });
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: photo.entity, entityId: photo.entity_id, action: 'remove_photo', before: { photo: photoId } });
	});
}

/** Brings a deleted note back (owners and managers; the route checks the role). */
export async function restoreScoutingNote(access: FarmAccess, fieldId: string, season: number, noteId: string): Promise<ScoutingNote> {
	return db().transaction(async (trx) => {
		if (!canSeeField(access, fieldId) || !isUuid(noteId)) throw notFound('deleted scouting note');
		const row = await trx('scouting_notes').where({ id: noteId, farm_id: access.farm.id, field_id: fieldId, season }).whereNotNull('deleted_at').forUpdate().first();
		if (!row) throw notFound('deleted scouting note');
		await trx('scouting_notes').where({ id: noteId }).update({ deleted_at: null, deleted_by: null, version: row.version + 1, updated_by: access.user.id, updated_at: trx.fn.now() });
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'scouting_note', entityId: noteId, action: 'restore', before: { deletedAt: row.deleted_at } });
		return getScoutingNote(access, fieldId, season, noteId, trx);
	});
}
