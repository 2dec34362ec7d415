import { describe, expect, it } from 'vitest';
import type { Polygon } from 'geojson';
import { createField, updateField } from '$lib/server/fields';
import { adoptVariant, getPlan, savePlan } from '$lib/server/plans';
import { createEquipment } from '$lib/server/equipment';
import { loadSheet } from '$lib/server/sheet';
import { checkGroupsOf } from '$lib/sheet/condensed';
import { requireMember } from '$lib/server/access';
import { equipmentSchema } from '$lib/schemas/equipment';
import type { SessionUser } from '$lib/server/auth';
import { GET as planJson } from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/plans/[season]/+server';
import { GET as lanesGeojson } from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/plans/[season]/lanes.geojson/+server';
import { load as planPage } from '../../src/routes/(app)/farms/[farmId]/fields/[fieldId]/plans/[season]/+page.server';
import { fakeEvent, makeFarmWithTeam, makeUser } from './helpers';
import { rectangle } from '../fixtures/rectangle';

const corn = { kind: 'crop' as const, crop: 'corn', rows: 8, rowSpacingIn: 30 };
const soybean = { kind: 'crop' as const, crop: 'soybean', rows: 8, rowSpacingIn: 30 };

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function event(user: SessionUser, path: string, params: Record<string, string>, headers: Record<string, string> = {}): any {
	const url = new URL(`http://127.0.0.1${path}`);
	return { locals: { user, session: null }, url, request: new Request(url, { headers }), params, route: { id: path }, parent: async () => ({}), depends: () => {}, setHeaders: () => {} };
}

const decimals = (v: number) => (String(v).split('.')[1] ?? '').length;
const allPositions = (g: Polygon) => g.coordinates.flat();

