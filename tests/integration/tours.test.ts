// Visitor tours: created by owners and managers through the JSON API, opened by anyone holding the
// link until it expires or is revoked; nobody else and nothing else.
import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import type { SessionUser } from '$lib/server/auth';
import sharp from 'sharp';
import { hashToken, visitorPhoto, visitorTour } from '$lib/server/tours';
import { POST as photoRoute } from '../../src/routes/api/farms/[farmId]/tours/[tourId]/stops/[stop]/photos/+server';
import { GET as sharePhotoRoute } from '../../src/routes/share/[token]/photos/[photo]/+server';
import { GET as listRoute, POST as createRoute } from '../../src/routes/api/farms/[farmId]/tours/+server';
import { DELETE as revokeRoute } from '../../src/routes/api/farms/[farmId]/tours/[tourId]/+server';
import { GET as acreageRoute } from '../../src/routes/api/farms/[farmId]/reports/acreage/+server';
import { load as shareLoad } from '../../src/routes/share/[token]/+page.server';
import { load as printLoad } from '../../src/routes/share/[token]/print/+page.server';
import { makeFarmWithTeam, makeUser } from './helpers';
import { reportFarm, routeEvent } from './report-setup';

const future = () => new Date(Date.now() + 7 * 86_400_000).toISOString();

function tourBody(fieldIds: string[], over: Record<string, unknown> = {}) {
	return {
		title: 'Summer strip walk',
		date: '2027-07-15',
		expiresAt: future(),
		fieldIds,
		stops: [
			{ lng: -94.299, lat: 43.912, title: 'Twin rows on 60 in', note: 'Cover mix seeded between the twins in June.' },
			{ lng: -94.289, lat: 43.917, title: 'Corn beside soybean', note: '' },
			{ lng: -94.288, lat: 43.918, title: 'Border rows', note: 'Compare the outside rows with the middle.' }
		],
		...over
	};
}

const create = (user: SessionUser | null, farmId: string, body: unknown) => createRoute(routeEvent(user, `/api/farms/${farmId}/tours`, { farmId }, 'POST', body));
const revoke = (user: SessionUser | null, farmId: string, tourId: string) => revokeRoute(routeEvent(user, `/api/farms/${farmId}/tours/${tourId}`, { farmId, tourId }, 'DELETE'));

/** Runs the visitor page's load as an anonymous request; answers the status it ends with. */
async function openShare(token: string, loader: typeof shareLoad | typeof printLoad = shareLoad) {
	const url = new URL(`http://127.0.0.1/share/${token}`);
	try {
		// eslint-disable-next-line @typescript-eslint/no-explicit-any
		const data = await (loader as any)({ params: { token }, url, setHeaders: () => undefined, locals: { user: null, session: null } });
		return { status: 200, data };
	} catch (e) {
		return { status: (e as { status: number }).status, data: (e as { body: unknown }).body };
	}
}

const tokenOf = (url: string) => new URL(url).pathname.split('/').pop()!;

