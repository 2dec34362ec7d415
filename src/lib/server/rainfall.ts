// Rain gauges (points on the farm's map, optionally tied to a field) and their daily readings.
// A reading's day is a calendar day in the farm's time zone. Viewers see only the gauges of the
// fields granted to them.
import type { Knex } from 'knex';
import { db } from './db';
import { recordAudit } from './audit';
import { isUuid, type FarmAccess } from './access';
import { AppError, invalid, notFound, versionConflict } from './errors';
import { calendarDayIn, gaugeTotals, PLAUSIBLE_DAILY_MAX_IN, weeklyTotals, type GaugeTotal, type WeekBucket } from '../rainfall/totals';
import type { GaugeInput, GaugePatch, ReadingInput, ReadingPatch } from '../schemas/rainfall';

export interface RainGauge {
	id: string;
	name: string;
	location: { lng: number; lat: number };
	fieldId: string | null;
	fieldName: string | null;
	notes: string | null;
	version: number;
}

export interface RainReading {
	id: string;
	gaugeId: string;
	gaugeName: string;
	date: string;
	inches: number;
	notes: string | null;
	version: number;
	recordedBy: string | null;
	createdAt: string;
}

type Row = Record<string, any>;

function toGauge(r: Row): RainGauge {
	const [lng, lat] = r.location.coordinates;
	return { id: r.id, name: r.name, location: { lng, lat }, fieldId: r.field_id, fieldName: r.field_name ?? null, notes: r.notes, version: r.version };
}

function toReading(r: Row): RainReading {
	return {
		id: r.id,
		gaugeId: r.gauge_id,
		gaugeName: r.gauge_name,
		date: r.day,
		inches: r.inches,
		notes: r.notes,
		version: r.version,
		recordedBy: r.recorded_by ?? null,
		createdAt: new Date(r.created_at).toISOString()
	};
}

/** The gauges this member may see, as `g`. */
function gaugesQuery(q: Knex, access: FarmAccess) {
	const query = q('rain_gauges as g')
		.leftJoin('fields as f', function () {
			this.on('f.id', '=', 'g.field_id').andOnNull('f.deleted_at');
		})
		.where({ 'g.farm_id': access.farm.id })
		.whereNull('g.deleted_at');
	return access.fieldScope === null ? query : query.whereIn('g.field_id', access.fieldScope);
}

export async function listGauges(access: FarmAccess, q: Knex = db()): Promise<RainGauge[]> {
	const rows = await gaugesQuery(q, access).orderByRaw('lower(g.name)').select('g.*', 'f.name as field_name');
	return rows.map(toGauge);
}

async function getGauge(q: Knex, access: FarmAccess, gaugeId: string): Promise<RainGauge> {
	if (!isUuid(gaugeId)) throw notFound('rain gauge');
	const row = await gaugesQuery(q, access).where({ 'g.id': gaugeId }).first('g.*', 'f.name as field_name');
	if (!row) throw notFound('rain gauge');
	return toGauge(row);
}

async function checkField(q: Knex, access: FarmAccess, fieldId: string | null | undefined) {
	if (!fieldId) return;
	const field = await q('fields').where({ id: fieldId, farm_id: access.farm.id }).whereNull('deleted_at').first('id');
	if (!field) throw invalid('That field is not one of this farm\'s fields.', { fieldId: ['Choose one of this farm\'s fields, or none.'] });
}

function duplicateGaugeName(e: unknown, name: string | undefined) {
	if ((e as { code?: string }).code === '23505' && name) {
		const message = `This farm already has a rain gauge named ${name}.`;
		return invalid(message, { name: [message] });
	}
	return e;
}

export async function createGauge(access: FarmAccess, input: GaugeInput): Promise<RainGauge> {
	await checkField(db(), access, input.fieldId);
	try {
		return await db().transaction(async (trx) => {
			const [row] = await trx('rain_gauges')
				.insert({
					farm_id: access.farm.id,
					name: input.name,
					location: JSON.stringify({ type: 'Point', coordinates: [input.location.lng, input.location.lat] }),
					field_id: input.fieldId,
					notes: input.notes,
					created_by: access.user.id,
					updated_by: access.user.id
				})
				.returning('id');
			const gauge = await getGauge(trx, access, row.id);
			await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'rain_gauge', entityId: gauge.id, action: 'create', after: gauge });
			return gauge;
		});
	} catch (e) {
		throw duplicateGaugeName(e, input.name);
	}
}

