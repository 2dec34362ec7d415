// Who may log, edit, delete, restore and read season records; another farm's ids answer 404.
import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { call, hoursAgo, operationCount, recordFarm, routes } from './records-setup';

const { listRoute, oneRoute, restoreRoute, restrictionsRoute, csvRoute } = routes;

const spraying = (productId: string) => ({ type: 'spraying', startedAt: hoursAgo(3), endedAt: hoursAgo(2), laneIndexes: [0], products: [{ productId, rate: 1, rateUnit: 'pt/ac' }] });

describe('record roles', () => {
	it('owner, manager and crew log operations; advisor and viewer are refused with 403 and nothing is written', async () => {
		const s = await recordFarm();
		await db()('memberships').where({ farm_id: s.farm.id, user_id: s.members.viewer.id }).update({ field_scope: [s.field.id] });
		for (const role of ['owner', 'manager', 'crew'] as const) {
			const res = await call(listRoute.POST, s.members[role], s.params, { method: 'POST', json: spraying(s.products.herbicide) });
			expect(res.status, role).toBe(201);
		}
		for (const role of ['advisor', 'viewer'] as const) {
			const res = await call(listRoute.POST, s.members[role], s.params, { method: 'POST', json: spraying(s.products.herbicide) });
			expect(res.status, role).toBe(403);
			expect(res.body.error.code).toBe('forbidden');
		}
		expect(await operationCount(s.field.id)).toBe(3);
	});

	it('advisor and viewer may not edit or delete; crew may not restore; manager may', async () => {
		const s = await recordFarm();
		await db()('memberships').where({ farm_id: s.farm.id, user_id: s.members.viewer.id }).update({ field_scope: [s.field.id] });
		const created = await call(listRoute.POST, s.members.crew, s.params, { method: 'POST', json: spraying(s.products.herbicide) });
		const one = { ...s.params, recordId: created.body.id };
		for (const role of ['advisor', 'viewer'] as const) {
			expect((await call(oneRoute.PATCH, s.members[role], one, { method: 'PATCH', json: { version: 1, notes: 'x' } })).status, role).toBe(403);
			expect((await call(oneRoute.DELETE, s.members[role], one, { method: 'DELETE' })).status, role).toBe(403);
		}
		expect((await call(oneRoute.DELETE, s.members.crew, one, { method: 'DELETE' })).status).toBe(200);
		for (const role of ['crew', 'advisor', 'viewer'] as const) {
			expect((await call(restoreRoute.POST, s.members[role], one, { method: 'POST' })).status, role).toBe(403);
		}
		const restored = await call(restoreRoute.POST, s.members.manager, one, { method: 'POST' });
		expect(restored.status).toBe(200);
		expect(restored.body.deletedAt).toBeNull();
	});

	it('a viewer reads only the fields granted to them; other fields answer 404', async () => {
		const s = await recordFarm();
		await call(listRoute.POST, s.members.owner, s.params, { method: 'POST', json: spraying(s.products.herbicide) });
		const created = (await call(listRoute.GET, s.members.owner, s.params)).body.records[0];
		const one = { ...s.params, recordId: created.id };
		for (const [handler, params] of [[listRoute.GET, s.params], [oneRoute.GET, one], [restrictionsRoute.GET, s.params], [csvRoute.GET, s.params]] as const) {
			const res = await call(handler, s.members.viewer, params);
			expect(res.status).toBe(404);
			expect(res.body.error.code).toBe('not_found');
		}
		await db()('memberships').where({ farm_id: s.farm.id, user_id: s.members.viewer.id }).update({ field_scope: [s.field.id] });
		expect((await call(listRoute.GET, s.members.viewer, s.params)).body.records.map((r: { id: string }) => r.id)).toEqual([created.id]);
		expect((await call(oneRoute.GET, s.members.viewer, one)).status).toBe(200);
		expect((await call(restrictionsRoute.GET, s.members.viewer, s.params)).status).toBe(200);
		expect((await call(csvRoute.GET, s.members.viewer, s.params)).status).toBe(200);
	});

	it('another farm\'s field, record and plan answer 404 to a member of a different farm', async () => {
		const s = await recordFarm();
		const other = await recordFarm();
		const created = await call(listRoute.POST, s.members.owner, s.params, { method: 'POST', json: spraying(s.products.herbicide) });
		const one = { ...s.params, recordId: created.body.id };
		// The other farm's owner, on this farm's addresses.
		for (const [handler, params, method] of [
			[listRoute.GET, s.params, 'GET'],
			[listRoute.POST, s.params, 'POST'],
			[oneRoute.GET, one, 'GET'],
			[oneRoute.PATCH, one, 'PATCH'],
			[oneRoute.DELETE, one, 'DELETE'],
			[restoreRoute.POST, one, 'POST'],
			[restrictionsRoute.GET, s.params, 'GET'],
			[csvRoute.GET, s.params, 'GET']
		] as const) {
			const res = await call(handler, other.members.owner, params, { method, json: method === 'GET' || method === 'DELETE' ? undefined : { version: 1, ...spraying(other.products.herbicide) } });
			expect(res.status, `${method}`).toBe(404);
		}
		// This farm's record id under the other farm's own field: 404 too.
		const crossed = await call(oneRoute.GET, other.members.owner, { ...other.params, recordId: created.body.id });
		expect(crossed.status).toBe(404);
		// This farm's field under the other farm's id.
		const mixed = await call(listRoute.POST, other.members.owner, { ...other.params, fieldId: s.field.id }, { method: 'POST', json: spraying(other.products.herbicide) });
		expect(mixed.status).toBe(404);
		expect(await operationCount(s.field.id)).toBe(1);
	});

	it('without a session the API answers 401', async () => {
		const s = await recordFarm();
		expect((await call(listRoute.GET, null, s.params)).status).toBe(401);
		expect((await call(listRoute.POST, null, s.params, { method: 'POST', json: spraying(s.products.herbicide) })).status).toBe(401);
	});
});
