// Photos attached to records: read from a multipart upload with a hard size limit, recognised by
// their content (never by name or declared type), resized for display, stripped of metadata
// (EXIF, GPS position, camera serials) and kept through the file store.
import { randomUUID } from 'node:crypto';
import sharp from 'sharp';
import type { Knex } from 'knex';
import { AppError } from './errors';
import { readBodyUpTo } from './read-body';
import { fileStore } from './storage';

export const MAX_PHOTO_BYTES = 15 * 1024 * 1024;
// Room for the multipart framing and a note's text fields around the photos.
const FRAMING_BYTES = 64 * 1024;
export const MAX_PHOTOS_PER_UPLOAD = 4;
const DISPLAY_PX = 1600;
const THUMB_PX = 400;
// A small file can still unpack to a huge picture; 60 megapixels is far beyond any phone camera.
const MAX_SIDE_PX = 16_384;
const MAX_INPUT_PIXELS = 60_000_000;

const FORMATS = { jpeg: { type: 'image/jpeg', ext: 'jpg' }, png: { type: 'image/png', ext: 'png' }, webp: { type: 'image/webp', ext: 'webp' } } as const;
type PhotoFormat = keyof typeof FORMATS;

export const ACCEPTED_PHOTO_TYPES = Object.values(FORMATS).map((f) => f.type);

const mb = (n: number) => (n / 1024 / 1024).toFixed(1);

function tooLarge(bytes: number | null, field = 'photo') {
	const limit = `photos are limited to ${mb(MAX_PHOTO_BYTES)} MB each`;
	const message = bytes === null ? `The upload is larger than the limit: ${limit}.` : `The file is ${mb(bytes)} MB; ${limit}.`;
	return new AppError(413, message, 'too_large', { [field]: [message] });
}

function isTooLarge(e: unknown): boolean {
	const status = (x: unknown) => (x as { status?: unknown } | null)?.status;
	return status(e) === 413 || status((e as { cause?: unknown } | null)?.cause) === 413;
}

/**
 * The multipart form of a request holding up to {@link MAX_PHOTOS_PER_UPLOAD} photos. A body
 * declaring more than that is refused before any of it is read; one declaring nothing is counted
 * as it arrives and refused once past the limit, so a 200 MB upload is never held in memory.
 */
export async function readPhotoForm(request: Request): Promise<FormData> {
	const limit = MAX_PHOTO_BYTES * MAX_PHOTOS_PER_UPLOAD + FRAMING_BYTES;
	const declared = Number(request.headers.get('content-length') ?? 0);
	if (declared > limit) throw tooLarge(declared);
	let bytes: Uint8Array<ArrayBuffer> | null;
	try {
		// Stop at the limit without cancelling, so the 413 can still be sent on the socket.
		bytes = await readBodyUpTo(request.body, limit, 'release');
	} catch (e) {
		if (isTooLarge(e)) throw tooLarge(null);
		throw new AppError(400, 'The upload was interrupted before it was complete; send it again.', 'bad_upload');
	}
	if (!bytes) throw tooLarge(null);
	try {
		return await new Response(bytes, { headers: { 'content-type': request.headers.get('content-type') ?? '' } }).formData();
	} catch {
		throw new AppError(400, 'Send photos as multipart/form-data in fields named "photo".', 'bad_upload');
	}
}

/** The non-empty files of the form's `photo` fields. */
export function photoFiles(form: FormData, field = 'photo'): File[] {
	const files = form.getAll(field).filter((f): f is File => f instanceof File && f.size > 0);
	if (files.length > MAX_PHOTOS_PER_UPLOAD) {
		throw new AppError(400, `At most ${MAX_PHOTOS_PER_UPLOAD} photos at a time.`, 'invalid', { [field]: [`At most ${MAX_PHOTOS_PER_UPLOAD} photos at a time.`] });
	}
	for (const f of files) if (f.size > MAX_PHOTO_BYTES) throw tooLarge(f.size, field);
	return files;
}