describe('POST /api/farms/:farmId/tours', () => {
	it('creates a tour: 201 {id, url}; the link opens the fields, lanes and stops in order', async () => {
		const s = await reportFarm();
		const res = await create(s.members.manager, s.farm.id, tourBody([s.wide.id]));
		expect(res.status).toBe(201);
		const body = await res.json();
		expect(Object.keys(body).sort()).toEqual(['id', 'url']);
		expect(body.url).toMatch(/^http:\/\/127\.0\.0\.1\/share\/[A-Za-z0-9_-]{43}$/);
		const stored = await db()('tours').where({ id: body.id }).first();
		// Only the hash is kept.
		expect(stored.token_hash).toBe(hashToken(tokenOf(body.url)));
		expect(JSON.stringify(stored)).not.toContain(tokenOf(body.url));

		const shared = await openShare(tokenOf(body.url));
		expect(shared.status).toBe(200);
		const tour = shared.data.tour;
		expect([tour.title, tour.date, tour.season]).toEqual(['Summer strip walk', '2027-07-15', 2027]);
		expect(tour.fields.map((f: { name: string }) => f.name)).toEqual(['Wide rows']);
		expect(tour.fields[0].lanes.map((l: { index: number; crop: string }) => [l.index, l.crop])).toEqual(s.widePlan.lanes.map((l) => [l.index, l.crop]));
		expect(tour.stops.map((x: { number: number; title: string }) => [x.number, x.title])).toEqual([
			[1, 'Twin rows on 60 in'],
			[2, 'Corn beside soybean'],
			[3, 'Border rows']
		]);
		// Nothing about people, records or other fields reaches the visitor.
		const text = JSON.stringify(shared.data);
		for (const secret of [s.strips.id, s.strips.name, s.members.owner.email, s.members.owner.name, '4410', 'Landlord one', s.farm.id]) expect(text).not.toContain(secret);
	});

	it('prints a QR code per stop as a data URL pointing at that stop', async () => {
		const s = await reportFarm();
		const body = await (await create(s.members.owner, s.farm.id, tourBody([s.wide.id, s.strips.id]))).json();
		const printed = await openShare(tokenOf(body.url), printLoad);
		expect(printed.status).toBe(200);
		expect(printed.data.stops.map((x: { link: string }) => x.link)).toEqual([1, 2, 3].map((n) => `${body.url}#stop-${n}`));
		for (const stop of printed.data.stops) expect(stop.qr).toMatch(/^data:image\/png;base64,[A-Za-z0-9+/=]{200,}$/);
		expect(printed.data.fieldNames).toEqual(['Strips', 'Wide rows']);
	});

	it('refuses bad input with 400 and stores nothing', async () => {
		const s = await reportFarm();
		const other = await makeFarmWithTeam();
		const count = async () => Number((await db()('tours').where({ farm_id: s.farm.id }).count({ n: '*' }))[0].n);
		const before = await count();
		const cases: [unknown, string, string][] = [
			[tourBody([s.wide.id], { expiresAt: new Date(Date.now() - 60_000).toISOString() }), 'expiresAt', 'Choose a time in the future.'],
			[tourBody([s.wide.id], { stops: [] }), 'stops', 'A tour needs at least one stop.'],
			[tourBody([]), 'fieldIds', 'Choose at least one field.'],
			[tourBody([s.wide.id], { date: '2027-02-30' }), 'date', 'That date does not exist.'],
			[tourBody([s.wide.id], { expiresAt: '2027-07-16 18:00' }), 'expiresAt', 'Give when the link stops working, as an ISO 8601 time with an offset (e.g. 2027-07-16T18:00:00-05:00).'],
			[tourBody([s.wide.id], { stops: [{ lng: -200, lat: 43.9, title: 'x', note: '' }] }), 'stops.0.lng', 'Longitude is between -180 and 180.'],
			[tourBody([s.wide.id], { stops: [{ lng: -94, lat: 43.9, title: '  ', note: '' }] }), 'stops.0.title', 'Give the stop a title.']
		];
		for (const [body, field, message] of cases) {
			const res = await create(s.members.owner, s.farm.id, body);
			expect(res.status, field).toBe(400);
			expect((await res.json()).error.fields[field]).toEqual([message]);
		}
		// Another farm's field: refused without saying whose it is.
		const foreign = await create(s.members.owner, s.farm.id, tourBody([s.wide.id, other.farm.id]));
		expect(foreign.status).toBe(400);
		expect((await foreign.json()).error).toEqual({ code: 'invalid', message: 'One or more of the chosen fields are not fields of this farm.', fields: { fieldIds: ['Choose fields of this farm.'] } });
		expect((await create(s.members.owner, s.farm.id, '{"title":')).status).toBe(400);
		expect(await count()).toBe(before);
	});

	it('lets only owners and managers create, list and revoke; other farms answer 404', async () => {
		const s = await reportFarm();
		for (const role of ['crew', 'advisor', 'viewer'] as const) {
			expect((await create(s.members[role], s.farm.id, tourBody([s.wide.id]))).status, role).toBe(403);
			expect((await listRoute(routeEvent(s.members[role], `/api/farms/${s.farm.id}/tours`, { farmId: s.farm.id }))).status, role).toBe(403);
		}
		expect((await create(null, s.farm.id, tourBody([s.wide.id]))).status).toBe(401);
		const stranger = await makeUser('stranger');
		expect((await create(stranger, s.farm.id, tourBody([s.wide.id]))).status).toBe(404);
		const body = await (await create(s.members.owner, s.farm.id, tourBody([s.wide.id]))).json();
		expect((await revoke(s.members.crew, s.farm.id, body.id)).status).toBe(403);
		const other = await makeFarmWithTeam();
		expect((await revoke(other.members.owner, other.farm.id, body.id)).status).toBe(404);
		expect((await revoke(other.members.owner, s.farm.id, body.id)).status).toBe(404);
		expect((await openShare(tokenOf(body.url))).status).toBe(200);
		const list = await (await listRoute(routeEvent(s.members.manager, `/api/farms/${s.farm.id}/tours`, { farmId: s.farm.id }))).json();
		expect(list.map((t: { id: string; status: string; stops: number }) => [t.id, t.status, t.stops])).toEqual([[body.id, 'active', 3]]);
		expect(JSON.stringify(list)).not.toContain(tokenOf(body.url));
	});
});

