import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { NO_TOUR, visitorPhoto } from '$lib/server/tours';

// A stop photo for whoever holds a working tour link; nothing else is served here.
export const GET: RequestHandler = async ({ params, url }) => {
	const photo = await visitorPhoto(params.token, params.photo, url.searchParams.get('size') === 'thumb' ? 'thumb' : 'display');
	if (!photo) error(404, { message: NO_TOUR, code: 'not_found' });
	return new Response(new Uint8Array(photo.bytes), {
		headers: { 'content-type': photo.contentType, 'cache-control': 'private, no-store', 'referrer-policy': 'no-referrer', 'x-content-type-options': 'nosniff' }
	});
};
