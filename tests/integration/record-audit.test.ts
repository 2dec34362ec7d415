// History you can trust: every write leaves who, when, before and after; deletes are soft.
import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { call, hoursAgo, recordFarm, routes } from './records-setup';

const { listRoute, oneRoute, restoreRoute, restrictionsRoute } = routes;

describe('record history', () => {
	it('keeps create, update, delete and restore with who and before/after, shown on the record', async () => {
		const s = await recordFarm();
		const created = await call(listRoute.POST, s.members.crew, s.params, {
			method: 'POST',
			json: { type: 'spraying', startedAt: hoursAgo(3), endedAt: hoursAgo(2), laneIndexes: [0], products: [{ productId: s.products.herbicide, rate: 1, rateUnit: 'pt/ac' }], notes: 'first pass' }
		});
		const one = { ...s.params, recordId: created.body.id };
		const edited = await call(oneRoute.PATCH, s.members.manager, one, { method: 'PATCH', json: { version: 1, notes: 'first pass, boom 90 ft', products: [{ productId: s.products.herbicide, rate: 1.25, rateUnit: 'pt/ac' }] } });
		expect(edited.status).toBe(200);
		const deleted = await call(oneRoute.DELETE, s.members.crew, one, { method: 'DELETE', query: 'version=2' });
		expect(deleted.status).toBe(200);
		expect(deleted.body.deletedAt).not.toBeNull();
		const restored = await call(restoreRoute.POST, s.members.owner, one, { method: 'POST' });
		expect(restored.status).toBe(200);

		const read = await call(oneRoute.GET, s.members.advisor, one);
		expect(read.status).toBe(200);
		expect(read.body.version).toBe(4);
		const h = read.body.history;
		expect(h.map((e: { action: string }) => e.action)).toEqual(['create', 'update', 'delete', 'restore']);
		expect(h.map((e: { userId: string }) => e.userId)).toEqual([s.members.crew.id, s.members.manager.id, s.members.crew.id, s.members.owner.id]);
		expect(h[1].userName).toBe('Test manager');
		expect(h[0].before).toBeNull();
		expect(h[0].after.notes).toBe('first pass');
		expect(h[1].before.notes).toBe('first pass');
		expect(h[1].after.notes).toBe('first pass, boom 90 ft');
		expect(h[1].before.products[0].rate).toBe(1);
		expect(h[1].after.products[0].rate).toBe(1.25);
		expect(h[2].after.deletedAt).toBe(deleted.body.deletedAt);
		expect(h[3].after.deletedAt).toBeNull();
		expect(new Date(h[3].at).getTime()).toBeGreaterThanOrEqual(new Date(h[0].at).getTime());
	});

	it('a deleted record leaves the list and the lane restrictions, stays readable, and comes back whole', async () => {
		const s = await recordFarm();
		const created = await call(listRoute.POST, s.members.owner, s.params, {
			method: 'POST',
			json: { type: 'spraying', startedAt: hoursAgo(3), endedAt: hoursAgo(2), laneIndexes: [4], products: [{ productId: s.products.fungicide, rate: 6, rateUnit: 'fl oz/ac' }] }
		});
		const one = { ...s.params, recordId: created.body.id };
		const lane4 = async () => (await call(restrictionsRoute.GET, s.members.owner, s.params)).body.lanes[4];
		expect((await lane4()).reentryAt).not.toBeNull();
		expect((await call(oneRoute.DELETE, s.members.owner, one, { method: 'DELETE', query: 'version=7' })).status).toBe(409);
		await call(oneRoute.DELETE, s.members.owner, one, { method: 'DELETE' });
		expect((await call(listRoute.GET, s.members.owner, s.params)).body.records).toEqual([]);
		expect((await call(listRoute.GET, s.members.manager, s.params, { query: 'deleted=1' })).body.records.map((r: { id: string }) => r.id)).toEqual([created.body.id]);
		expect(await lane4()).toEqual({ laneIndex: 4, reentryAt: null, harvestAt: null, grazingAt: null });
		expect((await call(oneRoute.GET, s.members.owner, one)).body.deletedAt).not.toBeNull();
		// Rows are still there: nothing was removed.
		expect(await db()('operation_products').where({ operation_id: created.body.id }).count('* as n').first()).toEqual({ n: 1 });
		expect((await call(oneRoute.PATCH, s.members.owner, one, { method: 'PATCH', json: { version: 2, notes: 'x' } })).status).toBe(404);
		await call(restoreRoute.POST, s.members.manager, one, { method: 'POST' });
		// fungicide D: 24-h REI from the end of the application.
		expect((await lane4()).reentryAt).toBe(new Date(new Date(created.body.endedAt).getTime() + 24 * 3_600_000).toISOString());
		expect((await call(restoreRoute.POST, s.members.manager, one, { method: 'POST' })).status).toBe(404);
	});

	it('a refused write leaves no record, no lanes, no products and no audit entry', async () => {
		const s = await recordFarm();
		const before = Number((await db()('audit_log').where({ farm_id: s.farm.id, entity: 'record' }).count('* as n').first())?.n);
		const res = await call(listRoute.POST, s.members.owner, s.params, {
			method: 'POST',
			json: { type: 'spraying', startedAt: hoursAgo(3), endedAt: hoursAgo(2), laneIndexes: [0, 1], products: [{ productId: s.products.rup, rate: 3, rateUnit: 'fl oz/ac' }] }
		});
		expect(res.status).toBe(400);
		expect(Number((await db()('audit_log').where({ farm_id: s.farm.id, entity: 'record' }).count('* as n').first())?.n)).toBe(before);
		expect(await db()('operation_lanes').where({ farm_id: s.farm.id }).count('* as n').first()).toEqual({ n: 0 });
		expect(await db()('operations').where({ farm_id: s.farm.id }).count('* as n').first()).toEqual({ n: 0 });
	});
});
