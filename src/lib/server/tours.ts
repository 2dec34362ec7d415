// Visitor tours for field days: a manager picks fields and ordered stops and gets a share link; a
// visitor with the link sees those fields' lanes and the stops until the link expires or is revoked.
// The link's token is shown once; only its SHA-256 is stored.
import { createHash, randomBytes } from 'node:crypto';
import { z } from 'zod';
import type { MultiPolygon, Polygon } from 'geojson';
import { db } from './db';
import { recordAudit } from './audit';
import { isUuid, type FarmAccess } from './access';
import { discardPhotos, photosOf, preparePhoto, recordPhotos, storePhotos } from './photos';
import { fileStore } from './storage';
import { invalid, notFound } from './errors';

const text = (label: string, max: number) => z.string({ message: `Give the ${label}.` }).trim().max(max, `Use at most ${max} characters.`);

export const tourStopSchema = z.object({
	lng: z.number({ message: 'Give the longitude as a number.' }).min(-180, 'Longitude is between -180 and 180.').max(180, 'Longitude is between -180 and 180.'),
	lat: z.number({ message: 'Give the latitude as a number.' }).min(-90, 'Latitude is between -90 and 90.').max(90, 'Latitude is between -90 and 90.'),
	title: text('stop title', 120).min(1, 'Give the stop a title.'),
	note: text('note', 2000).default('')
});

export const tourCreateSchema = z.object({
	title: text('tour title', 120).min(1, 'Give the tour a title.'),
	date: z.string({ message: 'Give the tour date as YYYY-MM-DD.' }).regex(/^\d{4}-\d{2}-\d{2}$/, 'Give the tour date as YYYY-MM-DD.')
		.refine((d) => !Number.isNaN(Date.parse(`${d}T00:00:00Z`)) && new Date(`${d}T00:00:00Z`).toISOString().startsWith(d), 'That date does not exist.'),
	expiresAt: z.string({ message: 'Give when the link stops working, as an ISO 8601 time with an offset.' })
		.datetime({ offset: true, message: 'Give when the link stops working, as an ISO 8601 time with an offset (e.g. 2027-07-16T18:00:00-05:00).' }),
	fieldIds: z.array(z.string().uuid('A field id is not valid.'), { message: 'Choose the fields the visitors see.' })
		.min(1, 'Choose at least one field.').max(50, 'At most 50 fields per tour.'),
	stops: z.array(tourStopSchema, { message: 'Add the stops of the tour.' }).min(1, 'A tour needs at least one stop.').max(60, 'At most 60 stops per tour.')
});

export type TourCreateInput = z.infer<typeof tourCreateSchema>;

export interface TourSummary {
	id: string;
	title: string;
	date: string;
	expiresAt: Date;
	revokedAt: Date | null;
	status: 'active' | 'expired' | 'revoked';
	stops: number;
	fieldNames: string[];
	createdAt: Date;
}

export const NO_TOUR = 'This tour link does not work: it was mistyped, has expired, or the farm has withdrawn it.';

/** Tokens are 32 random bytes in base64url: 43 characters. */
const TOKEN_FORMAT = /^[A-Za-z0-9_-]{43}$/;

export function hashToken(token: string): string {
	return createHash('sha256').update(token).digest('hex');
}

export function sharePath(token: string): string {
	return `/share/${token}`;
}

/**
 * Creates a tour and its share link. The expiry must lie ahead; every field must be one of this
 * farm's (another farm's id is refused like a missing one, never named).
 */
export async function createTour(access: FarmAccess, input: TourCreateInput, now = new Date()): Promise<{ id: string; token: string }> {
	const expiresAt = new Date(input.expiresAt);
	if (expiresAt.getTime() <= now.getTime()) {
		throw invalid('The link would already have expired: choose an expiry in the future.', { expiresAt: ['Choose a time in the future.'] });
	}
	const fieldIds = [...new Set(input.fieldIds)];
	const found = await db()('fields').where({ farm_id: access.farm.id }).whereNull('deleted_at').whereIn('id', fieldIds).pluck('id');
	if (found.length !== fieldIds.length) {
		throw invalid('One or more of the chosen fields are not fields of this farm.', { fieldIds: ['Choose fields of this farm.'] });
	}
	const token = randomBytes(32).toString('base64url');
	const id = await db().transaction(async (trx) => {
		const [tour] = await trx('tours')
			.insert({ farm_id: access.farm.id, title: input.title, tour_date: input.date, expires_at: expiresAt, token_hash: hashToken(token), field_ids: fieldIds, created_by: access.user.id })
			.returning('id');
		await trx('tour_stops').insert(
			input.stops.map((s, position) => ({ farm_id: access.farm.id, tour_id: tour.id, position, lng: s.lng, lat: s.lat, title: s.title, note: s.note }))
		);
		await recordAudit(trx, {
			farmId: access.farm.id,
			userId: access.user.id,
			entity: 'tour',
			entityId: tour.id,
			action: 'create',
			after: { title: input.title, date: input.date, expiresAt: expiresAt.toISOString(), fieldIds, stops: input.stops.length }
		});
		return tour.id as string;
	});
	return { id, token };
}

