import { error } from '@sveltejs/kit';
import QRCode from 'qrcode';
import type { PageServerLoad } from './$types';
import { NO_TOUR, sharePath, visitorTour } from '$lib/server/tours';

// QR codes are drawn here as data: URLs, so the printed sheet needs nothing from elsewhere.
export const load: PageServerLoad = async ({ params, setHeaders, url }) => {
	setHeaders({ 'cache-control': 'no-store', 'referrer-policy': 'no-referrer', 'x-robots-tag': 'noindex, nofollow' });
	const tour = await visitorTour(params.token);
	if (!tour) error(404, { message: NO_TOUR, code: 'not_found' });
	const link = new URL(sharePath(params.token), url.origin).href;
	const stops = await Promise.all(
		tour.stops.map(async (s) => ({
			...s,
			link: `${link}#stop-${s.number}`,
			qr: await QRCode.toDataURL(`${link}#stop-${s.number}`, { errorCorrectionLevel: 'M', margin: 2, width: 220, color: { dark: '#000000', light: '#ffffff' } })
		}))
	);
	return { title: tour.title, date: tour.date, fieldNames: tour.fields.map((f) => f.name), stops };
};
