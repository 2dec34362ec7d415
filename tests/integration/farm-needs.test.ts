import { describe, expect, it } from 'vitest';
import { createField } from '$lib/server/fields';
import { savePlan } from '$lib/server/plans';
import { requireMember } from '$lib/server/access';
import { db } from '$lib/server/db';
import { farmNeeds } from '$lib/server/farm-needs';
import { wholeUnitsToBuy } from '$lib/agronomy/index';
import type { SessionUser } from '$lib/server/auth';
import { GET as needsCsvRoute } from '../../src/routes/api/farms/[farmId]/seasons/[season]/needs.csv/+server';
import { fakeEvent, makeFarmWithTeam } from './helpers';
import { rectangle } from '../fixtures/rectangle';

const CORN = { kind: 'crop' as const, crop: 'corn', rows: 8, rowSpacingIn: 30 };
const SOY = { kind: 'crop' as const, crop: 'soybean', rows: 8, rowSpacingIn: 30 };

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function event(user: SessionUser, farmId: string, season: string): any {
	const url = new URL(`http://127.0.0.1/api/farms/${farmId}/seasons/${season}/needs.csv`);
	return { locals: { user, session: null }, url, request: new Request(url), params: { farmId, season } };
}

const nitrogen = { id: 'n', name: 'Nitrogen line', product: 'UAN 32 %', forCrops: ['corn'], gallonsPerAcre: 15, poundsPerGallon: 11.06, percentN: 32 };
const planter = {
	rowSpacingIn: 30,
	fertilizerLines: [nitrogen],
	rowUnits: Array.from({ length: 16 }, (_, i) => ({ unit: i + 1, seed: i < 8 ? { crop: 'corn', variety: 'hybrid A' } : { crop: 'soybean', variety: 'soy line' }, fertilizerOn: i < 8 ? ['n'] : [] }))
};

async function setup() {
	const { farm, members } = await makeFarmWithTeam();
	const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
	const ids: string[] = [];
	for (const [name, lng] of [['Needs north', -94.21], ['Needs south', -94.2]] as const) {
		const boundary = rectangle(640, 1320, lng, 43.9);
		const field = await createField(access, { name, boundary, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
		const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
		const plan = await savePlan(access, field.id, 2027, { guidance: { a: sw, b: nw }, pattern: [CORN, SOY], offsetFt: 0, headlandFt: 0, variant: 'main', version: 0, assignments: [], notes: null, rebase: false });
		await db()('plan_lanes').where({ plan_id: plan.id, crop: 'corn' }).update({ variety: 'hybrid A', population_per_acre: 34_000 });
		await db()('plan_lanes').where({ plan_id: plan.id, crop: 'soybean' }).update({ variety: 'soy line', population_per_acre: name === 'Needs north' ? 140_000 : null });
		ids.push(plan.id);
	}
	await db()('varieties').insert({ farm_id: farm.id, crop: 'corn', name: 'Hybrid A', seeds_per_unit: 90_000 });
	await db()('equipment').insert({ farm_id: farm.id, name: '16-row test planter', kind: 'planter', working_width_ft: 40, rows: 16, is_default_planter: true, planter: JSON.stringify(planter) });
	return { farm, members, access, planIds: ids };
}

describe('farm-wide needs', () => {
	it('sums seed by variety over the fields, with whole units from the catalogue, and fertilizer by product', async () => {
		const s = await setup();
		const needs = await farmNeeds(s.access, 2027);
		const sum = async (crop: string, planIds: string[]) => Number((await db()('plan_lanes').whereIn('plan_id', planIds).where({ crop }).sum({ a: 'acres' }))[0].a);
		const cornAcres = await sum('corn', s.planIds);
		expect(needs.fieldsPlanned).toBe(2);
		expect(needs.seed.map((x) => [x.crop, x.variety])).toEqual([['corn', 'hybrid A'], ['soybean', 'soy line']]);
		const corn = needs.seed[0];
		expect(corn.acres).toBeCloseTo(cornAcres, 9);
		expect(corn.seeds).toBeCloseTo(cornAcres * 34_000, 3);
		expect(corn).toMatchObject({ fields: 2, seedsPerUnit: 90_000, basis: 'catalogue', unitsToOrder: wholeUnitsToBuy((cornAcres * 34_000) / 90_000) });
		// Only the north field's soybean lanes have a rate; the south's are listed apart.
		const soyNorth = await sum('soybean', [s.planIds[0]]);
		expect(needs.seed[1]).toMatchObject({ fields: 1, seedsPerUnit: 140_000, basis: 'common practice', unitsToOrder: wholeUnitsToBuy(soyNorth) });
		expect(needs.unrated).toHaveLength(1);
		expect(needs.unrated[0]).toMatchObject({ crop: 'soybean', variety: 'soy line', fields: 1 });
		expect(needs.unrated[0].acres).toBeCloseTo(await sum('soybean', [s.planIds[1]]), 9);

		expect(needs.planter).toBe('16-row test planter');
		expect(needs.fertilizer).toHaveLength(1);
		const n = needs.fertilizer[0];
		expect(n).toMatchObject({ product: 'UAN 32 %', fields: 2, ratesGallonsPerAcre: [15] });
		// Every corn row carries the line: gallons = corn acres × 15 gal/ac; lb N = gal × 11.06 × 32 %.
		expect(n.acres).toBeCloseTo(cornAcres, 6);
		expect(n.gallons).toBeCloseTo(cornAcres * 15, 4);
		expect(n.poundsN!).toBeCloseTo(cornAcres * 15 * 11.06 * 0.32, 3);
	});

	it('answers the CSV to every member, and 404 to another farm', async () => {
		const s = await setup();
		const res = await needsCsvRoute(event(s.members.viewer, s.farm.id, '2027'));
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8');
		// The viewer was granted no fields: a header and nothing else.
		expect((await res.text()).trim().split('\r\n')).toHaveLength(1);
		const full = (await (await needsCsvRoute(event(s.members.crew, s.farm.id, '2027'))).text()).trim().split('\r\n');
		expect(full).toHaveLength(5);
		expect(full[1].startsWith('2027,seed,corn,hybrid A,2,')).toBe(true);
		expect(full[3].startsWith('2027,seed without a rate,soybean,soy line,1,')).toBe(true);
		expect(full[4].startsWith('2027,fertilizer,,UAN 32 %,2,')).toBe(true);
		const other = await makeFarmWithTeam();
		expect((await needsCsvRoute(event(other.members.owner, s.farm.id, '2027'))).status).toBe(404);
		expect((await needsCsvRoute(event(s.members.owner, s.farm.id, '3000'))).status).toBe(404);
	});
});