export async function listTours(access: FarmAccess, now = new Date()): Promise<TourSummary[]> {
	const rows = await db()('tours as t')
		.where({ 't.farm_id': access.farm.id })
		.orderBy([{ column: 't.tour_date', order: 'desc' }, { column: 't.created_at', order: 'desc' }])
		.select('t.*', db().raw('(select count(*) from tour_stops s where s.tour_id = t.id)::int as stop_count'), db().raw(`to_char(t.tour_date, 'YYYY-MM-DD') as day`));
	const names = new Map<string, string>(
		(await db()('fields').where({ farm_id: access.farm.id }).select('id', 'name')).map((f) => [f.id as string, f.name as string])
	);
	return rows.map((r) => ({
		id: r.id,
		title: r.title,
		date: r.day,
		expiresAt: r.expires_at,
		revokedAt: r.revoked_at,
		status: r.revoked_at ? 'revoked' : new Date(r.expires_at) <= now ? 'expired' : 'active',
		stops: r.stop_count,
		fieldNames: (r.field_ids as string[]).map((id) => names.get(id) ?? 'a deleted field'),
		createdAt: r.created_at
	}));
}

/** Revokes the link at once; revoking a revoked tour changes nothing. */
export async function revokeTour(access: FarmAccess, tourId: string): Promise<{ id: string; revokedAt: Date }> {
	return db().transaction(async (trx) => {
		const tour = await trx('tours').where({ id: tourId, farm_id: access.farm.id }).forUpdate().first();
		if (!tour) throw notFound('tour');
		if (tour.revoked_at) return { id: tour.id, revokedAt: tour.revoked_at };
		const [row] = await trx('tours').where({ id: tourId }).update({ revoked_at: trx.fn.now(), revoked_by: access.user.id }).returning(['id', 'revoked_at']);
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'tour', entityId: tourId, action: 'revoke', before: { title: tour.title } });
		return { id: row.id, revokedAt: row.revoked_at };
	});
}

export interface VisitorLane {
	index: number;
	kind: string;
	crop: string;
	widthFt: number;
	geometry: Polygon | MultiPolygon;
}

export interface VisitorTour {
	title: string;
	date: string;
	season: number;
	fields: { name: string; boundary: Polygon | MultiPolygon; lanes: VisitorLane[] }[];
	stops: { number: number; lng: number; lat: number; title: string; note: string; photos: StopPhoto[] }[];
}

/**
 * What a visitor with the link sees, or null for a token that is malformed, unknown, revoked or
 * expired, or whose farm is gone: the tour's fields with the lanes of the season of the tour date,
 * and its stops. Nothing about members, records or other fields.
 */
export async function visitorTour(token: string, now = new Date()): Promise<VisitorTour | null> {
	if (!TOKEN_FORMAT.test(token)) return null;
	const tour = await db()('tours as t')
		.join('farms as f', 'f.id', 't.farm_id')
		.whereNull('f.deleted_at')
		.whereNull('t.revoked_at')
		.where('t.expires_at', '>', now)
		.where({ 't.token_hash': hashToken(token) })
		.first('t.id', 't.farm_id', 't.title', 't.field_ids', db().raw(`to_char(t.tour_date, 'YYYY-MM-DD') as day`));
	if (!tour) return null;
	const season = Number(tour.day.slice(0, 4));
	const [fields, lanes, stops] = await Promise.all([
		db()('fields').where({ farm_id: tour.farm_id }).whereNull('deleted_at').whereIn('id', tour.field_ids).orderByRaw('lower(name)').select('id', 'name', 'boundary'),
		db()('plans as p')
			.join('plan_lanes as l', 'l.plan_id', 'p.id')
			.where({ 'p.farm_id': tour.farm_id, 'p.season': season, 'p.adopted': true })
			.whereNull('p.deleted_at')
			.whereIn('p.field_id', tour.field_ids)
			.orderBy('l.lane_index')
			.select('p.field_id', 'l.lane_index', 'l.kind', 'l.crop', 'l.width_ft', 'l.geometry'),
		db()('tour_stops').where({ tour_id: tour.id }).orderBy('position').select('id', 'position', 'lng', 'lat', 'title', 'note')
	]);
	const photos = await db()('attachments')
		.where({ farm_id: tour.farm_id, entity: 'tour_stop' })
		.whereIn('entity_id', stops.map((s) => s.id))
		.whereNull('deleted_at')
		.orderBy([{ column: 'created_at' }, { column: 'id' }])
		.select('id', 'entity_id', 'width', 'height');
	return {
		title: tour.title,
		date: tour.day,
		season,
		fields: fields.map((f) => ({
			name: f.name,
			boundary: f.boundary,
			lanes: lanes
				.filter((l) => l.field_id === f.id)
				.map((l) => ({ index: l.lane_index, kind: l.kind, crop: l.crop, widthFt: Number(l.width_ft), geometry: l.geometry }))
		})),
		stops: stops.map((s) => ({
			number: s.position + 1,
			lng: Number(s.lng),
			lat: Number(s.lat),
			title: s.title,
			note: s.note,
			photos: photos.filter((p) => p.entity_id === s.id).map((p) => ({ id: p.id, width: p.width, height: p.height }))
		}))
	};
}

