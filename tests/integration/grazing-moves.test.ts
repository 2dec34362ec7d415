import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { POST as createGroupApi } from '../../src/routes/api/farms/[farmId]/livestock/groups/+server';
import { GET as listMovesApi, POST as moveApi } from '../../src/routes/api/farms/[farmId]/livestock/moves/+server';
import { POST as nextMoveApi } from '../../src/routes/api/farms/[farmId]/livestock/groups/[groupId]/next-move/+server';
import { apiEvent, livestockFarm } from './livestock-setup';
import type { SessionUser } from '$lib/server/auth';

type Farm = Awaited<ReturnType<typeof livestockFarm>>;

async function group(s: Farm, name = 'Ewes', head = 30, weight = 150) {
	const res = await createGroupApi(apiEvent(s.members.owner, 'POST', `/api/farms/${s.farm.id}/livestock/groups`, { farmId: s.farm.id }, { name, species: 'sheep', head, averageWeightLb: weight }));
	expect(res.status).toBe(201);
	return (await res.json()).id as string;
}

async function shelter(s: Farm, name: string) {
	const [row] = await db()('equipment').insert({ farm_id: s.farm.id, name, kind: 'shelter', working_width_ft: 10, length_ft: 20 }).returning('id');
	return row.id as string;
}

function move(user: SessionUser, farmId: string, body: unknown) {
	return moveApi(apiEvent(user, 'POST', `/api/farms/${farmId}/livestock/moves`, { farmId }, body));
}

/** A record of spraying (or other work) straight into the record book tables, as logged. */
async function logWork(s: Farm, type: string, laneIndexes: number[], startedAt: string, endedAt: string, product?: { name: string; grazingDays: number | null }) {
	const [op] = await db()('operations')
		.insert({ farm_id: s.farm.id, field_id: s.field.id, season: 2026, plan_id: s.plan.id, plan_version: s.plan.version, type, started_at: startedAt, ended_at: endedAt, acres: 1 })
		.returning('id');
	for (const i of laneIndexes) {
		const lane = s.plan.lanes[i];
		await db()('operation_lanes').insert({ farm_id: s.farm.id, operation_id: op.id, lane_index: i, kind: lane.kind, crop: lane.crop, lane_acres: lane.acres, acres: lane.acres, geometry: JSON.stringify(lane.geometry) });
	}
	if (product) {
		const [p] = await db()('products').insert({ farm_id: s.farm.id, name: `${product.name} ${op.id.slice(0, 6)}`, kind: 'herbicide', unit: 'pt', grazing_days: product.grazingDays }).returning('id');
		await db()('operation_products').insert({ farm_id: s.farm.id, operation_id: op.id, product_id: p.id, position: 0, rate: 1, rate_unit: 'pt/ac', total: 1, total_unit: 'pt', product_name: product.name, restricted_use: false, grazing_days: product.grazingDays });
	}
	return op.id as string;
}

const moveCount = async (groupId: string) => Number((await db()('grazing_moves').where({ group_id: groupId }).count<{ count: string }[]>('* as count'))[0].count);

