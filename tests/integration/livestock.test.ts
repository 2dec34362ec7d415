import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { GET as listGroupsApi, POST as createGroupApi } from '../../src/routes/api/farms/[farmId]/livestock/groups/+server';
import { GET as groupApi, PATCH as patchGroupApi } from '../../src/routes/api/farms/[farmId]/livestock/groups/[groupId]/+server';
import { POST as eventApi } from '../../src/routes/api/farms/[farmId]/livestock/groups/[groupId]/events/+server';
import { apiEvent, livestockFarm } from './livestock-setup';
import { makeFarmWithTeam } from './helpers';
import type { SessionUser } from '$lib/server/auth';

const groupsPath = (farmId: string) => `/api/farms/${farmId}/livestock/groups`;

async function createGroup(user: SessionUser, farmId: string, body: unknown) {
	return createGroupApi(apiEvent(user, 'POST', groupsPath(farmId), { farmId }, body));
}

async function logEvent(user: SessionUser, farmId: string, groupId: string, body: unknown) {
	return eventApi(apiEvent(user, 'POST', `${groupsPath(farmId)}/${groupId}/events`, { farmId, groupId }, body));
}

describe('livestock groups', () => {
	it('owners and managers create groups with their animal units; crew, advisors and viewers are refused', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const flock = await createGroup(members.owner, farm.id, { name: 'Ewe flock', species: 'sheep', head: 30, averageWeightLb: 150 });
		expect(flock.status).toBe(201);
		const body = await flock.json();
		// National Drought Mitigation Center: AU = head × weight ÷ 1,000 lb → 30 × 150 ÷ 1,000 = 4.5.
		expect(body).toMatchObject({ name: 'Ewe flock', species: 'sheep', head: 30, averageWeightLb: 150, animalUnits: 4.5, publishedAnimalUnits: 6, version: 1 });
		expect(typeof body.id).toBe('string');
		// Water: J. Renewable Energy 2017, Table 1 and Lincoln University: 0.75–2 gal a ewe → 22.5–60 gal.
		expect(body.water).toMatchObject({ lowGal: 22.5, highGal: 60 });

		const pigs = await createGroup(members.manager, farm.id, { name: 'Feeder pigs', species: 'hog', head: 12, averageWeightLb: 120 });
		expect(pigs.status).toBe(201);
		expect((await pigs.json()).animalUnits).toBeCloseTo(1.44, 10);

		for (const role of ['crew', 'advisor', 'viewer'] as const) {
			const refused = await createGroup(members[role], farm.id, { name: `By ${role}`, species: 'goat', head: 5, averageWeightLb: 100 });
			expect(refused.status).toBe(403);
			expect((await refused.json()).error.code).toBe('forbidden');
		}
		const listed = await (await listGroupsApi(apiEvent(members.viewer, 'GET', groupsPath(farm.id), { farmId: farm.id }))).json();
		expect(listed.map((g: { name: string }) => g.name)).toEqual(['Ewe flock', 'Feeder pigs']);
		expect(await db()('livestock_groups').where({ farm_id: farm.id }).count<{ count: number }[]>('* as count')).toEqual([{ count: 2 }]);
	});

	it('bad input answers 400 with the field named and saves nothing', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const cases: [unknown, string][] = [
			[{ name: 'Negative', species: 'sheep', head: -1, averageWeightLb: 150 }, 'head'],
			[{ name: 'No weight', species: 'sheep', head: 10, averageWeightLb: 0 }, 'averageWeightLb'],
			[{ name: 'Minus weight', species: 'sheep', head: 10, averageWeightLb: -5 }, 'averageWeightLb'],
			[{ name: 'Llamas', species: 'llama', head: 10, averageWeightLb: 300 }, 'species'],
			[{ name: '', species: 'sheep', head: 10, averageWeightLb: 150 }, 'name'],
			[{ name: 'Half', species: 'sheep', head: 1.5, averageWeightLb: 150 }, 'head']
		];
		for (const [body, key] of cases) {
			const res = await createGroup(members.owner, farm.id, body);
			expect(res.status).toBe(400);
			const { error } = await res.json();
			expect(error.code).toBe('invalid');
			expect(Object.keys(error.fields)).toEqual([key]);
		}
		expect(await db()('livestock_groups').where({ farm_id: farm.id }).count<{ count: number }[]>('* as count')).toEqual([{ count: 0 }]);
		const dup1 = await createGroup(members.owner, farm.id, { name: 'Flock', species: 'sheep', head: 1, averageWeightLb: 150 });
		expect(dup1.status).toBe(201);
		const dup2 = await createGroup(members.owner, farm.id, { name: 'flock', species: 'goat', head: 1, averageWeightLb: 150 });
		expect(dup2.status).toBe(400);
		expect((await dup2.json()).error.fields.name).toEqual(['The farm already has a group named flock.']);
	});

	it('events keep the head count current: a lamb crop, a predator loss, and a loss larger than the group refused', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const group = await (await createGroup(members.owner, farm.id, { name: 'Ewes', species: 'sheep', head: 30, averageWeightLb: 150 })).json();

		const lambs = await logEvent(members.crew, farm.id, group.id, { kind: 'birth', head: 34, occurredAt: '2026-04-12' });
		expect(lambs.status).toBe(201);
		expect(await lambs.json()).toMatchObject({ kind: 'birth', head: 34, headAfter: 64, group: { head: 64 } });

		const predator = await logEvent(members.crew, farm.id, group.id, { kind: 'loss', head: 2, cause: 'predator', occurredAt: '2026-05-03T06:00:00-05:00', notes: 'Two lambs taken at the lane’s north end' });
		expect(predator.status).toBe(201);
		const lost = await predator.json();
		expect(lost).toMatchObject({ kind: 'loss', head: 2, cause: 'predator', headAfter: 62, occurredAt: '2026-05-03T11:00:00.000Z' });
		// 62 head × 150 lb ÷ 1,000 = 9.3 AU.
		expect(lost.group.animalUnits).toBeCloseTo(9.3, 10);

		const tooMany = await logEvent(members.manager, farm.id, group.id, { kind: 'loss', head: 63, cause: 'weather', occurredAt: '2026-05-04' });
		expect(tooMany.status).toBe(400);
		const refused = (await tooMany.json()).error;
		expect(refused.message).toBe('Ewes has 62 head; a loss of 63 is more than the group has. Nothing was saved.');
		expect(refused.fields.head).toEqual([refused.message]);
		const sale = await logEvent(members.owner, farm.id, group.id, { kind: 'sale', head: 62, occurredAt: '2026-10-01' });
		expect(sale.status).toBe(201);
		expect((await sale.json()).group.head).toBe(0);

		const history = await (await groupApi(apiEvent(members.viewer, 'GET', `${groupsPath(farm.id)}/${group.id}`, { farmId: farm.id, groupId: group.id }))).json();
		expect(history.head).toBe(0);
		expect(history.events.map((e: { kind: string; headAfter: number }) => [e.kind, e.headAfter])).toEqual([
			['sale', 0],
			['loss', 62],
			['birth', 64]
		]);
		expect(history.events[1].createdBy).toBe('Test crew');
		const audit = await db()('audit_log').where({ farm_id: farm.id, entity: 'livestock_event' }).orderBy('id');
		expect(audit.map((a) => [a.user_id, a.after.kind])).toEqual([
			[members.crew.id, 'birth'],
			[members.crew.id, 'loss'],
			[members.owner.id, 'sale']
		]);
	});

	it('crew log events; advisors and viewers cannot; bad events answer 400', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const group = await (await createGroup(members.owner, farm.id, { name: 'Pigs', species: 'hog', head: 10, averageWeightLb: 100 })).json();
		for (const role of ['advisor', 'viewer'] as const) {
			const res = await logEvent(members[role], farm.id, group.id, { kind: 'birth', head: 1, occurredAt: '2026-04-01' });
			expect(res.status).toBe(403);
		}
		const badDate = await logEvent(members.crew, farm.id, group.id, { kind: 'death', head: 1, occurredAt: 'yesterday' });
		expect(badDate.status).toBe(400);
		expect(Object.keys((await badDate.json()).error.fields)).toEqual(['occurredAt']);
		const zero = await logEvent(members.crew, farm.id, group.id, { kind: 'death', head: 0, occurredAt: '2026-04-01' });
		expect(zero.status).toBe(400);
		const kind = await logEvent(members.crew, farm.id, group.id, { kind: 'escape', head: 1, occurredAt: '2026-04-01' });
		expect(kind.status).toBe(400);
		expect((await db()('livestock_groups').where({ id: group.id }).first('head')).head).toBe(10);
	});

	it('another farm’s group answers 404, and so does a farm the user is not in', async () => {
		const mine = await livestockFarm();
		const theirs = await makeFarmWithTeam();
		const group = await (await createGroup(theirs.members.owner, theirs.farm.id, { name: 'Their goats', species: 'goat', head: 8, averageWeightLb: 90 })).json();
		const viaMyFarm = await groupApi(apiEvent(mine.members.owner, 'GET', `${groupsPath(mine.farm.id)}/${group.id}`, { farmId: mine.farm.id, groupId: group.id }));
		expect(viaMyFarm.status).toBe(404);
		const eventViaMyFarm = await logEvent(mine.members.owner, mine.farm.id, group.id, { kind: 'loss', head: 1, occurredAt: '2026-04-01' });
		expect(eventViaMyFarm.status).toBe(404);
		const theirFarm = await createGroup(mine.members.owner, theirs.farm.id, { name: 'Sneaky', species: 'goat', head: 1, averageWeightLb: 90 });
		expect(theirFarm.status).toBe(404);
		expect((await db()('livestock_groups').where({ id: group.id }).first('head')).head).toBe(8);
	});

	it('edits carry the version; a stale one answers 409 and changes nothing', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const group = await (await createGroup(members.owner, farm.id, { name: 'Ewes', species: 'sheep', head: 10, averageWeightLb: 150 })).json();
		const path = `${groupsPath(farm.id)}/${group.id}`;
		const params = { farmId: farm.id, groupId: group.id };
		const ok = await patchGroupApi(apiEvent(members.manager, 'PATCH', path, params, { averageWeightLb: 160, version: 1 }));
		expect(ok.status).toBe(200);
		expect(await ok.json()).toMatchObject({ averageWeightLb: 160, version: 2, animalUnits: 1.6 });
		const stale = await patchGroupApi(apiEvent(members.manager, 'PATCH', path, params, { averageWeightLb: 170, version: 1 }));
		expect(stale.status).toBe(409);
		expect((await stale.json()).error.code).toBe('version_conflict');
		const crew = await patchGroupApi(apiEvent(members.crew, 'PATCH', path, params, { averageWeightLb: 170, version: 2 }));
		expect(crew.status).toBe(403);
		expect(Number((await db()('livestock_groups').where({ id: group.id }).first('average_weight_lb')).average_weight_lb)).toBe(160);
	});
});