export interface PreparedPhoto {
	originalName: string | null;
	originalByteSize: number;
	contentType: string;
	ext: string;
	display: Buffer;
	thumb: Buffer;
	width: number;
	height: number;
}

function notAnImage(name: string | null, field: string) {
	const what = name ? `"${name}"` : 'The file';
	const message = `${what} is not a JPEG, PNG or WebP photo (judged by its content, not its name).`;
	return new AppError(400, message, 'not_an_image', { [field]: [message] });
}

/** Checks the bytes are a JPEG, PNG or WebP picture and makes the display and thumbnail copies, without metadata. */
export async function preparePhoto(bytes: Uint8Array, originalName: string | null, field = 'photo'): Promise<PreparedPhoto> {
	if (bytes.byteLength > MAX_PHOTO_BYTES) throw tooLarge(bytes.byteLength, field);
	const input = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	let format: PhotoFormat;
	try {
		const meta = await sharp(input, { limitInputPixels: MAX_INPUT_PIXELS }).metadata();
		if (!meta.format || !(meta.format in FORMATS)) throw notAnImage(originalName, field);
		format = meta.format as PhotoFormat;
		// A long thin strip under the pixel limit still costs seconds to scale; no camera makes one.
		if ((meta.width ?? 0) > MAX_SIDE_PX || (meta.height ?? 0) > MAX_SIDE_PX) {
			const message = `The picture is ${meta.width} × ${meta.height} pixels; each side may be at most ${MAX_SIDE_PX.toLocaleString('en-US')} pixels.`;
			throw new AppError(400, message, 'not_an_image', { [field]: [message] });
		}
	} catch (e) {
		if (e instanceof AppError) throw e;
		throw notAnImage(originalName, field);
	}
	const copy = async (px: number) => {
		// rotate() turns the picture upright from its EXIF orientation before the metadata is dropped
		// (sharp writes none unless asked).
		let pipeline = sharp(input, { limitInputPixels: MAX_INPUT_PIXELS, failOn: 'error' }).rotate().resize({ width: px, height: px, fit: 'inside', withoutEnlargement: true });
		pipeline = format === 'jpeg' ? pipeline.jpeg({ quality: 82, mozjpeg: true }) : format === 'png' ? pipeline.png({ compressionLevel: 9 }) : pipeline.webp({ quality: 82 });
		return pipeline.toBuffer({ resolveWithObject: true });
	};
	let display, thumb;
	try {
		display = await copy(DISPLAY_PX);
		thumb = await copy(THUMB_PX);
	} catch (e) {
		const message = /pixel limit/i.test(String((e as Error)?.message))
			? `The picture is larger than ${MAX_INPUT_PIXELS / 1_000_000} megapixels; send a smaller one.`
			: `${originalName ? `"${originalName}"` : 'The file'} is damaged or only partly uploaded and cannot be read as a picture.`;
		throw new AppError(400, message, 'not_an_image', { [field]: [message] });
	}
	return {
		originalName: originalName ? originalName.slice(0, 200) : null,
		originalByteSize: bytes.byteLength,
		contentType: FORMATS[format].type,
		ext: FORMATS[format].ext,
		display: display.data,
		thumb: thumb.data,
		width: display.info.width,
		height: display.info.height
	};
}

export interface StoredPhoto extends PreparedPhoto {
	id: string;
	storageKey: string;
	thumbKey: string;
}

/** Writes the copies to the file store; call before the transaction that records them. */
export async function storePhotos(farmId: string, prepared: PreparedPhoto[]): Promise<StoredPhoto[]> {
	const stored: StoredPhoto[] = [];
	try {
		for (const p of prepared) {
			const id = randomUUID();
			const base = `farms/${farmId}/photos/${id}`;
			const photo = { ...p, id, storageKey: `${base}.${p.ext}`, thumbKey: `${base}-thumb.${p.ext}` };
			await fileStore().put(photo.storageKey, p.display, p.contentType);
			stored.push(photo);
			await fileStore().put(photo.thumbKey, p.thumb, p.contentType);
		}
	} catch (e) {
		await discardPhotos(stored);
		throw e;
	}
	return stored;
}

