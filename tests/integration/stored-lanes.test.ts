import { describe, expect, it } from 'vitest';
import type { Polygon } from 'geojson';
import { createField } from '$lib/server/fields';
import { getPlan, planNextSeason, savePlan } from '$lib/server/plans';
import { loadSheet } from '$lib/server/sheet';
import { requireMember } from '$lib/server/access';
import { db } from '$lib/server/db';
import type { SessionUser } from '$lib/server/auth';
import { GET as planJson } from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/plans/[season]/+server';
import { GET as lanesGeojson } from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/plans/[season]/lanes.geojson/+server';
import { load as comparePage } from '../../src/routes/(app)/farms/[farmId]/fields/[fieldId]/compare/+page.server';
import { fakeEvent, makeFarmWithTeam } from './helpers';
import { rectangle } from '../fixtures/rectangle';

// A lane whose stored shape and numbers no layout of this field could produce: if any read lays
// the plan out again, it shows the computed lane instead.
const TRIANGLE: Polygon = { type: 'Polygon', coordinates: [[[-94.21, 43.9], [-94.2099, 43.9], [-94.21, 43.9003], [-94.21, 43.9]]] };
const STORED = { acres: 12.345678912, widthFt: 21.5, offsetFt: -3.25, rowFeet: 4321.5, borderRows: 2 };
const BY_CROP = { corn: { acres: 50.5, lanes: 17, rows: 136, rowFeet: 123456.5, borderRowShare: 0.25 }, soybean: { acres: 48.625, lanes: 16, rows: 128, rowFeet: 111111, borderRowShare: 0.25 } };

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function event(user: SessionUser, path: string, params: Record<string, string>, search = ''): any {
	const url = new URL(`http://127.0.0.1${path}${search}`);
	return { locals: { user, session: null }, url, request: new Request(url), params, route: { id: path }, parent: async () => ({}), depends: () => {}, setHeaders: () => {} };
}