export async function updateGauge(access: FarmAccess, gaugeId: string, patch: GaugePatch): Promise<RainGauge> {
	await checkField(db(), access, patch.fieldId);
	try {
		return await db().transaction(async (trx) => {
			if (!isUuid(gaugeId)) throw notFound('rain gauge');
		const row = await trx('rain_gauges').where({ id: gaugeId, farm_id: access.farm.id }).whereNull('deleted_at').forUpdate().first();
			if (!row) throw notFound('rain gauge');
			if (row.version !== patch.version) throw versionConflict('rain gauge', row.version, patch.version);
			const before = await getGauge(trx, access, gaugeId);
			const changes: Record<string, unknown> = {};
			if (patch.name !== undefined) changes.name = patch.name;
			if (patch.location !== undefined) changes.location = JSON.stringify({ type: 'Point', coordinates: [patch.location.lng, patch.location.lat] });
			if (patch.fieldId !== undefined) changes.field_id = patch.fieldId;
			if (patch.notes !== undefined) changes.notes = patch.notes;
			await trx('rain_gauges').where({ id: gaugeId }).update({ ...changes, version: row.version + 1, updated_by: access.user.id, updated_at: trx.fn.now() });
			const after = await getGauge(trx, access, gaugeId);
			await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'rain_gauge', entityId: gaugeId, action: 'update', before, after });
			return after;
		});
	} catch (e) {
		throw duplicateGaugeName(e, patch.name);
	}
}

/** Soft delete: the gauge and its readings leave the lists, and stay in the database. */
export async function deleteGauge(access: FarmAccess, gaugeId: string): Promise<void> {
	await db().transaction(async (trx) => {
		if (!isUuid(gaugeId)) throw notFound('rain gauge');
		const row = await trx('rain_gauges').where({ id: gaugeId, farm_id: access.farm.id }).whereNull('deleted_at').forUpdate().first();
		if (!row) throw notFound('rain gauge');
		await trx('rain_gauges').where({ id: gaugeId }).update({ deleted_at: trx.fn.now(), deleted_by: access.user.id });
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'rain_gauge', entityId: gaugeId, action: 'delete', before: { name: row.name } });
	});
}

function readingsQuery(q: Knex, access: FarmAccess) {
	return gaugesQuery(q, access)
		.join('rainfall_readings as r', 'r.gauge_id', 'g.id')
		.leftJoin('users as u', 'u.id', 'r.created_by')
		.whereNull('r.deleted_at')
		.select('r.*', 'g.name as gauge_name', 'u.name as recorded_by', q.raw(`to_char(r.reading_date, 'YYYY-MM-DD') as day`));
}

/** Readings of a calendar year (the season), oldest first; optionally of one gauge. */
export async function listReadings(access: FarmAccess, season: number, gaugeId?: string | null): Promise<RainReading[]> {
	const q = readingsQuery(db(), access).whereBetween('r.reading_date', [`${season}-01-01`, `${season}-12-31`]);
	if (gaugeId) q.where({ 'g.id': gaugeId });
	const rows = await q.orderBy([{ column: 'r.reading_date' }, { column: 'g.name' }]);
	return rows.map(toReading);
}

async function getReading(q: Knex, access: FarmAccess, readingId: string): Promise<RainReading> {
	if (!isUuid(readingId)) throw notFound('rainfall reading');
	const row = await readingsQuery(q, access).where({ 'r.id': readingId }).first();
	if (!row) throw notFound('rainfall reading');
	return toReading(row);
}

export function readingWarnings(inches: number): string[] {
	return inches > PLAUSIBLE_DAILY_MAX_IN
		? [`${inches} in in one day is far above a usual heavy rain (over ${PLAUSIBLE_DAILY_MAX_IN} in); it was kept — check the gauge and the decimal point.`]
		: [];
}

