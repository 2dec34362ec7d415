// POST /api/layout-preview: bounded exactly like a saved plan, laid out off the request thread,
// and rate limited per user.
import { afterAll, describe, expect, it } from 'vitest';
import { POST } from '../../src/routes/api/layout-preview/+server';
import { db } from '$lib/server/db';
import { closeGeometryPool } from '$lib/server/geometry-pool';
import { REQUEST_LIMITS } from '$lib/server/rate-limit';
import type { SessionUser } from '$lib/server/auth';
import { makeUser } from './helpers';

afterAll(closeGeometryPool);

const a: [number, number] = [-93.9, 44.1];
const square = { type: 'Polygon', coordinates: [[[-93.9, 44.1], [-93.89, 44.1], [-93.89, 44.107], [-93.9, 44.107], [-93.9, 44.1]]] };
const oneLane = [{ kind: 'crop', crop: 'corn', widthFt: 20 }];

function preview(user: SessionUser | null, body: unknown) {
	const url = new URL('http://127.0.0.1/api/layout-preview');
	const request = new Request(url, { method: 'POST', headers: { 'content-type': 'application/json' }, body: typeof body === 'string' ? body : JSON.stringify(body) });
	// eslint-disable-next-line @typescript-eslint/no-explicit-any
	return POST({ locals: { user, session: null }, url, request } as any);
}

describe('POST /api/layout-preview', () => {
	it('answers the 1e300-ft offset (once a request that never returned) with 400 naming offsetFt', async () => {
		const user = await makeUser('preview');
		const res = await preview(user, { boundary: square, guidance: { a, b: [a[0], a[1] + 0.007] }, pattern: oneLane, offsetFt: 1e300, headlandFt: 500 });
		expect(res.status).toBe(400);
		const body = await res.json();
		expect(body.error.code).toBe('invalid');
		expect(body.error.fields.offsetFt).toEqual(['Too big: expected number to be <=100000']);
	}, 10_000);

	it('bounds every number as a plan save does: headland, lane width, rows, A-B points', async () => {
		const user = await makeUser('preview');
		const res = await preview(user, {
			boundary: square,
			guidance: { a: [200, 44], b: [a[0], a[1] + 0.007] },
			pattern: [{ kind: 'crop', crop: 'corn', widthFt: 0.01 }, { kind: 'crop', crop: 'soy', rows: 1000, rowSpacingIn: 30 }],
			headlandFt: 501
		});
		expect(res.status).toBe(400);
		const fields = (await res.json()).error.fields;
		expect(Object.keys(fields).sort()).toEqual(['guidance.a', 'headlandFt', 'pattern.0.widthFt', 'pattern.1.rows']);
		expect(fields.headlandFt).toEqual(['Headland over 500 ft leaves little field.']);
		expect(fields['pattern.0.widthFt']).toEqual(['A lane must be at least 0.5 ft wide.']);
	});

	it('lays out a good request in the worker pool', async () => {
		const user = await makeUser('preview');
		const res = await preview(user, { boundary: square, guidance: { a, b: [a[0], a[1] + 0.007] }, pattern: oneLane, offsetFt: 10 });
		expect(res.status).toBe(200);
		const layout = await res.json();
		// 0.01° of longitude at 44.1° N is about 2,627 ft (radius of the parallel on the WGS84 ellipsoid, NIMA TR8350.2, 2000; from memory):
		// a 10-ft part lane left of the first 20-ft edge at 10 ft, 130 whole lanes, a ~17-ft part lane.
		expect(layout.lanes).toHaveLength(132);
		expect(layout.lanes[0].offsetFt).toBe(-10);
	}, 60_000);

	it('refuses a pattern that would cut too many lanes with 400 on pattern', async () => {
		const user = await makeUser('preview');
		// 0.5 ft is the narrowest lane a plan allows; 2,627 ft ÷ 0.5 ft is ~5,254 lanes, but the
		// 6,000-corner oval makes that too much work to cut.
		const ring: [number, number][] = [];
		for (let i = 0; i < 6_000; i++) ring.push([-93.895 + 0.005 * Math.cos((2 * Math.PI * i) / 6_000), 44.1035 + 0.0035 * Math.sin((2 * Math.PI * i) / 6_000)]);
		ring.push(ring[0]);
		const res = await preview(user, { boundary: { type: 'Polygon', coordinates: [ring] }, guidance: { a, b: [a[0], a[1] + 0.007] }, pattern: [{ kind: 'buffer', crop: 'grass', widthFt: 0.5 }] });
		expect(res.status).toBe(400);
		const body = await res.json();
		expect(body.error.code).toBe('invalid');
		expect(Object.keys(body.error.fields)).toEqual(['pattern']);
		expect(body.error.fields.pattern[0]).toMatch(/^The field's outline has 6,001 corners and this pattern cuts it into about 5,2\d\d lanes: too much to lay out at once\./);
	}, 60_000);

	it('refuses an outline across the 180th meridian with 400 on boundary', async () => {
		const user = await makeUser('preview');
		const across = { type: 'Polygon', coordinates: [[[179.998, -17.01], [-179.998, -17.01], [-179.998, -17], [179.998, -17], [179.998, -17.01]]] };
		const res = await preview(user, { boundary: across, guidance: { a: [179.999, -17.01], b: [179.999, -17] }, pattern: oneLane });
		expect(res.status).toBe(400);
		const body = await res.json();
		expect(body.error.fields.boundary).toEqual(['The field boundary crosses the 180th meridian (the date line) near latitude -17.0100; a field must lie on one side of it. Split it there into two fields.']);
	}, 60_000);

	it(`allows ${REQUEST_LIMITS['layout-preview'].perWindow} previews a minute per user, then 429 with Retry-After`, async () => {
		const user = await makeUser('preview');
		const other = await makeUser('preview');
		const limit = REQUEST_LIMITS['layout-preview'].perWindow;
		// Bad bodies still count: they are refused fast, which keeps this test short.
		const statuses = [];
		for (let i = 0; i < limit; i++) statuses.push((await preview(user, '{')).status);
		expect(new Set(statuses)).toEqual(new Set([400]));
		const res = await preview(user, '{');
		expect(res.status).toBe(429);
		const retry = Number(res.headers.get('retry-after'));
		expect(retry).toBeGreaterThanOrEqual(1);
		expect(retry).toBeLessThanOrEqual(60);
		const body = await res.json();
		expect(body.error.code).toBe('too_many_requests');
		expect(body.error.message).toBe(`Too many layout previews: at most ${limit} a minute. Wait ${retry} second${retry === 1 ? '' : 's'} and try again.`);
		// Another user is not held back.
		expect((await preview(other, '{')).status).toBe(400);
		// A window that has passed starts again.
		await db()('request_counts').where({ bucket: 'layout-preview', key: user.id }).update({ window_start: new Date(Date.now() - 61_000) });
		expect((await preview(user, '{')).status).toBe(400);
	}, 30_000);

	it('asks who is calling', async () => {
		const res = await preview(null, {});
		expect(res.status).toBe(401);
	});
});