async function setup() {
	const { farm, members } = await makeFarmWithTeam();
	const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
	const boundary = rectangle(650, 1320);
	const field = await createField(access, { name: 'Read speed', boundary, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
	const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
	const settings = { guidance: { a: sw, b: nw }, pattern: [corn, soybean], headlandFt: 0, variant: 'main', assignments: [], notes: null, rebase: false };
	const previous = await savePlan(access, field.id, 2025, { ...settings, offsetFt: 0, version: 0 });
	const plan = await savePlan(access, field.id, 2026, { ...settings, offsetFt: 20, version: 0 });
	const params = { farmId: farm.id, fieldId: field.id, season: '2026' };
	return { farm, members, access, field, settings, previous, plan, params, api: `/api/farms/${farm.id}/fields/${field.id}/plans/2026` };
}

describe('reading a saved plan', () => {
	it('plan JSON answers 304 to the version the client holds, 200 after a save, and still checks access first', async () => {
		const { members, access, field, settings, plan, params, api } = await setup();
		const first = await planJson(event(members.crew, api, params));
		expect(first.status).toBe(200);
		const etag = first.headers.get('etag')!;
		expect(etag).toMatch(/^W\/"plan1-[0-9a-f-]{36}-v1a-\d+"$/);
		expect(first.headers.get('cache-control')).toBe('private, no-cache');
		const body = await first.json();
		expect(body.version).toBe(1);
		expect(body.lanes[3].geometry).toEqual(plan.lanes[3].geometry); // the API keeps every stored digit

		const again = await planJson(event(members.crew, api, params, { 'if-none-match': etag }));
		expect(again.status).toBe(304);
		expect(await again.text()).toBe('');
		expect(again.headers.get('etag')).toBe(etag);

		// Holding the tag opens nothing: a viewer without this field and a stranger still get 404.
		expect((await planJson(event(members.viewer, api, params, { 'if-none-match': etag }))).status).toBe(404);
		expect((await planJson(event(await makeUser('stranger'), api, params, { 'if-none-match': etag }))).status).toBe(404);

		const assigned = await savePlan(access, field.id, 2026, { ...settings, offsetFt: 20, version: 1, assignments: [{ laneIndex: 0, variety: 'hybrid B', relativeMaturity: null, populationPerAcre: 33_000, seedLot: null, trialLabel: null, notes: null }] });
		expect(assigned.version).toBe(2);
		const changed = await planJson(event(members.crew, api, params, { 'if-none-match': etag }));
		expect(changed.status).toBe(200);
		expect(changed.headers.get('etag')).not.toBe(etag);
		const reread = await changed.json();
		expect(reread.version).toBe(2);
		expect(reread.lanes[0].assignment).toMatchObject({ variety: 'hybrid B', populationPerAcre: 33_000 });
	});

	it('lanes.geojson sends outlines to 7 decimals (within 1 cm), acres as stored, and answers 304 to its own tag', async () => {
		const { members, plan, params, api } = await setup();
		const res = await lanesGeojson(event(members.crew, `${api}/lanes.geojson`, params));
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('application/geo+json');
		const fc = await res.json();
		const lanes = fc.features.filter((f: { properties: { feature: string } }) => f.properties.feature === 'lane');
		expect(lanes).toHaveLength(plan.lanes.length);
		for (const [i, f] of lanes.entries()) {
			const sent = allPositions(f.geometry);
			const stored = allPositions(plan.lanes[i].geometry as Polygon);
			expect(sent).toHaveLength(stored.length);
			sent.forEach((p: number[], j: number) => {
				expect(Math.max(...p.map(decimals))).toBeLessThanOrEqual(7);
				// 0.5e-7° is at most 0.56 cm of latitude and less of longitude here
				expect(Math.abs(p[0] - stored[j][0])).toBeLessThanOrEqual(0.5e-7 + 1e-15);
				expect(Math.abs(p[1] - stored[j][1])).toBeLessThanOrEqual(0.5e-7 + 1e-15);
			});
		}
		expect(lanes[0].properties.acres).toBe(Math.round(plan.lanes[0].acres * 1e4) / 1e4);
		const tag = res.headers.get('etag')!;
		expect(tag).toMatch(/^W\/"lanes1-/);
		expect((await lanesGeojson(event(members.crew, `${api}/lanes.geojson`, params, { 'if-none-match': tag }))).status).toBe(304);
		expect((await lanesGeojson(event(members.viewer, `${api}/lanes.geojson`, params, { 'if-none-match': tag }))).status).toBe(404);
	});
});

describe('answers remembered per plan version', () => {
	it('a renamed field and a newly adopted variant are never answered from an older remembered body', async () => {
		const { members, access, field, settings, params, api } = await setup();
		const geoPath = `${api}/lanes.geojson`;
		const before = await lanesGeojson(event(members.crew, geoPath, params));
		expect((await before.json()).features[1].properties.field).toBe('Read speed');
		expect(before.headers.get('content-disposition')).toBe('attachment; filename="Read-speed-2026-lanes.geojson"');
		await lanesGeojson(event(members.crew, geoPath, params)); // now remembered

		await updateField(access, field.id, { name: 'Read speed east', version: field.version });
		const renamed = await lanesGeojson(event(members.crew, geoPath, params, { 'if-none-match': before.headers.get('etag')! }));
		expect(renamed.status).toBe(200);
		expect((await renamed.json()).features[1].properties.field).toBe('Read speed east');
		expect(renamed.headers.get('content-disposition')).toBe('attachment; filename="Read-speed-east-2026-lanes.geojson"');

		const main = await (await planJson(event(members.crew, api, params))).json();
		expect(main.variant).toBe('main');
		await savePlan(access, field.id, 2026, { ...settings, offsetFt: 0, variant: 'no shift', version: 0 });
		await adoptVariant(access, field.id, 2026, 'no shift');
		const adopted = await (await planJson(event(members.crew, api, params))).json();
		expect(adopted).toMatchObject({ variant: 'no shift', adopted: true, offsetFt: 0 });
		const old = await (await planJson(event(members.crew, `${api}?variant=main`, params))).json();
		expect(old).toMatchObject({ variant: 'main', adopted: false, offsetFt: 20 });
	});

	it('a missing plan or field still answers 404 in the one error shape', async () => {
		const { members, farm, field } = await setup();
		const none = await planJson(event(members.crew, `/api/farms/${farm.id}/fields/${field.id}/plans/2031`, { farmId: farm.id, fieldId: field.id, season: '2031' }));
		expect(none.status).toBe(404);
		expect((await none.json()).error.code).toBe('not_found');
		const gone = '00000000-0000-4000-8000-000000000000';
		const geo = await lanesGeojson(event(members.crew, `/api/farms/${farm.id}/fields/${gone}/plans/2026/lanes.geojson`, { farmId: farm.id, fieldId: gone, season: '2026' }));
		expect(geo.status).toBe(404);
		expect((await geo.json()).error.code).toBe('not_found');
	});
});

describe('the plan page', () => {
	it('sends each lane once, without a second copy of its assignment, and outlines to 7 decimals', async () => {
		const { members, access, field, settings, params } = await setup();
		const assignments = [{ laneIndex: 1, variety: 'hybrid D', relativeMaturity: 104, populationPerAcre: 34_000, seedLot: 'L-7', trialLabel: null, notes: null }];
		const saved = await savePlan(access, field.id, 2026, { ...settings, offsetFt: 20, version: 1, assignments });
		const data = await planPage(event(members.crew, `/farms/${params.farmId}/fields/${field.id}/plans/2026`, params));
		if (!data?.plan) throw new Error('the page loaded no plan');
		expect(data.plan.lanes).toHaveLength(saved.lanes.length);
		for (const lane of data.plan.lanes) {
			expect(lane).not.toHaveProperty('assignment');
			for (const p of allPositions(lane.geometry as Polygon)) expect(Math.max(...p.map(decimals))).toBeLessThanOrEqual(7);
		}
		expect(data.plan.lanes[1]).toMatchObject({ index: 1, crop: saved.lanes[1].crop, acres: saved.lanes[1].acres, widthFt: saved.lanes[1].widthFt });
		expect(data.plan.assignments).toEqual([{ ...assignments[0] }]);
		// The lanes part of the page is at least a fifth lighter than the plan's lanes as stored.
		expect(JSON.stringify(data.plan.lanes).length).toBeLessThan(JSON.stringify(saved.lanes).length * 0.8);
	});

	it('draws a plan on the outline it was laid out on, and a new season on the field\'s current one', async () => {
		const { members, access, field, params } = await setup();
		const wider = rectangle(700, 1320);
		const moved = await updateField(access, field.id, { boundary: wider, reason: 'fence moved', version: field.version });
		expect(moved.boundaryVersion).toBe(2);
		const base = `/farms/${params.farmId}/fields/${field.id}/plans`;
		const old = await planPage(event(members.crew, `${base}/2026`, params));
		expect(old?.outline).toEqual({ version: 1, boundary: field.boundary, exclusions: [] });
		const fresh = await planPage(event(members.crew, `${base}/2028`, { ...params, season: '2028' }));
		expect(fresh?.plan).toBeNull();
		expect(fresh?.outline).toEqual({ version: 2, boundary: wider, exclusions: [] });
	});

	it('shows the rotation from the current previous season and checks against the current planter', async () => {
		const { members, access, field, settings, previous, params } = await setup();
		const path = `/farms/${params.farmId}/fields/${field.id}/plans/2026`;
		const first = await planPage(event(members.crew, path, params));
		if (!first?.rotation) throw new Error('no rotation from 2025');
		const acresFrom = (rows: { from: string; to: string; acres: number }[], from: string, to: string) => rows.filter((r) => r.from === from && r.to === to).reduce((s, r) => s + r.acres, 0);
		// A one-lane shift swaps the crops on every lane but the edge ones.
		expect(acresFrom(first.rotation.rotation, 'corn', 'soybean')).toBeGreaterThan(5);
		expect(acresFrom(first.rotation.rotation, 'corn', 'corn')).toBeLessThan(1);
		expect(first.planterChecks?.planter).toBeNull();

		// 2025 becomes all corn: the same 2026 version now follows corn everywhere.
		await savePlan(access, field.id, 2025, { ...settings, pattern: [corn], offsetFt: 0, version: previous.version });
		const planter = equipmentSchema.parse({
			name: 'Sixteen-row test planter',
			kind: 'planter',
			// Nitrogen plumbed to every unit, soybean units 9–16 included: a stop on every pass.
			planter: {
				rowSpacingIn: 30,
				rowUnits: Array.from({ length: 16 }, (_, i) => ({ unit: i + 1, seed: { crop: i < 8 ? 'corn' : 'soybean', variety: null }, fertilizerOn: ['n'] })),
				fertilizerLines: [{ id: 'n', name: 'Nitrogen', product: 'UAN 32 %', forCrops: ['corn'], gallonsPerAcre: 15, poundsPerGallon: 11.06, percentN: 32 }]
			}
		});
		await createEquipment(access, planter);
		const second = await planPage(event(members.crew, path, params));
		if (!second?.rotation) throw new Error('no rotation from 2025');
		expect(second.plan?.version).toBe(first.plan?.version);
		expect(acresFrom(second.rotation.rotation, 'corn', 'soybean')).toBeCloseTo((await getPlan(access, field.id, 2026)).byCrop.soybean.acres, 1);
		expect(acresFrom(second.rotation.rotation, 'soybean', 'corn')).toBe(0);
		expect(second.planterChecks?.planter).toBe('Sixteen-row test planter');
		// The page carries the first five stops and the other checks, each kind said once as the sheet
		// prints them, without their findings one by one: the sheet's appendix has the full lists.
		const sheet = await loadSheet(access, field.id, 2026);
		const groups = checkGroupsOf(sheet);
		const stops = groups.filter((c) => c.severity === 'stop').map((c) => c.summary);
		expect(stops.length).toBeGreaterThan(0);
		const warnings = groups.filter((c) => c.severity === 'warn').map((c) => ({ ...c, details: [] }));
		expect(warnings.length).toBeGreaterThan(0);
		expect(second.planterChecks).toEqual({ planter: 'Sixteen-row test planter', stopCount: stops.length, firstStops: stops.slice(0, 5), warningCount: warnings.length, warnings });
		// Nitrogen left on at every soybean unit: one STOP line naming the units, not one per pass.
		expect(stops.some((m) => /Nitrogen is on at row units 9–16 over \d+ soybean lanes/.test(m) || /Nitrogen is on at row units 9–16 over lane \d+ \(soybean\)/.test(m))).toBe(true);
	});
});
