// Who may log, edit, delete, restore and read season records; another farm's ids answer 404.
import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { call, event, hoursAgo, operationCount, recordFarm, routes } from './records-setup';
import { thrown } from './helpers';
import * as newPage from '../../src/routes/(app)/farms/[farmId]/fields/[fieldId]/seasons/[season]/records/new/+page.server';
import * as quickPage from '../../src/routes/(app)/farms/[farmId]/fields/[fieldId]/seasons/[season]/quick/+page.server';
import * as seasonPage from '../../src/routes/(app)/farms/[farmId]/fields/[fieldId]/seasons/[season]/+page.server';
import * as recordPage from '../../src/routes/(app)/farms/[farmId]/fields/[fieldId]/seasons/[season]/records/[recordId]/+page.server';

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

	it('pages: the record forms refuse advisors and viewers (403); the season page hides ungranted fields (404); a page action checks the role too', async () => {
		const s = await recordFarm();
		const page = (user: Parameters<typeof event>[0], params: Record<string, string>, method = 'GET', body?: FormData) =>
			({ ...event(user, '/farms/x', { method, ...(body ? { body } : {}) }), params }) as never;
		for (const role of ['advisor', 'viewer'] as const) {
			expect((await thrown(() => newPage.load(page(s.members[role], s.params)))).status, role).toBe(403);
			expect((await thrown(() => quickPage.load(page(s.members[role], s.params)))).status, role).toBe(403);
		}
		expect((await thrown(() => seasonPage.load(page(s.members.viewer, s.params)))).status).toBe(404);
		const seen = (await seasonPage.load(page(s.members.advisor, s.params))) as { lanes: unknown[] };
		expect(seen.lanes).toHaveLength(33);
		const form = new FormData();
		form.set('type', 'tillage');
		form.set('lanes', '1-2');
		expect((await thrown(() => newPage.actions.default(page(s.members.advisor, s.params, 'POST', form)))).status).toBe(403);
		const created = await call(listRoute.POST, s.members.crew, s.params, { method: 'POST', json: spraying(s.products.herbicide) });
		const one = { ...s.params, recordId: created.body.id };
		expect((await thrown(() => recordPage.actions.delete(page(s.members.advisor, one, 'POST', new FormData())))).status).toBe(403);
		expect((await thrown(() => recordPage.actions.restore(page(s.members.crew, one, 'POST', new FormData())))).status).toBe(403);
		const other = await recordFarm();
		expect((await thrown(() => recordPage.load(page(other.members.owner, one)))).status).toBe(404);
		expect(await operationCount(s.field.id)).toBe(1);
	});
});