describe('grazing moves', () => {
	it('crew move a group onto a stretch of a pasture lane, with its grazing figures; a crop lane is refused', async () => {
		const s = await livestockFarm();
		const groupId = await group(s);
		const hut = await shelter(s, 'Ewe hut');
		const lane = s.pastureLanes[0];
		const res = await move(s.members.crew, s.farm.id, { groupId, fieldId: s.field.id, season: 2026, laneIndex: lane, from: '2026-06-01', to: '2026-06-03', fromFt: 0, toFt: 400, shelterId: hut, forageLbPerAcre: 2400, utilization: 0.5, intakePct: 3.5 });
		expect(res.status).toBe(201);
		const body = await res.json();
		expect(body).toMatchObject({ groupId, shelterId: hut, shelterName: 'Ewe hut', laneIndex: lane, laneKind: 'pasture', fromFt: 0, toFt: 400, head: 30, from: '2026-06-01T05:00:00.000Z', to: '2026-06-04T05:00:00.000Z' });
		// The stretch is 10 ft × 400 ft = 4,000 sq ft ≈ 0.0918 ac (geodesic, so within 1 %).
		expect(body.stretchAcres).toBeGreaterThan(0.0909);
		expect(body.stretchAcres).toBeLessThan(0.0928);
		// NCAT ATTRA, Grazier's Math: 157.5 lb DM a day; 4.5 AU on the stretch.
		expect(body.figures.dailyDryMatterLb).toBeCloseTo(157.5, 8);
		expect(body.figures.stockingDensityAuPerAcre).toBeCloseTo(4.5 / body.stretchAcres, 8);
		expect(body.figures.grazingDays).toBeCloseTo((body.stretchAcres * 2400 * 0.5) / 157.5, 8);
		// The lane is copied as it stood.
		const row = await db()('grazing_moves').where({ id: body.id }).first();
		expect(row.lane_geometry).toEqual(s.plan.lanes[lane].geometry);
		expect(Number(row.lane_acres)).toBeCloseTo(s.plan.lanes[lane].acres, 8);

		const crop = await move(s.members.crew, s.farm.id, { groupId, fieldId: s.field.id, season: 2026, laneIndex: s.cropLanes[0], from: '2026-06-10', to: '2026-06-11' });
		expect(crop.status).toBe(400);
		expect((await crop.json()).error.fields.laneIndex).toEqual([`Lane ${s.cropLanes[0] + 1} is a crop lane (corn): animals go on pasture or cover lanes only.`]);
		expect(await moveCount(groupId)).toBe(1);
	});

	it('a lane inside a grazing interval answers 409 grazing_restricted; acknowledged, it is saved and the audit log keeps who', async () => {
		const s = await livestockFarm();
		const groupId = await group(s);
		const lane = s.pastureLanes[1];
		// Sprayed 1 July, 10:00–11:00 Chicago time, a product with a 14-day grazing interval on its label.
		await logWork(s, 'spraying', [lane], '2026-07-01T15:00:00Z', '2026-07-01T16:00:00Z', { name: 'residual herbicide A', grazingDays: 14 });
		const body = { groupId, fieldId: s.field.id, season: 2026, laneIndex: lane, from: '2026-07-10T08:00:00-05:00', to: '2026-07-11T08:00:00-05:00' };
		const refused = await move(s.members.crew, s.farm.id, body);
		expect(refused.status).toBe(409);
		const { error } = await refused.json();
		expect(error.code).toBe('grazing_restricted');
		expect(error.message).toBe(
			`Lane ${lane + 1} is closed to animals for this move: residual herbicide A: grazing interval of 14 days on the label, until Jul 15, 2026, 11:00 AM CDT. ` +
				'The label is the law: keep animals off the lane until the interval ends. ' +
				'This is a record, not a recommendation; follow the label, local rules and your veterinarian’s advice. ' +
				'To log the move anyway, confirm that you have checked (acknowledge: true); the acknowledgement is kept with your name.'
		);
		expect(await moveCount(groupId)).toBe(0);

		const acknowledged = await move(s.members.crew, s.farm.id, { ...body, acknowledge: true });
		expect(acknowledged.status).toBe(201);
		const saved = await acknowledged.json();
		expect(saved.acknowledgedRestriction.acknowledgedBy).toEqual({ id: s.members.crew.id, name: 'Test crew' });
		const audit = await db()('audit_log').where({ entity: 'grazing_move', entity_id: saved.id, action: 'acknowledge_restriction' });
		expect(audit).toHaveLength(1);
		expect(audit[0].user_id).toBe(s.members.crew.id);
		expect(audit[0].after.blocks[0]).toMatchObject({ laneIndex: lane, reason: 'grazing-interval', endsAt: '2026-07-15T16:00:00.000Z' });

		// From the end of the interval on, the lane is open again without acknowledging.
		const after = await move(s.members.crew, s.farm.id, { ...body, from: '2026-07-15T11:00:00-05:00', to: '2026-07-16T11:00:00-05:00' });
		expect(after.status).toBe(201);
		expect((await after.json()).acknowledgedRestriction).toBeNull();
	});

	it('spraying on a neighbouring lane within the last day blocks the move; a lane further away does not', async () => {
		const s = await livestockFarm();
		const groupId = await group(s);
		const lane = s.pastureLanes[1];
		// Spraying on the crop lane beside it (lane ± 1) ended 1 August, 10:00 Chicago time; no grazing interval on the label.
		await logWork(s, 'spraying', [lane + 1], '2026-08-01T14:00:00Z', '2026-08-01T15:00:00Z', { name: 'post herbicide B', grazingDays: null });
		const within = await move(s.members.crew, s.farm.id, { groupId, fieldId: s.field.id, season: 2026, laneIndex: lane, from: '2026-08-02T08:00:00-05:00', to: '2026-08-03T08:00:00-05:00' });
		expect(within.status).toBe(409);
		const { error } = await within.json();
		expect(error.code).toBe('grazing_restricted');
		expect(error.message.startsWith(`Lane ${lane + 1} is closed to animals for this move: spraying on lane ${lane + 2} next to it (closed until 24 h after the spraying ended), until Aug 2, 2026, 10:00 AM CDT. `)).toBe(true);
		// The pasture lane on the far side of the sprayed lane is its neighbour too; the one before (three lanes away) is open.
		expect(s.pastureLanes[2]).toBe(lane + 2);
		expect(s.pastureLanes[0]).toBe(lane - 2);
		const far = await move(s.members.crew, s.farm.id, { groupId, fieldId: s.field.id, season: 2026, laneIndex: s.pastureLanes[0], from: '2026-08-02T08:00:00-05:00', to: '2026-08-03T08:00:00-05:00' });
		expect(far.status).toBe(201);
		// 24 h after it ended, the neighbouring lane is open again.
		const later = await move(s.members.crew, s.farm.id, { groupId, fieldId: s.field.id, season: 2026, laneIndex: lane, from: '2026-08-03T10:00:00-05:00', to: '2026-08-04T10:00:00-05:00' });
		expect(later.status).toBe(201);
	});

	it('overlapping moves of one group or one shelter, a time outside the season and a stretch off the lane answer 400; nothing is saved', async () => {
		const s = await livestockFarm();
		const ewes = await group(s, 'Ewes');
		const pigs = await group(s, 'Pigs', 10, 120);
		const hut = await shelter(s, 'Hut');
		const base = { fieldId: s.field.id, season: 2026, laneIndex: s.pastureLanes[0] };
		expect((await move(s.members.crew, s.farm.id, { ...base, groupId: ewes, shelterId: hut, from: '2026-06-01', to: '2026-06-05', fromFt: 0, toFt: 300 })).status).toBe(201);
		const sameGroup = await move(s.members.crew, s.farm.id, { ...base, groupId: ewes, laneIndex: s.pastureLanes[1], from: '2026-06-04', to: '2026-06-06' });
		expect(sameGroup.status).toBe(400);
		expect(Object.keys((await sameGroup.json()).error.fields)).toEqual(['from']);
		const sameShelter = await move(s.members.crew, s.farm.id, { ...base, groupId: pigs, shelterId: hut, laneIndex: s.pastureLanes[1], from: '2026-06-05', to: '2026-06-06' });
		expect(sameShelter.status).toBe(400);
		expect((await sameShelter.json()).error.fields.shelterId[0]).toMatch(/^Hut already stands on lane \d+ of Lane pasture/);
		const outside = await move(s.members.crew, s.farm.id, { ...base, groupId: pigs, from: '2026-12-31', to: '2027-01-02' });
		expect(outside.status).toBe(400);
		expect((await outside.json()).error.fields.from).toEqual(['The move must lie within the 2026 season (1 January to 31 December 2026, farm time).']);
		const backwards = await move(s.members.crew, s.farm.id, { ...base, groupId: pigs, from: '2026-06-10T10:00:00Z', to: '2026-06-10T09:00:00Z' });
		expect(backwards.status).toBe(400);
		const offLane = await move(s.members.crew, s.farm.id, { ...base, groupId: pigs, from: '2026-06-10', to: '2026-06-11', fromFt: 5000, toFt: 5200 });
		expect(offLane.status).toBe(400);
		expect(Object.keys((await offLane.json()).error.fields)).toEqual(['toFt']);
		const noLane = await move(s.members.crew, s.farm.id, { ...base, groupId: pigs, laneIndex: 999, from: '2026-06-10', to: '2026-06-11' });
		expect(noLane.status).toBe(400);
		const negative = await move(s.members.crew, s.farm.id, { ...base, groupId: pigs, from: '2026-06-10', to: '2026-06-11', fromFt: -10 });
		expect(negative.status).toBe(400);
		expect(await moveCount(pigs)).toBe(0);
		expect(await moveCount(ewes)).toBe(1);
	});

	it('moving on to the next stretch is one call: same length straight on, same shelter, from when the last ended', async () => {
		const s = await livestockFarm();
		const groupId = await group(s);
		const hut = await shelter(s, 'Hut');
		const first = await move(s.members.crew, s.farm.id, { groupId, fieldId: s.field.id, season: 2026, laneIndex: s.pastureLanes[0], from: '2026-06-01', to: '2026-06-01', fromFt: 0, toFt: 250, shelterId: hut, forageLbPerAcre: 2000 });
		expect(first.status).toBe(201);
		const next = await nextMoveApi(apiEvent(s.members.crew, 'POST', `/api/farms/${s.farm.id}/livestock/groups/${groupId}/next-move`, { farmId: s.farm.id, groupId }, {}));
		expect(next.status).toBe(201);
		expect(await next.json()).toMatchObject({ laneIndex: s.pastureLanes[0], fromFt: 250, toFt: 500, shelterId: hut, forageLbPerAcre: 2000, from: '2026-06-02T05:00:00.000Z', to: '2026-06-03T05:00:00.000Z' });
		const advisor = await nextMoveApi(apiEvent(s.members.advisor, 'POST', `/api/farms/${s.farm.id}/livestock/groups/${groupId}/next-move`, { farmId: s.farm.id, groupId }, {}));
		expect(advisor.status).toBe(403);
	});

	it('advisors and viewers cannot log moves; another farm’s field or group answers 404; viewers read moves of granted fields only', async () => {
		const s = await livestockFarm();
		const other = await livestockFarm();
		const groupId = await group(s);
		const theirGroup = await group(other, 'Their ewes');
		const body = { groupId, fieldId: s.field.id, season: 2026, laneIndex: s.pastureLanes[0], from: '2026-06-01', to: '2026-06-02' };
		for (const role of ['advisor', 'viewer'] as const) {
			const res = await move(s.members[role], s.farm.id, body);
			expect(res.status).toBe(403);
			expect((await res.json()).error.code).toBe('forbidden');
		}
		expect((await move(s.members.crew, s.farm.id, { ...body, fieldId: other.field.id })).status).toBe(404);
		expect((await move(s.members.crew, s.farm.id, { ...body, groupId: theirGroup })).status).toBe(404);
		expect((await move(other.members.crew, s.farm.id, body)).status).toBe(404);
		expect((await move(s.members.manager, s.farm.id, body)).status).toBe(201);

		const list = (user: SessionUser) => listMovesApi(apiEvent(user, 'GET', `/api/farms/${s.farm.id}/livestock/moves?season=2026`, { farmId: s.farm.id }));
		expect((await (await list(s.members.advisor)).json()).map((m: { groupId: string }) => m.groupId)).toEqual([groupId]);
		// The viewer was granted no field: the move on an ungranted field is not listed.
		expect(await (await list(s.members.viewer)).json()).toEqual([]);
		await db()('memberships').where({ farm_id: s.farm.id, user_id: s.members.viewer.id }).update({ field_scope: [s.field.id] });
		const granted = await (await list(s.members.viewer)).json();
		expect(granted.map((m: { laneIndex: number }) => m.laneIndex)).toEqual([s.pastureLanes[0]]);
	});
});
