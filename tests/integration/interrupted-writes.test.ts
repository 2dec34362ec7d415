// A write whose database connection dies in the middle of its transaction leaves nothing behind:
// every table is compared, row by row, before and after. The connection is killed from inside the
// transaction by a trigger on the last table the write touches (its audit row).
import { afterEach, describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { requireMember } from '$lib/server/access';
import { createField } from '$lib/server/fields';
import { savePlan } from '$lib/server/plans';
import { makeFarmWithTeam, fakeEvent } from './helpers';
import { rectangle } from '../fixtures/rectangle';
import { recordFarm, routes, call, hoursAgo } from './records-setup';

async function snapshot(): Promise<Record<string, string>> {
	const tables = (await db()('pg_tables').where({ schemaname: 'public' }).pluck('tablename')) as string[];
	const out: Record<string, string> = {};
	for (const t of tables.sort()) {
		const r = await db().raw(`SELECT count(*)::text || ':' || coalesce(md5(string_agg(x.t, '|' ORDER BY x.t)), '') AS sig FROM (SELECT r::text AS t FROM "${t}" r) x`);
		out[t] = r.rows[0].sig;
	}
	return out;
}

async function killConnectionOnAudit(farmId: string) {
	await db().raw(`CREATE OR REPLACE FUNCTION test_kill_own_connection() RETURNS trigger LANGUAGE plpgsql AS $$
		BEGIN PERFORM pg_terminate_backend(pg_backend_pid()); PERFORM pg_sleep(5); RETURN NEW; END $$`);
	await db().raw(`CREATE TRIGGER test_kill_on_audit AFTER INSERT ON audit_log FOR EACH ROW WHEN (NEW.farm_id = '${farmId}'::uuid) EXECUTE FUNCTION test_kill_own_connection()`);
}

afterEach(async () => {
	await db().raw('DROP TRIGGER IF EXISTS test_kill_on_audit ON audit_log');
	await db().raw('DROP FUNCTION IF EXISTS test_kill_own_connection()');
});

describe('a write cut off mid-transaction', () => {
	it('saves no part of a new field and the app reads on afterwards', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const access = await requireMember(fakeEvent(members.owner, '/x', 'POST'), farm.id, 'editPlans');
		await killConnectionOnAudit(farm.id);
		const before = await snapshot();
		const failed = await createField(access, { name: 'Cut off', boundary: rectangle(400, 300, -94.3, 43.7), exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null }).then(() => null, (e: Error) => e);
		expect(failed?.message).toMatch(/terminat|Connection/i);
		expect(await snapshot()).toEqual(before);
		expect((await db().raw('select 1 as one')).rows[0].one).toBe(1);
	});

	it('saves no part of a new plan: no plan row, no lanes, no audit row', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const access = await requireMember(fakeEvent(members.owner, '/x', 'POST'), farm.id, 'editPlans');
		const field = await createField(access, { name: 'Whole', boundary: rectangle(400, 300, -94.3, 43.7), exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
		await killConnectionOnAudit(farm.id);
		const before = await snapshot();
		const failed = await savePlan(access, field.id, 2027, {
			variant: 'main',
			version: 0,
			guidance: { a: [-94.3, 43.7], b: [-94.3, 43.702] },
			pattern: [{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }, { kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 }],
			offsetFt: 0,
			headlandFt: 0,
			assignments: [],
			notes: null,
			rebase: false
		}).then(() => null, (e: Error) => e);
		expect(failed?.message).toMatch(/terminat|Connection/i);
		expect(await snapshot()).toEqual(before);
		expect(await db()('plans').where({ field_id: field.id }).count('* as n').first()).toEqual({ n: 0 });
	});

	it('saves no part of a season record: no operation, lanes, product lines or audit row', async () => {
		const s = await recordFarm();
		await killConnectionOnAudit(s.farm.id);
		const before = await snapshot();
		const answer = await call(routes.listRoute.POST, s.members.crew, s.params, {
			method: 'POST',
			json: { type: 'spraying', startedAt: hoursAgo(3), endedAt: hoursAgo(2), laneIndexes: [0, 1, 2], products: [{ productId: s.products.herbicide, rate: 1.5, rateUnit: 'pt/ac' }] }
		});
		expect(answer.status).toBeGreaterThanOrEqual(500);
		expect(await snapshot()).toEqual(before);
	});
});
