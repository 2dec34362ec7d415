import { expect, test, type APIRequestContext } from '@playwright/test';
import { readFileSync } from 'node:fs';
import { CORN_8, PASTURE_10, SOYBEAN_8, eightyAcres, ownFarm, ownField, ownPlan } from './own-farm';
import { DEMO_FARM_ID, DEMO_PASSWORD, demoEmail, apiSignUp } from './helpers';

const NORTH80 = '5a1e0000-0000-4000-8000-0000000001f1';
const CREEK = '5a1e0000-0000-4000-8000-0000000001f2';
const fields = `/api/farms/${DEMO_FARM_ID}/fields`;

async function as(playwright: { request: typeof import("@playwright/test").request }, baseURL: string, role: string): Promise<APIRequestContext> {
	const ctx = await playwright.request.newContext({ baseURL });
	const res = await ctx.post('/api/session', { data: { email: demoEmail(role), password: DEMO_PASSWORD } });
	expect(res.status()).toBe(200);
	return ctx;
}

const square = (lng: number, lat: number, d = 0.003) => ({ type: 'Polygon', coordinates: [[[lng, lat], [lng + d, lat], [lng + d, lat + d], [lng, lat + d], [lng, lat]]] });

test.describe('fields API by role', () => {
	test('everyone reads; viewers only their granted field', async ({ playwright, baseURL }) => {
		for (const role of ['owner', 'manager', 'crew', 'advisor']) {
			const ctx = await as(playwright, baseURL!, role);
			const list = await (await ctx.get(fields)).json();
			expect(list.map((f: { name: string }) => f.name).sort()).toEqual(['Creek Bend', 'North 80', 'Shelter Lanes']);
			await ctx.dispose();
		}
		const viewer = await as(playwright, baseURL!, 'viewer');
		expect((await (await viewer.get(fields)).json()).map((f: { name: string }) => f.name)).toEqual(['Creek Bend']);
		expect((await viewer.get(`${fields}/${NORTH80}`)).status()).toBe(404);
		expect((await viewer.get(`${fields}/${CREEK}`)).status()).toBe(200);
		await viewer.dispose();
	});

	test('only owners and managers create, edit and delete', async ({ playwright, baseURL }) => {
		for (const role of ['crew', 'advisor', 'viewer']) {
			const ctx = await as(playwright, baseURL!, role);
			const res = await ctx.post(fields, { data: { name: `Try ${role}`, boundary: square(-94.3, 43.8) } });
			expect(res.status(), role).toBe(403);
			expect((await res.json()).error.code).toBe('forbidden');
			expect((await ctx.patch(`${fields}/${CREEK}`, { data: { name: 'x' } })).status(), role).toBe(403);
			expect((await ctx.delete(`${fields}/${CREEK}`)).status()).toBe(403);
			await ctx.dispose();
		}
		const manager = await as(playwright, baseURL!, 'manager');
		const created = await manager.post(fields, { data: { name: 'API field', boundary: square(-94.3, 43.8) } });
		expect(created.status()).toBe(201);
		const body = await created.json();
		// 0.003° square at 43.8 N: about 333 m × 241 m ≈ 19.9 ac (checked to the ellipsoid in unit tests).
		expect(body.acres).toBeGreaterThan(19);
		expect(body.acres).toBeLessThan(21);
		const patched = await manager.patch(`${fields}/${body.id}`, { data: { boundary: square(-94.3, 43.8, 0.004), version: body.version } });
		expect(patched.status()).toBe(200);
		expect((await patched.json()).boundaryVersion).toBe(2);
		const stale = await manager.patch(`${fields}/${body.id}`, { data: { name: 'late', version: body.version } });
		expect(stale.status()).toBe(409);
		expect((await stale.json()).error.code).toBe('version_conflict');
		expect((await manager.delete(`${fields}/${body.id}`)).status()).toBe(204);
		expect((await manager.get(`${fields}/${body.id}`)).status()).toBe(404);
		await manager.dispose();
	});

	test('bad boundaries get clear 400s and nothing is stored', async ({ playwright, baseURL }) => {
		const owner = await as(playwright, baseURL!, 'owner');
		const before = (await (await owner.get(fields)).json()).length;
		const open = await owner.post(fields, { data: { name: 'Open', boundary: { type: 'Polygon', coordinates: [[[-94.3, 43.8], [-94.29, 43.8], [-94.29, 43.81], [-94.3, 43.81]]] } } });
		expect(open.status()).toBe(400);
		expect((await open.json()).error.fields.boundary[0]).toMatch(/is not closed: its last point must repeat the first/);
		const projected = await owner.post(fields, { data: { name: 'Projected', boundary: { type: 'Polygon', coordinates: [[[452310, 4875320], [452410, 4875320], [452410, 4875420], [452310, 4875320]]] } } });
		expect(projected.status()).toBe(400);
		expect((await projected.json()).error.message).toMatch(/outside the Earth's ranges/);
		const noName = await owner.post(fields, { data: { name: '', boundary: square(-94.3, 43.8) } });
		expect((await noName.json()).error.fields).toEqual({ name: ['Give the field a name.'] });
		expect((await (await owner.get(fields)).json()).length).toBe(before);
		await owner.dispose();
	});

	test('another farm answers 404, never its data', async ({ playwright, baseURL }) => {
		const stranger = await playwright.request.newContext({ baseURL });
		const email = `stranger-${Date.now()}@example.test`;
		await apiSignUp(stranger, baseURL!, 'Stranger', email, 'stranger password');
		expect((await stranger.get(fields)).status()).toBe(404);
		expect((await stranger.get(`${fields}/${NORTH80}`)).status()).toBe(404);
		expect((await stranger.get(`${fields}/${NORTH80}/plans/2027`)).status()).toBe(404);
		await stranger.dispose();
	});
});

test.describe('field import API', () => {
	// Multipart bodies are form posts: like the pages, the API accepts them only with our own Origin.
	test('answers with the shapes and stores nothing; refuses what is not a boundary file', async ({ playwright, baseURL }) => {
		const owner = await as(playwright, baseURL!, 'owner');
		const before = (await (await owner.get(fields)).json()).length;
		const kml = await owner.post(`${fields}/import`, { headers: { origin: baseURL! }, multipart: { file: { name: 'two-fields.kml', mimeType: 'application/vnd.google-earth.kml+xml', buffer: readFileSync('tests/fixtures/import/two-fields.kml') } } });
		expect(kml.status()).toBe(200);
		const fc = await kml.json();
		expect(fc.type).toBe('FeatureCollection');
		expect(fc.features).toHaveLength(2);
		expect(fc.features.every((f: { properties: { acres: number } }) => f.properties.acres > 0)).toBe(true);
		expect((await (await owner.get(fields)).json()).length).toBe(before);

		const png = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0]);
		const fake = await owner.post(`${fields}/import`, { headers: { origin: baseURL! }, multipart: { file: { name: 'field.kml', mimeType: 'application/octet-stream', buffer: png } } });
		expect(fake.status()).toBe(400);
		expect((await fake.json()).error.message).toMatch(/not a KML file/);

		const points = await owner.post(`${fields}/import`, { headers: { origin: baseURL! }, multipart: { file: { name: 'points-only.kml', mimeType: 'application/xml', buffer: readFileSync('tests/fixtures/import/points-only.kml') } } });
		expect(points.status()).toBe(400);
		expect((await points.json()).error.message).toMatch(/has no polygons/);

		const big = await owner.post(`${fields}/import`, { headers: { origin: baseURL! }, multipart: { file: { name: 'big.geojson', mimeType: 'application/json', buffer: Buffer.alloc(10 * 1024 * 1024 + 10, 32) } } });
		expect(big.status()).toBe(413);
		expect((await big.json()).error.message).toMatch(/uploads are limited to 10\.0 MB/);
		await owner.dispose();

		const crew = await as(playwright, baseURL!, 'crew');
		expect((await crew.post(`${fields}/import`, { headers: { origin: baseURL! }, multipart: { file: { name: 'two-fields.kml', mimeType: 'application/xml', buffer: readFileSync('tests/fixtures/import/two-fields.kml') } } })).status()).toBe(403);
		await crew.dispose();
	});
});

