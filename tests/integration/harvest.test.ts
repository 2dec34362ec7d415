import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { createField } from '$lib/server/fields';
import { savePlan } from '$lib/server/plans';
import { requireMember } from '$lib/server/access';
import { farmHarvestIndex, harvestAnalysis } from '$lib/server/harvest-analysis';
import { GET as listApi, POST as createApi } from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/seasons/[season]/harvest/+server';
import { DELETE as deleteApi } from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/seasons/[season]/harvest/[entryId]/+server';
import { GET as csvApi } from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/seasons/[season]/harvest.csv/+server';
import { fakeEvent, makeFarmWithTeam } from './helpers';
import { rectangle } from '../fixtures/rectangle';
import type { SessionUser } from '$lib/server/auth';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function apiEvent(user: SessionUser, method: string, path: string, params: Record<string, string>, body?: unknown): any {
	const url = new URL(`http://127.0.0.1${path}`);
	const init: RequestInit = { method };
	if (body !== undefined) {
		init.headers = { 'content-type': 'application/json' };
		init.body = JSON.stringify(body);
	}
	return { locals: { user, session: null }, url, params, request: new Request(url, init), route: { id: path } };
}

const CORN = { kind: 'crop' as const, crop: 'corn', rows: 8, rowSpacingIn: 30 };
const SOYBEAN = { kind: 'crop' as const, crop: 'soybean', rows: 8, rowSpacingIn: 30 };