/**
 * Records one gauge's rain for one day. The day comes as a date, or as the moment of reading,
 * which is turned into a day on the farm's clock. A day in the future is refused; a second
 * reading for the same gauge and day answers 409 (edit the first one instead).
 */
export async function createReading(access: FarmAccess, input: ReadingInput, now = new Date()): Promise<RainReading & { warnings: string[] }> {
	const day = input.date ?? calendarDayIn(new Date(input.readAt!), access.farm.timeZone);
	const today = calendarDayIn(now, access.farm.timeZone);
	if (day > today) {
		throw invalid('A reading records rain that has fallen: its day cannot be after today.', { date: [`${day} is after today (${today}) on the farm's clock.`] });
	}
	return db().transaction(async (trx) => {
		const gauge = await trx('rain_gauges').where({ id: input.gaugeId, farm_id: access.farm.id }).whereNull('deleted_at').first('id', 'name', 'field_id');
		if (!gauge || (access.fieldScope !== null && !access.fieldScope.includes(gauge.field_id))) {
			throw invalid('That rain gauge is not one of this farm\'s gauges.', { gaugeId: ['Choose one of this farm\'s rain gauges.'] });
		}
		const existing = await trx('rainfall_readings').where({ gauge_id: gauge.id, reading_date: day }).whereNull('deleted_at').first('id', 'inches');
		if (existing) {
			throw new AppError(409, `${gauge.name} already has ${existing.inches} in for ${day}; edit that reading instead.`, 'already_recorded', { date: [`Already recorded for ${day}.`] });
		}
		const [row] = await trx('rainfall_readings')
			.insert({ farm_id: access.farm.id, gauge_id: gauge.id, reading_date: day, inches: input.inches, notes: input.notes, created_by: access.user.id, updated_by: access.user.id })
			.returning('id');
		const reading = await getReading(trx, access, row.id);
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'rainfall_reading', entityId: reading.id, action: 'create', after: reading });
		return { ...reading, warnings: readingWarnings(reading.inches) };
	});
}

export async function updateReading(access: FarmAccess, readingId: string, patch: ReadingPatch): Promise<RainReading & { warnings: string[] }> {
	return db().transaction(async (trx) => {
		const before = await getReading(trx, access, readingId);
		const row = await trx('rainfall_readings').where({ id: readingId }).forUpdate().first('version');
		if (row.version !== patch.version) throw versionConflict('rainfall reading', row.version, patch.version);
		const changes: Record<string, unknown> = {};
		if (patch.inches !== undefined) changes.inches = patch.inches;
		if (patch.notes !== undefined) changes.notes = patch.notes;
		await trx('rainfall_readings').where({ id: readingId }).update({ ...changes, version: row.version + 1, updated_by: access.user.id, updated_at: trx.fn.now() });
		const after = await getReading(trx, access, readingId);
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'rainfall_reading', entityId: readingId, action: 'update', before, after });
		return { ...after, warnings: readingWarnings(after.inches) };
	});
}

export async function deleteReading(access: FarmAccess, readingId: string): Promise<void> {
	await db().transaction(async (trx) => {
		const before = await getReading(trx, access, readingId);
		await trx('rainfall_readings').where({ id: readingId }).update({ deleted_at: trx.fn.now(), deleted_by: access.user.id });
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'rainfall_reading', entityId: readingId, action: 'delete', before });
	});
}

export interface RainfallSeason {
	season: number;
	timeZone: string;
	gauges: (RainGauge & { total: GaugeTotal })[];
	weeks: WeekBucket[];
	readings: RainReading[];
}

/** A season's (calendar year's) rain: gauges with totals, weekly sums per gauge, and every reading. */
export async function rainfallSeason(access: FarmAccess, season: number): Promise<RainfallSeason> {
	const gauges = await listGauges(access);
	const readings = await listReadings(access, season);
	const ids = gauges.map((g) => g.id);
	const plain = readings.map((r) => ({ gaugeId: r.gaugeId, date: r.date, inches: r.inches }));
	const totals = gaugeTotals(plain, ids);
	return {
		season,
		timeZone: access.farm.timeZone,
		gauges: gauges.map((g, i) => ({ ...g, total: totals[i] })),
		weeks: weeklyTotals(plain, ids),
		readings
	};
}