export interface StopPhoto {
	id: string;
	width: number | null;
	height: number | null;
}

/**
 * Adds photos to a stop (1-based number) of a tour whose link still works; the copies are resized
 * and stripped of their location data by the photo module, and written before the rows.
 */
export async function addStopPhotos(access: FarmAccess, tourId: string, stopNumber: number, files: File[]): Promise<StopPhoto[]> {
	const stop = await db()('tour_stops as s')
		.join('tours as t', 't.id', 's.tour_id')
		.where({ 't.id': tourId, 't.farm_id': access.farm.id, 's.position': stopNumber - 1 })
		.first('s.id', 't.revoked_at');
	if (!stop) throw notFound('tour stop');
	if (stop.revoked_at) throw invalid('This tour link was revoked; make a new tour to share photos.');
	if (files.length === 0) throw invalid('Choose at least one photo.', { photo: ['Choose a photo.'] });
	const prepared = [];
	for (const f of files) prepared.push(await preparePhoto(new Uint8Array(await f.arrayBuffer()), f.name || null));
	const stored = await storePhotos(access.farm.id, prepared);
	try {
		await db().transaction(async (trx) => {
			await recordPhotos(trx, { farmId: access.farm.id, fieldId: null, entity: 'tour_stop', entityId: stop.id, userId: access.user.id }, stored);
			await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'tour', entityId: tourId, action: 'add_photos', after: { stop: stopNumber, photos: stored.map((s) => s.id) } });
		});
	} catch (e) {
		await discardPhotos(stored);
		throw e;
	}
	return stored.map((s) => ({ id: s.id, width: s.width, height: s.height }));
}

/** A stop photo for a visitor holding a working link to its tour, else null. */
export async function visitorPhoto(token: string, photoId: string, size: 'display' | 'thumb', now = new Date()): Promise<{ bytes: Uint8Array; contentType: string } | null> {
	if (!TOKEN_FORMAT.test(token) || !isUuid(photoId)) return null;
	const row = await db()('attachments as a')
		.join('tour_stops as s', function () {
			this.on('s.id', '=', 'a.entity_id').andOnVal('a.entity', '=', 'tour_stop');
		})
		.join('tours as t', 't.id', 's.tour_id')
		.join('farms as f', 'f.id', 't.farm_id')
		.where({ 'a.id': photoId, 't.token_hash': hashToken(token) })
		.whereRaw('a.farm_id = t.farm_id')
		.whereNull('a.deleted_at')
		.whereNull('t.revoked_at')
		.whereNull('f.deleted_at')
		.where('t.expires_at', '>', now)
		.first('a.storage_key', 'a.thumb_key', 'a.content_type');
	if (!row) return null;
	const bytes = await fileStore().get(size === 'thumb' && row.thumb_key ? row.thumb_key : row.storage_key);
	return bytes ? { bytes, contentType: row.content_type } : null;
}

/** One tour with its stops and their photos, for the farm's managers. */
export async function getTour(access: FarmAccess, tourId: string, now = new Date()) {
	const tour = isUuid(tourId) ? (await listTours(access, now)).find((t) => t.id === tourId) : undefined;
	if (!tour) throw notFound('tour');
	const stops = await db()('tour_stops').where({ tour_id: tourId, farm_id: access.farm.id }).orderBy('position').select('id', 'position', 'lng', 'lat', 'title', 'note');
	const photos = await photosOf(db(), access.farm.id, 'tour_stop', stops.map((s) => s.id));
	return {
		...tour,
		stopList: stops.map((s) => ({ number: s.position + 1, lng: Number(s.lng), lat: Number(s.lat), title: s.title as string, note: s.note as string, photos: photos.get(s.id) ?? [] }))
	};
}
