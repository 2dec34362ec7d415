import { describe, expect, it } from 'vitest';
import { createField } from '$lib/server/fields';
import { savePlan } from '$lib/server/plans';
import { requireMember } from '$lib/server/access';
import { createFarm } from '$lib/server/farms';
import { db } from '$lib/server/db';
import type { SessionUser } from '$lib/server/auth';
import { GET as seasonJson } from '../../src/routes/api/farms/[farmId]/seasons/[season]/+server';
import { GET as seasonLanes } from '../../src/routes/api/farms/[farmId]/seasons/[season]/lanes.geojson/+server';
import { GET as seasonSummaryJson } from '../../src/routes/api/farms/[farmId]/seasons/[season]/summary/+server';
import { GET as laneRecordsJson } from '../../src/routes/api/farms/[farmId]/seasons/[season]/lane-records/+server';
import { load as farmHome } from '../../src/routes/(app)/farms/[farmId]/+page.server';
import { fakeEvent, makeFarmWithTeam, makeUser, thrown } from './helpers';
import { rectangle } from '../fixtures/rectangle';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function event(user: SessionUser, path: string, params: Record<string, string>, search = ''): any {
	const url = new URL(`http://127.0.0.1${path}${search}`);
	return { locals: { user, session: null }, url, request: new Request(url), params, route: { id: path } };
}

const CORN = { kind: 'crop' as const, crop: 'corn', rows: 8, rowSpacingIn: 30 };
const SOY = { kind: 'crop' as const, crop: 'soybean', rows: 8, rowSpacingIn: 30 };
const PASTURE = { kind: 'pasture' as const, crop: 'pasture', widthFt: 30 };

