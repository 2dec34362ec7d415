// Many people logging at once: every record lands, each whole, with its own lanes and products,
// and an edit made from a stale copy is refused without touching what the first editor saved.
import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { recordFarm, routes, call, hoursAgo, operationCount } from './records-setup';

describe('concurrent record writes', () => {
	it('50 records posted at once all land, each with its lanes and product line', { timeout: 120_000 }, async () => {
		const s = await recordFarm();
		const crew = s.members.crew;
		const answers = await Promise.all(
			Array.from({ length: 50 }, (_, i) =>
				call(routes.listRoute.POST, crew, s.params, {
					method: 'POST',
					json: { type: 'spraying', startedAt: hoursAgo(3), endedAt: hoursAgo(2), laneIndexes: [i % 10, (i % 10) + 10], products: [{ productId: s.products.herbicide, rate: 1 + i / 100, rateUnit: 'pt/ac' }], notes: `pass ${i}` }
				})
			)
		);
		expect(answers.map((a) => a.status)).toEqual(Array(50).fill(201));
		expect(await operationCount(s.field.id)).toBe(50);
		const notes = (await db()('operations').where({ field_id: s.field.id }).pluck('notes')).sort();
		expect(notes).toEqual(Array.from({ length: 50 }, (_, i) => `pass ${i}`).sort());
		const ids = await db()('operations').where({ field_id: s.field.id }).pluck('id');
		expect(Number((await db()('operation_lanes').whereIn('operation_id', ids).count('* as n').first())!.n)).toBe(100);
		expect(Number((await db()('operation_products').whereIn('operation_id', ids).count('* as n').first())!.n)).toBe(50);
		expect(Number((await db()('audit_log').whereIn('entity_id', ids).where({ action: 'create' }).count('* as n').first())!.n)).toBe(50);
	});

	it('two people edit the same record: the second, from a stale copy, gets 409 and the first edit stands', async () => {
		const s = await recordFarm();
		const created = await call(routes.listRoute.POST, s.members.crew, s.params, { method: 'POST', json: { type: 'tillage', startedAt: hoursAgo(5), endedAt: hoursAgo(4), laneIndexes: [0], notes: 'first' } });
		expect(created.status).toBe(201);
		const one = { ...s.params, recordId: created.body.id };
		const [a, b] = await Promise.all([
			call(routes.oneRoute.PATCH, s.members.crew, one, { method: 'PATCH', json: { version: created.body.version, notes: 'edit by crew' } }),
			call(routes.oneRoute.PATCH, s.members.manager, one, { method: 'PATCH', json: { version: created.body.version, notes: 'edit by manager' } })
		]);
		expect([a.status, b.status].sort()).toEqual([200, 409]);
		const winner = a.status === 200 ? 'edit by crew' : 'edit by manager';
		const stored = await db()('operations').where({ id: created.body.id }).first('notes', 'version');
		expect(stored).toEqual({ notes: winner, version: created.body.version + 1 });
	});
});