describe('share links', () => {
	it('revoked → 404; revoking twice is harmless', async () => {
		const s = await reportFarm();
		const body = await (await create(s.members.owner, s.farm.id, tourBody([s.wide.id]))).json();
		const res = await revoke(s.members.manager, s.farm.id, body.id);
		expect(res.status).toBe(200);
		expect((await res.json()).id).toBe(body.id);
		expect(await openShare(tokenOf(body.url))).toEqual({
			status: 404,
			data: { message: 'This tour link does not work: it was mistyped, has expired, or the farm has withdrawn it.', code: 'not_found' }
		});
		expect((await openShare(tokenOf(body.url), printLoad)).status).toBe(404);
		expect((await revoke(s.members.owner, s.farm.id, body.id)).status).toBe(200);
		expect(await db()('audit_log').where({ entity: 'tour', entity_id: body.id }).orderBy('id').pluck('action')).toEqual(['create', 'revoke']);
	});

	it('expired → 404, wrong or malformed token → 404', async () => {
		const s = await reportFarm();
		const body = await (await create(s.members.owner, s.farm.id, tourBody([s.wide.id]))).json();
		const token = tokenOf(body.url);
		expect(await visitorTour(token, new Date(Date.now() + 8 * 86_400_000))).toBeNull();
		await db()('tours').where({ id: body.id }).update({ expires_at: new Date(Date.now() - 1000) });
		expect((await openShare(token)).status).toBe(404);
		const wrong = token.slice(0, -1) + (token.endsWith('A') ? 'B' : 'A');
		expect((await openShare(wrong)).status).toBe(404);
		expect((await openShare('short')).status).toBe(404);
		expect((await openShare(`${token}x`)).status).toBe(404);
	});

	it('a deleted field drops out of the tour; a visitor reaches no API route with the link', async () => {
		const s = await reportFarm();
		const body = await (await create(s.members.owner, s.farm.id, tourBody([s.wide.id, s.strips.id]))).json();
		await db()('fields').where({ id: s.strips.id }).update({ deleted_at: new Date() });
		const shared = await openShare(tokenOf(body.url));
		expect(shared.data.tour.fields.map((f: { name: string }) => f.name)).toEqual(['Wide rows']);
		// The link is no session: the farm's API stays closed to its holder.
		expect((await acreageRoute(routeEvent(null, `/api/farms/${s.farm.id}/reports/acreage?season=2027`, { farmId: s.farm.id }))).status).toBe(401);
		expect((await listRoute(routeEvent(null, `/api/farms/${s.farm.id}/tours`, { farmId: s.farm.id }))).status).toBe(401);
	});
});

