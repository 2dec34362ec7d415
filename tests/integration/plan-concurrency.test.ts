import { describe, expect, it } from 'vitest';
import { createField } from '$lib/server/fields';
import { getPlan, savePlan } from '$lib/server/plans';
import { requireMember } from '$lib/server/access';
import { db } from '$lib/server/db';
import { POST as nextSeason } from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/plans/[season]/next/+server';
import { fakeEvent, makeFarmWithTeam } from './helpers';
import { rectangle } from '../fixtures/rectangle';
import type { SessionUser } from '$lib/server/auth';

const PARALLEL = 20;

function post(user: SessionUser, farmId: string, fieldId: string, season: number) {
	const path = `/api/farms/${farmId}/fields/${fieldId}/plans/${season}/next`;
	const url = new URL(`http://127.0.0.1${path}`);
	const event = { locals: { user, session: null }, url, request: new Request(url, { method: 'POST' }), params: { farmId, fieldId, season: String(season) } };
	// eslint-disable-next-line @typescript-eslint/no-explicit-any
	return nextSeason(event as any);
}

describe('parallel next-season posts', () => {
	it(`${PARALLEL} at once for one field and season: one 201, the rest 409, all within seconds`, async () => {
		// More requests than pool connections: a transaction that takes a second connection
		// while holding one waits for a connection that never frees.
		expect(PARALLEL).toBeGreaterThan(db().client.pool.max);
		const { farm, members } = await makeFarmWithTeam();
		const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
		const boundary = rectangle(650, 1320);
		const field = await createField(access, { name: 'Race test', boundary, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
		const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
		await savePlan(access, field.id, 2026, {
			guidance: { a: sw, b: nw },
			pattern: [{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }, { kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 }],
			offsetFt: 0, headlandFt: 0, variant: 'main', assignments: [], notes: null, rebase: false, version: 0
		});

		const started = Date.now();
		const answers = await Promise.all(Array.from({ length: PARALLEL }, () => post(members.owner, farm.id, field.id, 2026)));
		const seconds = (Date.now() - started) / 1000;

		const statuses = answers.map((r) => r.status).sort();
		expect(statuses).toEqual([201, ...Array(PARALLEL - 1).fill(409)]);
		expect(seconds).toBeLessThan(10);
		const refused = await Promise.all(answers.filter((r) => r.status === 409).map((r) => r.json()));
		expect(new Set(refused.map((b) => b.error.code))).toEqual(new Set(['already_planned']));
		const created = await getPlan(access, field.id, 2027);
		expect(created.version).toBe(1);
		expect(await db()('plans').where({ field_id: field.id, season: 2027 }).count('* as n').first()).toEqual({ n: 1 });
	}, 20_000);
});

describe('transactions keep to their own connection', () => {
	it('a query on the pool from inside a transaction is refused at once, and the transaction rolls back', async () => {
		const { farm } = await makeFarmWithTeam();
		const attempt = db().transaction(async (trx) => {
			await trx('farms').where({ id: farm.id }).update({ name: 'Renamed inside' });
			await db()('farms').where({ id: farm.id }).first('name');
		});
		await expect(attempt).rejects.toThrow('db() was called inside a transaction: run every query of the transaction on its trx, not on a second pool connection.');
		expect(await db()('farms').where({ id: farm.id }).first('name')).toEqual({ name: farm.name });
		// The same transaction on its trx alone commits.
		await db().transaction(async (trx) => trx('farms').where({ id: farm.id }).update({ name: 'Renamed on trx' }));
		expect(await db()('farms').where({ id: farm.id }).first('name')).toEqual({ name: 'Renamed on trx' });
	});
});
