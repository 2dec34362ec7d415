import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireMember } from '$lib/server/access';
import { db } from '$lib/server/db';
import { notFound } from '$lib/server/errors';
import { readPhoto } from '$lib/server/photos';
import { deletePhoto } from '$lib/server/scouting';

/** A photo's display copy, or `?size=thumb` for the small one; only to members who may read its field. */
export const GET: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const size = event.url.searchParams.get('size') === 'thumb' ? 'thumb' : 'display';
	const photo = await readPhoto(db(), access, event.params.photoId, size);
	if (!photo) throw notFound('photo');
	return new Response(Buffer.from(photo.bytes), {
		headers: {
			'content-type': photo.contentType,
			'content-length': String(photo.bytes.byteLength),
			'x-content-type-options': 'nosniff',
			'content-disposition': 'inline',
			// Private to the signed-in member; a stored copy never changes, so the browser may keep it.
			'cache-control': 'private, max-age=86400'
		}
	});
});

export const DELETE: RequestHandler = api(async (event) => {
	const access = await requireMember(event, event.params.farmId, 'scout');
	await deletePhoto(access, event.params.photoId);
	return new Response(null, { status: 204 });
});