describe('stop photos', () => {
	async function upload(user: SessionUser, farmId: string, tourId: string, stop: string, bytes: Uint8Array<ArrayBuffer>, name = 'stop.png') {
		const form = new FormData();
		form.append('photo', new File([bytes], name, { type: 'image/png' }));
		const path = `/api/farms/${farmId}/tours/${tourId}/stops/${stop}/photos`;
		const event = routeEvent(user, path, { farmId, tourId, stop });
		event.request = new Request(new URL(`http://127.0.0.1${path}`), { method: 'POST', body: form });
		return photoRoute(event);
	}

	it('a manager adds a photo to a stop; the visitor sees it through the link until it is revoked', async () => {
		const s = await reportFarm();
		const body = await (await create(s.members.owner, s.farm.id, tourBody([s.wide.id]))).json();
		const token = tokenOf(body.url);
		const png = new Uint8Array(await sharp({ create: { width: 64, height: 48, channels: 3, background: '#3f7d20' } }).png().toBuffer()) as Uint8Array<ArrayBuffer>;
		const res = await upload(s.members.manager, s.farm.id, body.id, '2', png);
		expect(res.status).toBe(201);
		const [photo] = (await res.json()).photos;
		expect([photo.width, photo.height]).toEqual([64, 48]);
		const tour = (await openShare(token)).data.tour;
		expect(tour.stops.map((x: { photos: { id: string }[] }) => x.photos.map((p) => p.id))).toEqual([[], [photo.id], []]);
		const served = await visitorPhoto(token, photo.id, 'display');
		expect(served?.contentType).toBe('image/png');
		expect((await sharp(Buffer.from(served!.bytes)).metadata()).width).toBe(64);
		const route = await sharePhotoRoute(routeEvent(null, `/share/${token}/photos/${photo.id}`, { token, photo: photo.id }));
		expect([route.status, route.headers.get('content-type')]).toEqual([200, 'image/png']);
		// The photo of one tour is not reachable through another tour's link.
		const other = await (await create(s.members.owner, s.farm.id, tourBody([s.strips.id]))).json();
		expect(await visitorPhoto(tokenOf(other.url), photo.id, 'display')).toBeNull();
		await revoke(s.members.owner, s.farm.id, body.id);
		expect(await visitorPhoto(token, photo.id, 'display')).toBeNull();
		expect((await upload(s.members.owner, s.farm.id, body.id, '1', png)).status).toBe(400);
	});

	it('refuses other roles (403), other farms and missing stops (404), and files that are not pictures (400)', async () => {
		const s = await reportFarm();
		const body = await (await create(s.members.owner, s.farm.id, tourBody([s.wide.id]))).json();
		const png = new Uint8Array(await sharp({ create: { width: 8, height: 8, channels: 3, background: '#000000' } }).png().toBuffer()) as Uint8Array<ArrayBuffer>;
		expect((await upload(s.members.crew, s.farm.id, body.id, '1', png)).status).toBe(403);
		const other = await makeFarmWithTeam();
		expect((await upload(other.members.owner, other.farm.id, body.id, '1', png)).status).toBe(404);
		expect((await upload(s.members.owner, s.farm.id, body.id, '4', png)).status).toBe(404);
		expect((await upload(s.members.owner, s.farm.id, body.id, 'one', png)).status).toBe(404);
		const text = await upload(s.members.owner, s.farm.id, body.id, '1', new TextEncoder().encode('not a picture'), 'notes.png');
		expect(text.status).toBe(400);
		expect((await text.json()).error.code).toBe('not_an_image');
		expect(await db()('attachments').where({ farm_id: s.farm.id, entity: 'tour_stop' }).count({ n: '*' })).toEqual([{ n: 0 }]);
	});
});