describe('demo livestock', () => {
	it('a sheep flock and a hog group in the two shelters on Shelter Lanes’ pasture lanes, with a lamb crop and a predator loss', async () => {
		const farmId = '5a1e0000-0000-4000-8000-00000000f001';
		const groups = await db()('livestock_groups').where({ farm_id: farmId }).whereNull('deleted_at').orderBy('name');
		expect(groups.map((g) => [g.name, g.species])).toEqual([
			['Ewe flock', 'sheep'],
			['Feeder pigs', 'hog']
		]);
		for (const g of groups) {
			// The head count is the sum of the events on it.
			const events = await db()('livestock_events').where({ group_id: g.id }).orderBy('occurred_at');
			expect(events[events.length - 1].head_after).toBe(g.head);
		}
		const flockEvents = await db()('livestock_events').where({ group_id: groups[0].id }).orderBy('occurred_at');
		expect(flockEvents.map((e) => [e.kind, e.cause])).toEqual([
			['birth', null],
			['loss', 'predator'],
			['sale', null]
		]);
		const moves = await db()('grazing_moves as m').join('equipment as e', 'e.id', 'm.shelter_id').where({ 'm.farm_id': farmId }).select('m.group_id', 'm.lane_kind', 'e.kind as shelter_kind', 'e.name');
		expect(moves.length).toBeGreaterThan(40);
		expect(new Set(moves.map((m) => m.lane_kind))).toEqual(new Set(['pasture']));
		expect(new Set(moves.map((m) => m.shelter_kind))).toEqual(new Set(['shelter']));
		expect(new Set(moves.map((m) => `${m.group_id === groups[0].id ? 'ewes' : 'pigs'} in ${m.name}`))).toEqual(new Set(['ewes in Ewe shelter', 'pigs in Pig shelter']));
		// No two moves of one shelter overlap in time.
		const overlaps = await db().raw(`select count(*)::int as n from grazing_moves a join grazing_moves b on a.shelter_id = b.shelter_id and a.id < b.id and a.starts_at < b.ends_at and b.starts_at < a.ends_at where a.farm_id = ?`, [farmId]);
		expect(overlaps.rows[0].n).toBe(0);
	});
});
