import { describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { db } from '$lib/server/db';
import { createField } from '$lib/server/fields';
import { rectangle } from '../fixtures/rectangle';
import { fileStore } from '$lib/server/storage';
import { MAX_PHOTO_BYTES, preparePhoto } from '$lib/server/photos';
import * as notesRoute from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/seasons/[season]/scouting/+server';
import * as noteRoute from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/seasons/[season]/scouting/[noteId]/+server';
import * as notePhotosRoute from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/seasons/[season]/scouting/[noteId]/photos/+server';
import * as photoRoute from '../../src/routes/api/farms/[farmId]/photos/[photoId]/+server';
import { call, farmWithPlan, photoForm, photoWithGps, smallPng } from './scouting-setup';

const when = '2026-06-10T09:30:00-05:00';

/** Whether EXIF bytes hold the GPS directory pointer (tag 0x8825, either byte order). */
function hasGpsPointer(exif: Buffer | undefined): boolean {
	return !!exif && (exif.includes(Buffer.from([0x88, 0x25])) || exif.includes(Buffer.from([0x25, 0x88])));
}

async function noteWithoutPhoto() {
	const s = await farmWithPlan();
	const params = { farmId: s.farm.id, fieldId: s.field.id, season: '2026' };
	const note = await call(notesRoute.POST, s.members.advisor, params, { method: 'POST', json: { laneIndex: 2, observedAt: when } });
	expect(note.status).toBe(201);
	return { ...s, params, noteParams: { ...params, noteId: note.body.id } };
}

describe('photo uploads', () => {
	it('resizes a phone photo for display and a thumbnail and strips its EXIF, GPS position included', async () => {
		const s = await noteWithoutPhoto();
		const original = await photoWithGps(2400, 1800);
		const before = await sharp(original).metadata();
		expect(hasGpsPointer(before.exif)).toBe(true);
		expect(before.exif!.toString('latin1')).toContain('FieldCam');

		const res = await call(notePhotosRoute.POST, s.members.advisor, s.noteParams, { method: 'POST', form: photoForm({}, [{ name: 'IMG_0001.JPG', bytes: original }]) });
		expect(res.status).toBe(201);
		const [photo] = res.body.photos;
		expect(photo).toMatchObject({ contentType: 'image/jpeg', width: 1600, height: 1200, originalName: 'IMG_0001.JPG' });

		const row = await db()('attachments').where({ id: photo.id }).first();
		expect(row.original_byte_size).toBe(original.byteLength);
		for (const key of [row.storage_key, row.thumb_key]) {
			const stored = Buffer.from((await fileStore().get(key))!);
			const meta = await sharp(stored).metadata();
			expect(meta.exif).toBeUndefined();
			expect(stored.includes(Buffer.from('FieldCam'))).toBe(false);
			expect(stored.includes(Buffer.from('Exif\0'))).toBe(false);
		}
		expect((await sharp(Buffer.from((await fileStore().get(row.thumb_key))!)).metadata()).width).toBe(400);

		const served = await call(photoRoute.GET, s.members.viewer, { farmId: s.farm.id, photoId: photo.id });
		expect(served.status).toBe(404); // the viewer has no field granted yet
		await db()('memberships').where({ farm_id: s.farm.id, user_id: s.members.viewer.id }).update({ field_scope: [s.field.id] });
		const shown = await call(photoRoute.GET, s.members.viewer, { farmId: s.farm.id, photoId: photo.id });
		expect(shown.status).toBe(200);
		expect(shown.headers.get('content-type')).toBe('image/jpeg');
		expect(shown.headers.get('x-content-type-options')).toBe('nosniff');
		expect((await sharp(Buffer.from(shown.body)).metadata()).width).toBe(1600);
		const thumb = await call(photoRoute.GET, s.members.viewer, { farmId: s.farm.id, photoId: photo.id }, { query: 'size=thumb' });
		expect((await sharp(Buffer.from(thumb.body)).metadata()).width).toBe(400);
	});

	it('judges the type by content: a .jpg holding text is refused, a PNG named .jpg is kept as PNG', async () => {
		const s = await noteWithoutPhoto();
		const text = new TextEncoder().encode('this is not a picture, just some text\n'.repeat(50));
		const refused = await call(notePhotosRoute.POST, s.members.advisor, s.noteParams, { method: 'POST', form: photoForm({}, [{ name: 'field.jpg', bytes: text }]) });
		expect(refused.status).toBe(400);
		expect(refused.body.error).toEqual({
			code: 'not_an_image',
			message: '"field.jpg" is not a JPEG, PNG or WebP photo (judged by its content, not its name).',
			fields: { photo: ['"field.jpg" is not a JPEG, PNG or WebP photo (judged by its content, not its name).'] }
		});
		const svg = new TextEncoder().encode('<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><script>alert(1)</script></svg>');
		expect((await call(notePhotosRoute.POST, s.members.advisor, s.noteParams, { method: 'POST', form: photoForm({}, [{ name: 'x.png', bytes: svg, type: 'image/png' }]) })).status).toBe(400);
		expect(await db()('attachments').where({ farm_id: s.farm.id }).count('* as n').first()).toEqual({ n: 0 });

		const png = await call(notePhotosRoute.POST, s.members.advisor, s.noteParams, { method: 'POST', form: photoForm({}, [{ name: 'leaf.jpg', bytes: await smallPng() }]) });
		expect(png.status).toBe(201);
		expect(png.body.photos[0]).toMatchObject({ contentType: 'image/png', width: 300, height: 200 });
		const served = await call(photoRoute.GET, s.members.owner, { farmId: s.farm.id, photoId: png.body.photos[0].id });
		expect(served.headers.get('content-type')).toBe('image/png');
	});

	it('refuses a picture with a side over 16,384 pixels, however few pixels it holds in all', async () => {
		const strip = await sharp({ create: { width: 20_000, height: 2, channels: 3, background: '#888' } }).png().toBuffer();
		const refused = await preparePhoto(new Uint8Array(strip), 'strip.png').catch((e) => e);
		expect(refused.status).toBe(400);
		expect(refused.message).toBe('The picture is 20000 × 2 pixels; each side may be at most 16,384 pixels.');
		const wide = await sharp({ create: { width: 16_384, height: 2, channels: 3, background: '#888' } }).png().toBuffer();
		expect((await preparePhoto(new Uint8Array(wide), 'wide.png')).width).toBe(1600);
	});

	it('refuses a photo over 15 MB with 413, and a 200 MB upload before reading it all', async () => {
		const s = await noteWithoutPhoto();
		const big = new Uint8Array(MAX_PHOTO_BYTES + 1);
		const over = await call(notePhotosRoute.POST, s.members.advisor, s.noteParams, { method: 'POST', form: photoForm({}, [{ name: 'big.jpg', bytes: big }]) });
		expect(over.status).toBe(413);
		expect(over.body.error.message).toBe('The file is 15.0 MB; photos are limited to 15.0 MB each.');

		// Declared 200 MB: refused from the header alone, nothing of the body is pulled.
		let pulls = 0;
		const idle = new ReadableStream<Uint8Array>({ pull() { pulls++; return new Promise(() => {}); } });
		const declared = await call(notePhotosRoute.POST, s.members.advisor, s.noteParams, {
			method: 'POST',
			body: idle,
			headers: { 'content-type': 'multipart/form-data; boundary=x', 'content-length': String(200 * 1024 * 1024) }
		});
		expect(declared.status).toBe(413);
		expect(pulls).toBeLessThanOrEqual(1);

		// No length declared (chunked): counted as it arrives and refused at the limit, not at 200 MB.
		const chunk = new Uint8Array(1024 * 1024);
		let sent = 0;
		const endless = new ReadableStream<Uint8Array>({
			pull(controller) {
				if (sent >= 200) return controller.close();
				sent++;
				controller.enqueue(chunk);
			}
		});
		const chunked = await call(notePhotosRoute.POST, s.members.advisor, s.noteParams, { method: 'POST', body: endless, headers: { 'content-type': 'multipart/form-data; boundary=x' } });
		expect(chunked.status).toBe(413);
		expect(sent).toBeLessThan(70);
		expect(await db()('attachments').where({ farm_id: s.farm.id }).count('* as n').first()).toEqual({ n: 0 });
	});

	it('serves a photo only to members who may read its field: another farm, a viewer of another field, a deleted note → 404', async () => {
		const s = await noteWithoutPhoto();
		const other = await farmWithPlan();
		const res = await call(notePhotosRoute.POST, s.members.advisor, s.noteParams, { method: 'POST', form: photoForm({}, [{ name: 'a.jpg', bytes: await photoWithGps(640, 480) }]) });
		const photoId = res.body.photos[0].id;

		expect((await call(photoRoute.GET, s.members.crew, { farmId: s.farm.id, photoId })).status).toBe(200);
		// Another farm's member, through their own farm or this one.
		expect((await call(photoRoute.GET, other.members.owner, { farmId: other.farm.id, photoId })).status).toBe(404);
		expect((await call(photoRoute.GET, other.members.owner, { farmId: s.farm.id, photoId })).status).toBe(404);
		// A viewer granted only another field of the farm.
		const second = await createField(s.access, { name: 'North pasture', boundary: rectangle(300, 300, -94.3, 43.95), exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
		await db()('memberships').where({ farm_id: s.farm.id, user_id: s.members.viewer.id }).update({ field_scope: [second.id] });
		const hidden = await call(photoRoute.GET, s.members.viewer, { farmId: s.farm.id, photoId });
		expect(hidden.status).toBe(404);
		expect(hidden.body.error.code).toBe('not_found');

		// Viewers cannot add photos; advisors cannot add to a note of someone else.
		const crewNote = await call(notesRoute.POST, s.members.crew, s.params, { method: 'POST', json: { laneIndex: 3, observedAt: when } });
		const form = () => photoForm({}, [{ name: 'b.jpg', bytes: Buffer.alloc(0) }]);
		expect((await call(notePhotosRoute.POST, s.members.viewer, s.noteParams, { method: 'POST', form: form() })).status).toBe(403);
		const png = await smallPng();
		expect((await call(notePhotosRoute.POST, s.members.advisor, { ...s.params, noteId: crewNote.body.id }, { method: 'POST', form: photoForm({}, [{ name: 'c.png', bytes: png }]) })).status).toBe(403);

		// Removing the photo, then the note, hides it.
		expect((await call(photoRoute.DELETE, s.members.viewer, { farmId: s.farm.id, photoId }, { method: 'DELETE' })).status).toBe(403);
		const again = await call(notePhotosRoute.POST, s.members.advisor, s.noteParams, { method: 'POST', form: photoForm({}, [{ name: 'd.png', bytes: png }]) });
		expect((await call(photoRoute.DELETE, s.members.advisor, { farmId: s.farm.id, photoId }, { method: 'DELETE' })).status).toBe(204);
		expect((await call(photoRoute.GET, s.members.owner, { farmId: s.farm.id, photoId })).status).toBe(404);
		const other2 = again.body.photos[0].id;
		expect((await call(photoRoute.GET, s.members.owner, { farmId: s.farm.id, photoId: other2 })).status).toBe(200);
		expect((await call(noteRoute.DELETE, s.members.advisor, s.noteParams, { method: 'DELETE' })).status).toBe(204);
		expect((await call(photoRoute.GET, s.members.owner, { farmId: s.farm.id, photoId: other2 })).status).toBe(404);
	});
});