test.describe('plans API', () => {
	const plan = (field: string, season: number) => `${fields}/${field}/plans/${season}`;

	test('reads the adopted plan; a missing season is 404; viewers only on granted fields', async ({ playwright, baseURL }) => {
		const viewer = await as(playwright, baseURL!, 'viewer');
		const res = await viewer.get(plan(CREEK, 2026));
		expect(res.status()).toBe(200);
		const body = await res.json();
		expect(body).toMatchObject({ season: 2026, adopted: true, variant: 'main' });
		expect(body.lanes.length).toBeGreaterThan(10);
		expect((await viewer.get(plan(NORTH80, 2026))).status()).toBe(404);
		expect((await viewer.get(plan(CREEK, 1999))).status()).toBe(404);
		expect((await viewer.put(plan(CREEK, 2026), { data: { ...body, version: body.version } })).status()).toBe(403);
		await viewer.dispose();
	});

	test('PUT with optimistic concurrency; bad layouts get field errors; next season with the rotation', async ({ page }) => {
		// A farm of its own: this test writes plans, and the demo stays as seeded.
		const own = await ownFarm(page, 'plans-api');
		const owner = page.request;
		const { boundary, guidance } = eightyAcres(-94.37, 43.74);
		const shelter = await ownField(owner, own.farmId, 'Lanes beside pasture', boundary);
		await ownPlan(owner, own.farmId, shelter, 2027, { guidance, pattern: [CORN_8, PASTURE_10, SOYBEAN_8, PASTURE_10], offsetFt: 0, headlandFt: 30 });
		const plan = (_field: string, season: number) => `/api/farms/${own.farmId}/fields/${shelter}/plans/${season}`;
		const current = await (await owner.get(plan(shelter, 2027))).json();
		const settings = { guidance: current.guidance, pattern: current.pattern, offsetFt: current.offsetFt, headlandFt: 40, assignments: current.assignments };
		const saved = await owner.put(plan(shelter, 2027), { data: { ...settings, version: current.version } });
		expect(saved.status()).toBe(200);
		expect((await saved.json()).version).toBe(current.version + 1);
		const stale = await owner.put(plan(shelter, 2027), { data: { ...settings, headlandFt: 10, version: current.version } });
		expect(stale.status()).toBe(409);
		expect((await (await owner.get(plan(shelter, 2027))).json()).headlandFt).toBe(40);

		const bad = await owner.put(plan(shelter, 2027), { data: { ...settings, pattern: [], version: current.version + 1 } });
		expect(bad.status()).toBe(400);
		expect((await bad.json()).error.fields.pattern).toEqual(['The pattern needs at least one lane.']);

		const next = await owner.post(`${plan(shelter, 2027)}/next`, { data: { shift: 'default' } });
		expect(next.status()).toBe(201);
		const n = await next.json();
		expect(n.plan.season).toBe(2028);
		const pairs = Object.fromEntries(n.rotation.map((r: { from: string; to: string; acres: number }) => [`${r.from}>${r.to}`, r.acres]));
		// Default shift is one lane (20 ft): corn lanes move onto the pasture beside them and on to soybean.
		expect(Object.keys(pairs).length).toBeGreaterThan(1);
		expect((await owner.post(`${plan(shelter, 2027)}/next`, { data: {} })).status()).toBe(409);
	});

	test('crew may not plan the next season', async ({ playwright, baseURL }) => {
		// Refused before anything is read or written, so the demo field is safe to aim at.
		const crew = await as(playwright, baseURL!, 'crew');
		const res = await crew.post(`${fields}/5a1e0000-0000-4000-8000-0000000001f3/plans/2027/next`, { data: {} });
		expect(res.status()).toBe(403);
		expect((await res.json()).error.code).toBe('forbidden');
		await crew.dispose();
	});

	test('exports lanes as GeoJSON', async ({ playwright, baseURL }) => {
		const crew = await as(playwright, baseURL!, 'crew');
		const res = await crew.get(`${plan(NORTH80, 2026)}/lanes.geojson`);
		expect(res.status()).toBe(200);
		expect(res.headers()['content-type']).toBe('application/geo+json');
		const fc = await res.json();
		expect(fc.features[0].properties.feature).toBe('ab-line');
		const lanes = fc.features.slice(1);
		expect(lanes.length).toBe(63);
		expect(lanes[0].properties).toMatchObject({ lane: 1, widthFt: 20, rows: 8 });
		await crew.dispose();
	});

	test('layout preview needs a session and explains bad input', async ({ playwright, baseURL }) => {
		const anon = await playwright.request.newContext({ baseURL });
		const input = { boundary: square(-94.3, 43.8), guidance: { a: [-94.3, 43.8], b: [-94.3, 43.803] }, pattern: [{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }] };
		expect((await anon.post('/api/layout-preview', { data: input })).status()).toBe(401);
		await anon.dispose();
		const advisor = await as(playwright, baseURL!, 'advisor');
		const ok = await advisor.post('/api/layout-preview', { data: input });
		expect(ok.status()).toBe(200);
		const layout = await ok.json();
		expect(layout.lanes.length).toBeGreaterThan(30);
		const same = await advisor.post('/api/layout-preview', { data: { ...input, guidance: { a: [-94.3, 43.8], b: [-94.3, 43.8] } } });
		expect(same.status()).toBe(400);
		expect((await same.json()).error.fields.guidance[0]).toMatch(/A-B line/);
		await advisor.dispose();
	});
});