/** A farm with a 159 × 1,000 ft field in 8-row corn and soybean strips for 2026 (8 lanes, the last a little narrower). */
async function harvestFarm() {
	const { farm, members } = await makeFarmWithTeam();
	const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
	const boundary = rectangle(159, 1000, -94.2, 43.95);
	const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
	const field = await createField(access, { name: 'Harvest strips', boundary, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
	const plan = await savePlan(access, field.id, 2026, { guidance: { a: sw, b: nw }, pattern: [CORN, SOYBEAN], offsetFt: 0, headlandFt: 0, variant: 'main', version: 0, assignments: [], notes: null, rebase: false });
	const path = `/api/farms/${farm.id}/fields/${field.id}/seasons/2026/harvest`;
	const params = { farmId: farm.id, fieldId: field.id, season: '2026' };
	const post = (user: SessionUser, body: unknown, p = params) => createApi(apiEvent(user, 'POST', path, p, body));
	const list = (user: SessionUser, p = params) => listApi(apiEvent(user, 'GET', path, p));
	return { farm, members, access, field, plan, path, params, post, list };
}

describe('harvest entries through the JSON API', () => {
	it('crew log a measured load: 201 with bushels at 15.5 % and bushels per acre (184.11 for 5,000 lb at 20 % off 8 × 30 in × 1,000 ft)', async () => {
		const { members, post, list, plan } = await harvestFarm();
		expect(plan.lanes.map((l) => l.crop)).toEqual(['corn', 'soybean', 'corn', 'soybean', 'corn', 'soybean', 'corn', 'soybean']);
		const res = await post(members.crew, { laneIndexes: [0], crop: 'corn', wetWeightLb: 5000, moisturePct: 20, lengthFt: 1000, rows: 8, rowSpacingIn: 30 });
		expect(res.status).toBe(201);
		const body = await res.json();
		// Extension strip-trial calibration formula with Rankin's (UW-Extension) 56 lb/bu at 15.5 %, worked by hand.
		expect(body.harvestedAcres).toBeCloseTo(20_000 / 43_560, 6);
		expect(body.bushelsPerAcre.toFixed(2)).toBe('184.11');
		expect(body.bushels.toFixed(2)).toBe('84.53');
		expect(body.standardMoisturePct).toBe(15.5);
		expect(body.laneIndexes).toEqual([0]);
		expect(body.lanes[0]).toMatchObject({ laneIndex: 0, crop: 'corn', rows: 8, borderRows: 1 });
		const listed = await (await list(members.advisor)).json();
		expect(listed.map((e: { id: string }) => e.id)).toEqual([body.id]);
	});

	it('without a length the lanes\u2019 acres are used; soybean drier than 13 % is raised to 13 %', async () => {
		const { members, post, plan } = await harvestFarm();
		const acres = plan.lanes[1].acres + plan.lanes[3].acres;
		const res = await post(members.manager, { laneIndexes: [3, 1], crop: 'soybean', wetWeightLb: 9000, moisturePct: 11 });
		expect(res.status).toBe(201);
		const body = await res.json();
		expect(body.harvestedAcres).toBeCloseTo(acres, 5);
		// Mulvaney & Devkota (UF/IFAS EDIS SS-AGR-443, 2020): 9,000 × 89 ÷ 87 lb, 60 lb/bu.
		expect(body.bushels).toBeCloseTo((9000 * 89) / 87 / 60, 3);
		expect(body.bushelsPerAcre).toBeCloseTo((9000 * 89) / 87 / 60 / acres, 4);
		expect(body.standardMoisturePct).toBe(13);
		expect(body.laneIndexes).toEqual([1, 3]);
	});

	it('outside and inside rows are logged apart; the edge effect reads them back per lane', async () => {
		const { access, members, post, field, plan } = await harvestFarm();
		// Inner corn lanes 2 and 4 have 2 border rows of 8 (soybean on both sides).
		for (const [lane, outside, inside] of [[2, 1300, 3600], [4, 1250, 3500], [6, 1280, 3550]] as const) {
			expect(plan.lanes[lane].borderRows).toBe(2);
			expect((await post(members.crew, { laneIndexes: [lane], crop: 'corn', wetWeightLb: outside, moisturePct: 18, rowPosition: 'outside' })).status).toBe(201);
			expect((await post(members.crew, { laneIndexes: [lane], crop: 'corn', wetWeightLb: inside, moisturePct: 18, rowPosition: 'inside' })).status).toBe(201);
		}
		const analysis = await harvestAnalysis(access, field.id, 2026);
		expect(analysis.edge).toHaveLength(1);
		expect(analysis.edge[0].crop).toBe('corn');
		expect(analysis.edge[0].lanes).toBe(3);
		expect(analysis.edge[0].entries).toBe(6);
		// Outside rows are 2/8 of the lane's acres, inside 6/8: per acre the outside rows out-yield.
		const perAcre = (lb: number, share: number, lane: number) => ((lb * 82) / 84.5 / 56) / (plan.lanes[lane].acres * share);
		const expected = [[2, 1300, 3600], [4, 1250, 3500], [6, 1280, 3550]].map(([l, o, i]) => perAcre(o, 0.25, l) - perAcre(i, 0.75, l));
		expect(analysis.edge[0].comparison.difference).toBeCloseTo(expected.reduce((s, x) => s + x, 0) / 3, 3);
		expect(analysis.edge[0].comparison.ci95).not.toBeNull();
		expect(analysis.edge[0].comparison.warning).toBeNull();
	});

	it('refuses moisture outside 5–40 %, weights ≤ 0, another crop and lanes not in the plan with 400 and saves nothing', async () => {
		const { members, post, field } = await harvestFarm();
		const ok = { laneIndexes: [0], crop: 'corn', wetWeightLb: 5000, moisturePct: 20 };
		const cases: [unknown, string][] = [
			[{ ...ok, moisturePct: 4.5 }, 'moisturePct'],
			[{ ...ok, moisturePct: 41 }, 'moisturePct'],
			[{ ...ok, wetWeightLb: 0 }, 'wetWeightLb'],
			[{ ...ok, wetWeightLb: -100 }, 'wetWeightLb'],
			[{ ...ok, crop: 'soybean' }, 'crop'],
			[{ ...ok, laneIndexes: [0, 1] }, 'crop'],
			[{ ...ok, laneIndexes: [8] }, 'laneIndexes'],
			[{ ...ok, laneIndexes: [] }, 'laneIndexes'],
			[{ ...ok, wetWeightLb: 'heavy' }, 'wetWeightLb'],
			[{ ...ok, lengthFt: 500 }, 'lengthFt'],
			[{ ...ok, rowPosition: 'middle' }, 'rowPosition']
		];
		for (const [body, key] of cases) {
			const res = await post(members.crew, body);
			expect(res.status, JSON.stringify(body)).toBe(400);
			const { error } = await res.json();
			expect(error.code).toBe('invalid');
			expect(Object.keys(error.fields ?? {}), JSON.stringify(body)).toContain(key);
		}
		const res = await post(members.crew, { ...ok, laneIndexes: [8] });
		expect((await res.json()).error.message).toBe('Lane 9 is not in the 2026 plan, which has lanes 1 to 8.');
		expect(await db()('harvest_entries').where({ field_id: field.id }).count<{ count: number }[]>('* as count')).toEqual([{ count: 0 }]);
	});

	it('advisors and viewers read but may not log (403); another farm\u2019s ids answer 404; a viewer without the field 404', async () => {
		const { farm, members, post, list, field, params, path } = await harvestFarm();
		for (const role of ['advisor', 'viewer'] as const) {
			const res = await post(members[role], { laneIndexes: [0], crop: 'corn', wetWeightLb: 5000, moisturePct: 20 });
			expect(res.status).toBe(403);
			expect((await res.json()).error.code).toBe('forbidden');
		}
		expect((await list(members.advisor)).status).toBe(200);
		// The viewer was granted nothing yet.
		expect((await list(members.viewer)).status).toBe(404);
		await db()('memberships').where({ farm_id: farm.id, user_id: members.viewer.id }).update({ field_scope: [field.id] });
		expect((await list(members.viewer)).status).toBe(200);

		const other = await harvestFarm();
		// A member of the other farm asking with this farm's ids, and this farm's owner with the other farm's field.
		expect((await other.list(other.members.owner, params)).status).toBe(404);
		expect((await post(other.members.owner, { laneIndexes: [0], crop: 'corn', wetWeightLb: 5000, moisturePct: 20 }, params)).status).toBe(404);
		const crossed = { ...params, fieldId: other.field.id };
		expect((await list(members.owner, crossed)).status).toBe(404);
		expect((await post(members.owner, { laneIndexes: [0], crop: 'corn', wetWeightLb: 5000, moisturePct: 20 }, crossed)).status).toBe(404);
		expect(path).toContain(farm.id);
	});

	it('entries keep their lanes as logged after the plan is saved again; delete needs the current version', async () => {
		const { access, members, post, list, field, plan, params, path } = await harvestFarm();
		const created = await (await post(members.crew, { laneIndexes: [0], crop: 'corn', wetWeightLb: 5000, moisturePct: 20 })).json();
		const [sw, , , nw] = field.boundary.type === 'Polygon' ? (field.boundary.coordinates[0] as [number, number][]) : [];
		await savePlan(access, field.id, 2026, { guidance: { a: sw, b: nw }, pattern: [SOYBEAN, CORN], offsetFt: 0, headlandFt: 0, variant: 'main', version: plan.version, assignments: [], notes: null, rebase: false });
		const [again] = await (await list(members.owner)).json();
		expect(again.lanes[0].crop).toBe('corn');
		expect(again.bushelsPerAcre).toBe(created.bushelsPerAcre);

		const delPath = `${path}/${created.id}`;
		const stale = await deleteApi(apiEvent(members.crew, 'DELETE', delPath, { ...params, entryId: created.id }, { version: 7 }));
		expect(stale.status).toBe(409);
		const advisor = await deleteApi(apiEvent(members.advisor, 'DELETE', delPath, { ...params, entryId: created.id }, { version: 1 }));
		expect(advisor.status).toBe(403);
		const done = await deleteApi(apiEvent(members.crew, 'DELETE', delPath, { ...params, entryId: created.id }, { version: 1 }));
		expect(done.status).toBe(204);
		expect(await (await list(members.owner)).json()).toEqual([]);
		const audit = await db()('audit_log').where({ entity: 'harvest_entry', entity_id: created.id }).orderBy('id').select('action');
		expect(audit.map((a) => a.action)).toEqual(['create', 'delete']);
	});

	it('exports the season as CSV, lanes numbered from 1', async () => {
		const { members, post, params, path } = await harvestFarm();
		await post(members.crew, { laneIndexes: [0, 2], crop: 'corn', wetWeightLb: 10_000, moisturePct: 20, lengthFt: 1000, rows: 16, rowSpacingIn: 30, notes: '=SUM(A1)' });
		const res = await csvApi(apiEvent(members.advisor, 'GET', `${path}.csv`, params));
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8');
		const lines = (await res.text()).split('\r\n');
		expect(lines[0]).toBe('season,harvested_on,lanes,crop,varieties,trial,row_position,wet_weight_lb,moisture_pct,length_ft,rows,row_spacing_in,harvested_acres,standard_moisture_pct,lb_per_bu,bushels,bu_per_ac,notes');
		expect(lines[1]).toBe("2026,,1 3,corn,,,all,10000,20,1000,16,30,0.9183,15.5,56,169.06,184.11,'=SUM(A1)");
	});
	it('the farm-wide index sums bushels and acres per field, season and crop; viewers see only granted fields', async () => {
		const { farm, members, post, field } = await harvestFarm();
		const a = await (await post(members.crew, { laneIndexes: [0], crop: 'corn', wetWeightLb: 5000, moisturePct: 20, lengthFt: 1000, rows: 8, rowSpacingIn: 30 })).json();
		const b = await (await post(members.crew, { laneIndexes: [2], crop: 'corn', wetWeightLb: 1300, moisturePct: 18, rowPosition: 'outside' })).json();
		const owner = await requireMember(fakeEvent(members.owner), farm.id);
		const [row, ...more] = await farmHarvestIndex(owner);
		expect(more).toEqual([]);
		expect(row).toMatchObject({ fieldId: field.id, fieldName: 'Harvest strips', season: 2026, entries: 2, imports: 0 });
		expect(row.byCrop).toHaveLength(1);
		expect(row.byCrop[0].crop).toBe('corn');
		expect(row.byCrop[0].bushels).toBeCloseTo(a.bushels + b.bushels, 6);
		expect(row.byCrop[0].acres).toBeCloseTo(a.harvestedAcres + b.harvestedAcres, 6);
		expect(await farmHarvestIndex(await requireMember(fakeEvent(members.viewer), farm.id))).toEqual([]);
	});
});