async function setup() {
	const { farm, members } = await makeFarmWithTeam();
	const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
	const plan = async (fieldId: string, boundary: ReturnType<typeof rectangle>, season: number, pattern: object[], offsetFt = 0) => {
		const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
		return savePlan(access, fieldId, season, { guidance: { a: sw, b: nw }, pattern: pattern as never, offsetFt, headlandFt: 30, variant: 'main', version: 0, assignments: [], notes: null, rebase: false });
	};
	const north = rectangle(640, 1320, -94.21, 43.9);
	const south = rectangle(480, 1000, -94.21, 43.89);
	const empty = rectangle(300, 300, -94.22, 43.9);
	const a = await createField(access, { name: 'North strips', boundary: north, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
	const b = await createField(access, { name: 'South pasture', boundary: south, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
	const c = await createField(access, { name: 'Yard corner', boundary: empty, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
	const a2025 = await plan(a.id, north, 2025, [CORN, SOY]);
	const a2026 = await plan(a.id, north, 2026, [CORN, SOY], 20);
	const b2026 = await plan(b.id, south, 2026, [CORN, PASTURE]);
	return { farm, members, access, a, b, c, a2025, a2026, b2026 };
}

const base = (farmId: string, season: number | string) => `/api/farms/${farmId}/seasons/${season}`;
const params = (farmId: string, season: number | string) => ({ farmId, season: String(season) });

/** Acres and lane counts per crop straight from the stored lanes of the adopted plans. */
async function storedSums(planIds: string[]) {
	const rows = await db()('plan_lanes').whereIn('plan_id', planIds).groupBy('crop').select('crop').sum({ acres: 'acres' }).count({ lanes: '*' });
	// eslint-disable-next-line @typescript-eslint/no-explicit-any
	return Object.fromEntries((rows as any[]).map((r) => [r.crop, { acres: Number(r.acres), lanes: Number(r.lanes) }]));
}

describe('GET /api/farms/:farmId/seasons/:season', () => {
	it('lists every field with its adopted plan, and farm totals equal the sums of the stored lanes', async () => {
		const s = await setup();
		const res = await seasonJson(event(s.members.crew, base(s.farm.id, 2026), params(s.farm.id, 2026)));
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(Object.keys(body).sort()).toEqual(['fields', 'totals']);
		expect(body.fields.map((f: { name: string }) => f.name)).toEqual(['North strips', 'South pasture', 'Yard corner']);
		const [north, south, yard] = body.fields;
		expect(north).toEqual({ fieldId: s.a.id, name: 'North strips', status: 'adopted', plantedAcres: s.a2026.plantedAcres, byCrop: await storedSums([s.a2026.id]) });
		expect(south.status).toBe('adopted');
		expect(south.plantedAcres).toBe(s.b2026.plantedAcres);
		expect(Object.keys(south.byCrop).sort()).toEqual(['corn', 'pasture']);
		expect(yard).toEqual({ fieldId: s.c.id, name: 'Yard corner', status: 'no_plan', plantedAcres: 0, byCrop: {} });

		const sums = await storedSums([s.a2026.id, s.b2026.id]);
		expect(Object.keys(body.totals.byCrop).sort()).toEqual(['corn', 'pasture', 'soybean']);
		for (const crop of Object.keys(sums)) {
			expect(body.totals.byCrop[crop].lanes).toBe(sums[crop].lanes);
			expect(body.totals.byCrop[crop].acres).toBeCloseTo(sums[crop].acres, 9);
		}
		expect(body.totals.plantedAcres).toBeCloseTo(s.a2026.plantedAcres + s.b2026.plantedAcres, 9);
		// The plan's own stored totals agree with its lanes.
		expect(north.byCrop.corn.acres).toBeCloseTo(s.a2026.byCrop.corn.acres, 9);
		expect(north.byCrop.corn.lanes).toBe(s.a2026.byCrop.corn.lanes);
	});

	it('reads stored values: a lane edited in the database shows as stored, in the totals and the GeoJSON', async () => {
		const s = await setup();
		await db()('plan_lanes').where({ plan_id: s.a2026.id, lane_index: 0 }).update({ acres: 123.456789, crop: 'oats', variety: 'test oats' });
		await db()('plans').where({ id: s.a2026.id }).update({ planted_acres: 777.25 });
		const body = await (await seasonJson(event(s.members.owner, base(s.farm.id, 2026), params(s.farm.id, 2026)))).json();
		const north = body.fields.find((f: { fieldId: string }) => f.fieldId === s.a.id);
		expect(north.plantedAcres).toBe(777.25);
		expect(north.byCrop.oats).toEqual({ acres: 123.456789, lanes: 1 });
		expect(body.totals.byCrop.oats).toEqual({ acres: 123.456789, lanes: 1 });
		const geo = await (await seasonLanes(event(s.members.owner, `${base(s.farm.id, 2026)}/lanes.geojson`, params(s.farm.id, 2026)))).json();
		const lane = geo.features.find((f: { properties: { fieldId: string; laneIndex: number } }) => f.properties.fieldId === s.a.id && f.properties.laneIndex === 0);
		expect(lane.properties).toEqual({ fieldId: s.a.id, fieldName: 'North strips', laneIndex: 0, laneNumber: 1, kind: 'crop', crop: 'oats', variety: 'test oats', acres: 123.456789 });
	});

	it('a viewer sees only the fields granted; a member of another farm and a stranger get 404', async () => {
		const s = await setup();
		await db()('memberships').where({ farm_id: s.farm.id, user_id: s.members.viewer.id }).update({ field_scope: [s.b.id] });
		const body = await (await seasonJson(event(s.members.viewer, base(s.farm.id, 2026), params(s.farm.id, 2026)))).json();
		expect(body.fields.map((f: { fieldId: string }) => f.fieldId)).toEqual([s.b.id]);
		expect(body.totals.plantedAcres).toBeCloseTo(s.b2026.plantedAcres, 9);
		expect(Object.keys(body.totals.byCrop).sort()).toEqual(['corn', 'pasture']);
		const geo = await (await seasonLanes(event(s.members.viewer, `${base(s.farm.id, 2026)}/lanes.geojson`, params(s.farm.id, 2026)))).json();
		expect(geo.features.length).toBe(s.b2026.lanes.length);
		expect(new Set(geo.features.map((f: { properties: { fieldId: string } }) => f.properties.fieldId))).toEqual(new Set([s.b.id]));
		const summary = await (await seasonSummaryJson(event(s.members.viewer, `${base(s.farm.id, 2026)}/summary`, params(s.farm.id, 2026)))).json();
		expect(summary.fieldsShown).toBe(1);
		const hidden = await laneRecordsJson(event(s.members.viewer, `${base(s.farm.id, 2026)}/lane-records`, params(s.farm.id, 2026), `?fieldId=${s.a.id}&laneIndex=0`));
		expect(hidden.status).toBe(404);

		// A viewer granted nothing sees an empty farm, not an error.
		await db()('memberships').where({ farm_id: s.farm.id, user_id: s.members.viewer.id }).update({ field_scope: [] });
		const none = await (await seasonJson(event(s.members.viewer, base(s.farm.id, 2026), params(s.farm.id, 2026)))).json();
		expect(none).toEqual({ fields: [], totals: { byCrop: {}, plantedAcres: 0 } });

		const other = await makeFarmWithTeam();
		for (const handler of [seasonJson, seasonLanes, seasonSummaryJson]) {
			const res = await handler(event(other.members.owner, base(s.farm.id, 2026), params(s.farm.id, 2026)));
			expect(res.status).toBe(404);
			expect((await res.json()).error.code).toBe('not_found');
		}
		const stranger = await makeUser('stranger');
		expect((await seasonJson(event(stranger, base(s.farm.id, 2026), params(s.farm.id, 2026)))).status).toBe(404);
	});

	it('the GeoJSON holds every adopted lane of the season with 1-based lane numbers', async () => {
		const s = await setup();
		const geo = await (await seasonLanes(event(s.members.advisor, `${base(s.farm.id, 2026)}/lanes.geojson`, params(s.farm.id, 2026)))).json();
		expect(geo.type).toBe('FeatureCollection');
		expect(geo.features.length).toBe(s.a2026.lanes.length + s.b2026.lanes.length);
		const north = geo.features.filter((f: { properties: { fieldId: string } }) => f.properties.fieldId === s.a.id);
		expect(north.map((f: { properties: { laneNumber: number } }) => f.properties.laneNumber)).toEqual(s.a2026.lanes.map((l) => l.index + 1));
		expect(north[3].geometry).toEqual(s.a2026.lanes[3].geometry);
		expect(north[3].properties.acres).toBe(s.a2026.lanes[3].acres);
		expect(north[3].properties.crop).toBe(s.a2026.lanes[3].crop);
	});

	it('a season far from any plan and a farm with no fields answer empty, not an error; a year out of range is 404', async () => {
		const s = await setup();
		const old = await (await seasonJson(event(s.members.owner, base(s.farm.id, 1900), params(s.farm.id, 1900)))).json();
		expect(old.fields.map((f: { status: string }) => f.status)).toEqual(['no_plan', 'no_plan', 'no_plan']);
		expect(old.totals).toEqual({ byCrop: {}, plantedAcres: 0 });
		const far = await seasonJson(event(s.members.owner, base(s.farm.id, 3000), params(s.farm.id, 3000)));
		expect(far.status).toBe(404);
		const owner = await makeUser('lonely');
		const farm = await createFarm(owner.id, 'No fields yet');
		const bare = await (await seasonJson(event(owner, base(farm.id, 2026), params(farm.id, 2026)))).json();
		expect(bare).toEqual({ fields: [], totals: { byCrop: {}, plantedAcres: 0 } });
		const bareGeo = await (await seasonLanes(event(owner, `${base(farm.id, 2026)}/lanes.geojson`, params(farm.id, 2026)))).json();
		expect(bareGeo).toEqual({ type: 'FeatureCollection', features: [] });
	});
});

describe('season summary', () => {
	it('adds headland and excluded acres, lanes by kind, the change from last season and the rotation over fields', async () => {
		const s = await setup();
		const body = await (await seasonSummaryJson(event(s.members.owner, `${base(s.farm.id, 2026)}/summary`, params(s.farm.id, 2026)))).json();
		expect(body.fieldsPlanned).toBe(2);
		expect(body.headlandAcres).toBeCloseTo(s.a2026.headlandAcres + s.b2026.headlandAcres, 9);
		expect(body.excludedAcres).toBeCloseTo(s.a2026.excludedAcres + s.b2026.excludedAcres, 9);
		const pastureLanes = s.b2026.lanes.filter((l) => l.kind === 'pasture').length;
		expect(body.byKind.pasture.lanes).toBe(pastureLanes);
		expect(body.byKind.crop.lanes).toBe(s.a2026.lanes.length + s.b2026.lanes.length - pastureLanes);
		expect(body.byKind.cover).toEqual({ acres: 0, lanes: 0 });
		expect(body.previous).toEqual({ season: 2025, plantedAcres: s.a2025.plantedAcres, fieldsPlanned: 1 });
		const soy = body.change.find((c: { crop: string }) => c.crop === 'pasture');
		expect(soy.previousAcres).toBe(0);
		expect(soy.change).toBeCloseTo(soy.acres, 9);
		// Only the north field was planned both years: the farm matrix is its matrix.
		const total = body.rotation.reduce((sum: number, c: { acres: number }) => sum + c.acres, 0);
		expect(total).toBeGreaterThan(0.9 * Math.min(s.a2025.plantedAcres, s.a2026.plantedAcres));
		expect(total).toBeLessThanOrEqual(Math.min(s.a2025.plantedAcres, s.a2026.plantedAcres) + 1e-6);
		const cornToSoy = body.rotation.find((c: { from: string; to: string }) => c.from === 'corn' && c.to === 'soybean');
		expect(cornToSoy.acres).toBeGreaterThan(1);
		// Shifted one lane: no corn lands on last year's corn beyond rounding slivers.
		const cornOnCorn = body.rotation.find((c: { from: string; to: string }) => c.from === 'corn' && c.to === 'corn')?.acres ?? 0;
		expect(cornOnCorn).toBeLessThan(0.01);
	});

	it('a plan with a broken stored lane still answers: the field is left out of the rotation and named', async () => {
		const s = await setup();
		await db()('plan_lanes').where({ plan_id: s.a2026.id, lane_index: 2 }).update({ geometry: JSON.stringify({ type: 'Polygon', coordinates: [] }) });
		const summary = await seasonSummaryJson(event(s.members.owner, `${base(s.farm.id, 2026)}/summary`, params(s.farm.id, 2026)));
		expect(summary.status).toBe(200);
		const body = await summary.json();
		expect(body.rotationSkipped).toEqual(['North strips']);
		expect(body.rotation).toEqual([]);
		const season = await seasonJson(event(s.members.owner, base(s.farm.id, 2026), params(s.farm.id, 2026)));
		expect(season.status).toBe(200);
		const geo = await (await seasonLanes(event(s.members.owner, `${base(s.farm.id, 2026)}/lanes.geojson`, params(s.farm.id, 2026)))).json();
		expect(geo.features.length).toBe(s.a2026.lanes.length + s.b2026.lanes.length);
	});

	it('lane records list what was logged on the lane, newest first, with product names as recorded', async () => {
		const s = await setup();
		const [product] = await db()('products').insert({ farm_id: s.farm.id, name: 'residual herbicide A', kind: 'herbicide', unit: 'pt', rei_hours: 12 }).returning('id');
		const log = async (type: string, day: string, lanes: number[]) => {
			const [op] = await db()('operations').insert({ farm_id: s.farm.id, field_id: s.a.id, season: 2026, plan_id: s.a2026.id, plan_version: 1, type, started_at: `${day}T14:00:00Z`, ended_at: `${day}T15:00:00Z`, acres: 1 }).returning('id');
			for (const i of lanes) {
				const lane = s.a2026.lanes[i];
				await db()('operation_lanes').insert({ farm_id: s.farm.id, operation_id: op.id, lane_index: i, kind: lane.kind, crop: lane.crop, lane_acres: lane.acres, acres: lane.acres, geometry: JSON.stringify(lane.geometry) });
			}
			return op.id as string;
		};
		const planting = await log('planting', '2026-05-02', [0, 1]);
		const spraying = await log('spraying', '2026-06-10', [1]);
		await db()('operation_products').insert({ farm_id: s.farm.id, operation_id: spraying, product_id: product.id, position: 0, rate: 1.5, rate_unit: 'pt/ac', total: 1.5, total_unit: 'pt', product_name: 'residual herbicide A', restricted_use: false });
		const read = async (lane: string) => (await laneRecordsJson(event(s.members.crew, `${base(s.farm.id, 2026)}/lane-records`, params(s.farm.id, 2026), `?fieldId=${s.a.id}&laneIndex=${lane}`))).json();
		const one = await read('1');
		expect(one.records.map((r: { id: string }) => r.id)).toEqual([spraying, planting]);
		expect(one.records[0]).toMatchObject({ type: 'spraying', products: ['residual herbicide A'] });
		expect(one.records[1]).toMatchObject({ type: 'planting', products: [] });
		expect((await read('0')).records.map((r: { id: string }) => r.id)).toEqual([planting]);
		const bad = await laneRecordsJson(event(s.members.crew, `${base(s.farm.id, 2026)}/lane-records`, params(s.farm.id, 2026), '?fieldId=nope&laneIndex=-1'));
		expect(bad.status).toBe(400);
		expect(Object.keys((await bad.json()).error.fields).sort()).toEqual(['fieldId', 'laneIndex']);
	});
});

describe('the farm home page (season map)', () => {
	// eslint-disable-next-line @typescript-eslint/no-explicit-any
	const home = (user: SessionUser, farmId: string, search = '') => farmHome(event(user, `/farms/${farmId}`, { farmId }, search)) as Promise<any>;

	it('shows a viewer only the granted fields, on the map and in the totals', async () => {
		const s = await setup();
		await db()('memberships').where({ farm_id: s.farm.id, user_id: s.members.viewer.id }).update({ field_scope: [s.a.id] });
		const page = await home(s.members.viewer, s.farm.id, '?season=2026');
		expect(page.season).toBe(2026);
		expect(page.outlines.map((f: { name: string }) => f.name)).toEqual(['North strips']);
		expect(page.seasonData.fields.map((f: { fieldId: string }) => f.fieldId)).toEqual([s.a.id]);
		expect(page.summary.fieldsShown).toBe(1);
		expect(page.seasons).toEqual([2025, 2026]);
		const owner = await home(s.members.owner, s.farm.id, '?season=2026');
		expect(owner.outlines).toHaveLength(3);
	});

	it('opens on a season from the address, says so when it is not a season, and refuses other farms', async () => {
		const s = await setup();
		const bad = await home(s.members.owner, s.farm.id, '?season=20x6');
		expect(bad.seasonProblem).toBe(`"20x6" is not a season this farm can plan (a year from 1900 to 2200); showing ${bad.season}.`);
		expect(bad.seasons).toEqual([2025, 2026]);
		const far = await home(s.members.owner, s.farm.id, '?season=2200');
		expect(far.seasonData.fields.every((f: { status: string }) => f.status === 'no_plan')).toBe(true);
		expect(far.summary.rotation).toEqual([]);
		const other = await makeFarmWithTeam();
		expect((await thrown(() => home(other.members.owner, s.farm.id))).status).toBe(404);
	});
});