/** Removes stored copies whose record was not written after all (best effort). */
export async function discardPhotos(stored: StoredPhoto[]) {
	for (const s of stored) {
		await fileStore().remove(s.storageKey).catch(() => {});
		await fileStore().remove(s.thumbKey).catch(() => {});
	}
}

/** The attachment rows for stored photos, inside the caller's transaction. */
export async function recordPhotos(
	trx: Knex.Transaction,
	owner: { farmId: string; fieldId: string | null; entity: string; entityId: string; userId: string },
	stored: StoredPhoto[]
) {
	if (stored.length === 0) return;
	await trx('attachments').insert(
		stored.map((s) => ({
			id: s.id,
			farm_id: owner.farmId,
			entity: owner.entity,
			entity_id: owner.entityId,
			field_id: owner.fieldId,
			storage_key: s.storageKey,
			thumb_key: s.thumbKey,
			content_type: s.contentType,
			byte_size: s.display.byteLength,
			width: s.width,
			height: s.height,
			original_byte_size: s.originalByteSize,
			original_name: s.originalName,
			created_by: owner.userId
		}))
	);
}

export interface PhotoSummary {
	id: string;
	url: string;
	thumbUrl: string;
	contentType: string;
	byteSize: number;
	width: number | null;
	height: number | null;
	originalName: string | null;
	createdAt: string;
}

export function photoUrl(farmId: string, photoId: string, size: 'display' | 'thumb' = 'display') {
	return `/api/farms/${farmId}/photos/${photoId}${size === 'thumb' ? '?size=thumb' : ''}`;
}

export function toPhotoSummary(r: Record<string, any>): PhotoSummary {
	return {
		id: r.id,
		url: photoUrl(r.farm_id, r.id),
		thumbUrl: photoUrl(r.farm_id, r.id, 'thumb'),
		contentType: r.content_type,
		byteSize: r.byte_size,
		width: r.width,
		height: r.height,
		originalName: r.original_name,
		createdAt: new Date(r.created_at).toISOString()
	};
}

/** Photos of several records of one kind, by record id, oldest first. */
export async function photosOf(q: Knex, farmId: string, entity: string, ids: string[]): Promise<Map<string, PhotoSummary[]>> {
	const out = new Map<string, PhotoSummary[]>();
	if (ids.length === 0) return out;
	const rows = await q('attachments').where({ farm_id: farmId, entity }).whereIn('entity_id', ids).whereNull('deleted_at').orderBy([{ column: 'created_at' }, { column: 'id' }]);
	for (const r of rows) {
		const list = out.get(r.entity_id) ?? [];
		list.push(toPhotoSummary(r));
		out.set(r.entity_id, list);
	}
	return out;
}

/**
 * A photo's bytes for a member who may read its field; anything else (another farm, a field not
 * granted to a viewer, a deleted photo or record) is simply not there.
 */
export async function readPhoto(
	q: Knex,
	access: { farm: { id: string }; fieldScope: string[] | null },
	photoId: string,
	size: 'display' | 'thumb'
): Promise<{ bytes: Uint8Array; contentType: string } | null> {
	const row = await q('attachments as a')
		.leftJoin('scouting_notes as n', function () {
			this.on('n.id', '=', 'a.entity_id').andOnVal('a.entity', '=', 'scouting_note');
		})
		.where({ 'a.id': photoId, 'a.farm_id': access.farm.id })
		.whereNull('a.deleted_at')
		.whereNull('n.deleted_at')
		.first('a.storage_key', 'a.thumb_key', 'a.content_type', 'a.field_id');
	if (!row) return null;
	if (access.fieldScope !== null && (row.field_id === null || !access.fieldScope.includes(row.field_id))) return null;
	const bytes = await fileStore().get(size === 'thumb' && row.thumb_key ? row.thumb_key : row.storage_key);
	return bytes ? { bytes, contentType: row.content_type } : null;
}