async function setup() {
	const { farm, members } = await makeFarmWithTeam();
	const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
	const boundary = rectangle(650, 1320);
	const field = await createField(access, { name: 'Stored lanes', boundary, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
	const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
	const settings = {
		guidance: { a: sw, b: nw },
		pattern: [{ kind: 'crop' as const, crop: 'corn', rows: 8, rowSpacingIn: 30 }, { kind: 'crop' as const, crop: 'soybean', rows: 8, rowSpacingIn: 30 }],
		offsetFt: 0, headlandFt: 0, variant: 'main', assignments: [], notes: null, rebase: false
	};
	const saved = await savePlan(access, field.id, 2025, { ...settings, version: 0 });
	// What a plan saved by an older version of the geometry code looks like today.
	await db()('plan_lanes').where({ plan_id: saved.id, lane_index: 0 }).update({
		geometry: JSON.stringify(TRIANGLE), acres: STORED.acres, width_ft: STORED.widthFt, offset_ft: STORED.offsetFt, row_feet: STORED.rowFeet, border_rows: STORED.borderRows, variety: 'hybrid Q'
	});
	await db()('plans').where({ id: saved.id }).update({ planted_acres: 99.125, field_acres: 101.5, headland_acres: 1.75, excluded_acres: 0.625, by_crop: JSON.stringify(BY_CROP) });
	return { access, field, farm, members, settings, saved };
}

describe('a saved plan reads back as stored', () => {
	it('GET plan, lanes.geojson, the sheet and compare show the stored lanes and totals, not a new layout', async () => {
		const { access, field, farm, members, saved } = await setup();
		const base = `/api/farms/${farm.id}/fields/${field.id}/plans/2025`;
		const params = { farmId: farm.id, fieldId: field.id, season: '2025' };

		const direct = await getPlan(access, field.id, 2025);
		const res = await planJson(event(members.viewer, base, params));
		expect(res.status).toBe(404); // the viewer was granted no fields
		const body = await (await planJson(event(members.crew, base, params))).json();
		for (const plan of [direct, body]) {
			expect(plan.lanes).toHaveLength(saved.lanes.length);
			expect(plan.lanes[0]).toMatchObject({ index: 0, geometry: TRIANGLE, ...STORED });
			expect(plan.lanes[0].assignment).toMatchObject({ laneIndex: 0, variety: 'hybrid Q', populationPerAcre: null });
			expect(plan.lanes[1].acres).toBe(saved.lanes[1].acres); // exact, every digit kept
			expect(plan.lanes[1].geometry).toEqual(saved.lanes[1].geometry);
			expect(plan).toMatchObject({ plantedAcres: 99.125, fieldAcres: 101.5, headlandAcres: 1.75, excludedAcres: 0.625, byCrop: BY_CROP });
		}

		const geo = await (await lanesGeojson(event(members.crew, `${base}/lanes.geojson`, params))).json();
		const lane1 = geo.features.find((f: { id: string }) => f.id === 'lane-1');
		expect(lane1.geometry).toEqual(TRIANGLE);
		expect(lane1.properties).toMatchObject({ acres: 12.3457, widthFt: 21.5, offsetFt: -3.25, rowFeet: 4321.5, borderRows: 2, variety: 'hybrid Q' });

		const sheet = await loadSheet(access, field.id, 2025);
		expect(sheet.plantedAcres).toBe(99.125);
		expect(sheet.fieldAcres).toBe(101.5);
		expect(sheet.lanes[0]).toMatchObject({ index: 0, acres: STORED.acres, widthFt: STORED.widthFt, geometry: TRIANGLE, variety: 'hybrid Q' });

		const compared = await comparePage(event(members.crew, `/farms/${farm.id}/fields/${field.id}/compare`, { farmId: farm.id, fieldId: field.id }, '?a=2025&b=2025'));
		if (!compared) throw new Error('compare returned nothing');
		expect(compared.a.lanes[0]).toMatchObject({ index: 0, acres: STORED.acres, geometry: TRIANGLE });
		expect(compared.a.plantedAcres).toBe(99.125);
		expect(compared.a.byCrop).toEqual(BY_CROP);
	});

	it('next season starts from the stored lanes; only an explicit re-layout replaces them, as a new version', async () => {
		const { access, field, settings, saved } = await setup();
		const next = await planNextSeason(access, field.id, 2025, { shift: 'default' });
		// The stored 12.35-ac triangle is corn: its acres count in the corn → … rotation rows.
		const fromCorn = next.rotation.filter((r) => r.from === 'corn').reduce((s, r) => s + r.acres, 0);
		const computedCorn = saved.lanes.filter((l) => l.crop === 'corn' && l.index !== 0).reduce((s, l) => s + l.acres, 0);
		expect(fromCorn).toBeLessThan(computedCorn + 0.5); // the triangle is far smaller than a 20-ft lane's 0.6 ac
		expect(fromCorn).toBeGreaterThan(computedCorn - 0.01);

		// Saving unchanged settings (a new seed choice) keeps the stored lanes.
		const assigned = await savePlan(access, field.id, 2025, { ...settings, version: 1, assignments: [{ laneIndex: 0, variety: 'hybrid R', relativeMaturity: 104, populationPerAcre: 34_000, seedLot: null, trialLabel: null, notes: null }] });
		expect(assigned.version).toBe(2);
		expect(assigned.lanes[0]).toMatchObject({ geometry: TRIANGLE, acres: STORED.acres });
		expect(assigned.lanes[0].assignment).toMatchObject({ variety: 'hybrid R', relativeMaturity: 104, populationPerAcre: 34_000 });
		expect(assigned.plantedAcres).toBe(99.125);
		expect((await getPlan(access, field.id, 2025)).lanes[0].acres).toBe(STORED.acres);

		// Laying out again with today's geometry is its own request and makes a new version.
		const relaid = await savePlan(access, field.id, 2025, { ...settings, version: 2, relayout: true, assignments: assigned.assignments });
		expect(relaid.version).toBe(3);
		expect(relaid.lanes[0].geometry).toEqual(saved.lanes[0].geometry);
		expect(relaid.lanes[0].acres).toBe(saved.lanes[0].acres);
		expect(relaid.lanes[0].assignment).toMatchObject({ variety: 'hybrid R' });
		expect(relaid.plantedAcres).toBe(saved.plantedAcres);
		const reread = await getPlan(access, field.id, 2025);
		expect(reread.lanes[0].acres).toBe(saved.lanes[0].acres);
		expect(reread.byCrop).toEqual(saved.byCrop);
	});
});
