import { describe, expect, it } from 'vitest';
import { createField } from '$lib/server/fields';
import { savePlan } from '$lib/server/plans';
import { requireMember } from '$lib/server/access';
import { db } from '$lib/server/db';
import type { SessionUser } from '$lib/server/auth';
import { planEveryMissingField, planningBoard } from '$lib/server/planning-board';
import { actions, load } from '../../src/routes/(app)/farms/[farmId]/planning/+page.server';
import { fakeEvent, makeFarmWithTeam, thrown } from './helpers';
import { rectangle } from '../fixtures/rectangle';

const CORN = { kind: 'crop' as const, crop: 'corn', rows: 8, rowSpacingIn: 30 };
const SOY = { kind: 'crop' as const, crop: 'soybean', rows: 8, rowSpacingIn: 30 };

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function postEvent(user: SessionUser, farmId: string, season: string): any {
	const url = new URL(`http://127.0.0.1/farms/${farmId}/planning?/planAll`);
	const body = new FormData();
	body.set('season', season);
	return { locals: { user, session: null }, url, params: { farmId }, request: new Request(url, { method: 'POST', body }) };
}

async function setup() {
	const { farm, members } = await makeFarmWithTeam();
	const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
	const make = async (name: string, lng: number) => {
		const boundary = rectangle(400, 800, lng, 43.9);
		const field = await createField(access, { name, boundary, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
		const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
		const plan = (season: number, variant = 'main', offsetFt = 0) =>
			savePlan(access, field.id, season, { guidance: { a: sw, b: nw }, pattern: [CORN, SOY], offsetFt, headlandFt: 0, variant, version: 0, assignments: [], notes: null, rebase: false });
		return { field, plan };
	};
	const a = await make('A needs a plan', -94.21);
	const b = await make('B planned by hand', -94.2);
	const c = await make('C never planned', -94.19);
	const d = await make('D has only a draft', -94.18);
	const e = await make('E same ground', -94.17);
	await a.plan(2026);
	await b.plan(2026);
	await b.plan(2027, 'main', 10);
	await b.plan(2027, 'wide', 40);
	await d.plan(2026);
	const draft = await d.plan(2027, 'try', 20);
	await db()('plans').where({ id: draft.id }).update({ adopted: false });
	await e.plan(2026);
	return { farm, members, access, a, b, c, d, e };
}

async function plansOf(farmId: string) {
	return db()('plans').where({ farm_id: farmId }).whereNull('deleted_at').orderBy(['field_id', 'season', 'variant']).select('id', 'field_id', 'season', 'variant', 'adopted', 'version', 'updated_at');
}

describe('plan next season for every field', () => {
	it('creates exactly the missing plans and changes no existing plan or adoption', async () => {
		const s = await setup();
		const before = await plansOf(s.farm.id);
		const result = await planEveryMissingField(s.access, 2027);
		expect(result.created.map((c) => c.name)).toEqual(['A needs a plan', 'E same ground']);
		expect(Object.fromEntries(result.skipped.map((x) => [x.name, x.reason]))).toEqual({
			'B planned by hand': 'already has a 2027 plan; left as it is',
			'C never planned': 'no adopted 2026 plan to shift from',
			'D has only a draft': 'already has a 2027 plan; left as it is'
		});
		const after = await plansOf(s.farm.id);
		// Every plan that existed is exactly as it was.
		for (const p of before) expect(after.find((x) => x.id === p.id)).toEqual(p);
		const added = after.filter((p) => !before.some((x) => x.id === p.id));
		expect(added.map((p) => [p.field_id, p.season, p.variant])).toEqual(
			[[s.a.field.id, 2027, 'main'], [s.e.field.id, 2027, 'main']].sort((x, y) => (x[0] < y[0] ? -1 : 1))
		);
		// D's season keeps its draft unadopted: the batch adopted nothing there.
		expect(after.filter((p) => p.field_id === s.d.field.id && p.season === 2027).map((p) => [p.variant, p.adopted])).toEqual([['try', false]]);
		// The rotation of the new plans: one lane shift swaps corn and soybean.
		expect(result.rotation.filter((r) => r.acres >= 0.01).map((r) => `${r.from}>${r.to}`)).toEqual(['corn>soybean', 'soybean>corn']);
		expect(result.flags.filter((f) => f.kind === 'same_crop')).toEqual([]);

		const again = await planEveryMissingField(s.access, 2027);
		expect(again.created).toEqual([]);
		expect(await plansOf(s.farm.id)).toEqual(after);
	});

	it('flags corn beside last season\'s corn once per field, lanes listed compactly', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
		const boundary = rectangle(640, 800, -94.3, 43.9);
		const field = await createField(access, { name: 'Four-lane corn', boundary, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
		const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
		// 4 lanes of corn then 4 of soybean: shifted one lane, most corn stays beside last year's corn.
		const pattern = [CORN, CORN, CORN, CORN, SOY, SOY, SOY, SOY];
		await savePlan(access, field.id, 2026, { guidance: { a: sw, b: nw }, pattern, offsetFt: 0, headlandFt: 0, variant: 'main', version: 0, assignments: [], notes: null, rebase: false });
		const result = await planEveryMissingField(access, 2027);
		expect(result.created).toHaveLength(1);
		const sameCrop = result.flags.filter((f) => f.kind === 'same_crop');
		expect(sameCrop.length).toBeGreaterThan(0);
		expect(sameCrop[0].message).toMatch(/^[\d.]+ ac of corn follows corn\.$/);
		const edge = result.flags.filter((f) => f.kind === 'corn_borders_corn');
		expect(edge.length).toBeLessThanOrEqual(1);
		for (const f of edge) expect(f.message).toMatch(/^\d+ corn lanes? \([\d, …]+\) border last season's corn: scout (its|their) edge rows for rootworm\.$/);
	});

	it('only owners and managers may run it; another farm answers 404', async () => {
		const s = await setup();
		for (const role of ['crew', 'advisor', 'viewer'] as const) {
			const refused = await thrown(() => actions.planAll(postEvent(s.members[role], s.farm.id, '2027')));
			expect(refused.status).toBe(403);
		}
		expect((await plansOf(s.farm.id)).filter((p) => p.season === 2027)).toHaveLength(3);
		const other = await makeFarmWithTeam();
		const hidden = await thrown(() => actions.planAll(postEvent(other.members.owner, s.farm.id, '2027')));
		expect(hidden.status).toBe(404);
		const bad = await actions.planAll(postEvent(s.members.manager, s.farm.id, '3000'));
		expect(bad).toMatchObject({ status: 400 });
		const done = (await actions.planAll(postEvent(s.members.manager, s.farm.id, '2027'))) as { batch: { created: { name: string }[] } };
		expect(done.batch.created.map((c) => c.name)).toEqual(['A needs a plan', 'E same ground']);
	});
});

describe('planning board', () => {
	it('shows each field\'s state, the sheet sent and the planting records', async () => {
		const s = await setup();
		await db()('audit_log').insert({ farm_id: s.farm.id, user_id: s.members.owner.id, entity: 'sheet', entity_id: s.b.field.id, action: 'email', after: JSON.stringify({ season: 2027, to: ['x@example.test'] }) });
		await db()('audit_log').insert({ farm_id: s.farm.id, user_id: s.members.owner.id, entity: 'sheet', entity_id: s.a.field.id, action: 'email', after: JSON.stringify({ season: 2026, to: ['x@example.test'] }) });
		await db()('operations').insert({ farm_id: s.farm.id, field_id: s.b.field.id, season: 2027, type: 'planting', started_at: '2027-05-01T13:00:00Z', ended_at: '2027-05-01T18:00:00Z', acres: 3.5 });
		await db()('operations').insert({ farm_id: s.farm.id, field_id: s.b.field.id, season: 2027, type: 'planting', started_at: '2027-05-03T13:00:00Z', ended_at: '2027-05-03T18:00:00Z', acres: 2, deleted_at: new Date() });
		const board = await planningBoard(s.access, 2027);
		const row = (name: string) => board.rows.find((r) => r.name === name)!;
		expect(board.rows.map((r) => r.name)).toEqual(['A needs a plan', 'B planned by hand', 'C never planned', 'D has only a draft', 'E same ground']);
		expect(row('A needs a plan')).toMatchObject({ state: 'no_plan', canShift: true, sheet: null, planting: null, plantedAcres: null, planterCheck: null });
		expect(row('B planned by hand')).toMatchObject({ state: 'adopted', drafts: ['wide'], sheet: { action: 'email' }, planting: { records: 1, acres: 3.5 } });
		expect(row('B planned by hand').planting!.lastAt.toISOString()).toBe('2027-05-01T18:00:00.000Z');
		expect(row('C never planned')).toMatchObject({ state: 'no_plan', canShift: false });
		expect(row('D has only a draft')).toMatchObject({ state: 'draft', drafts: ['try'] });

		await db()('memberships').where({ farm_id: s.farm.id, user_id: s.members.viewer.id }).update({ field_scope: [s.c.field.id] });
		const page = (await load({ locals: { user: s.members.viewer, session: null }, url: new URL(`http://127.0.0.1/farms/${s.farm.id}/planning?season=2027`), params: { farmId: s.farm.id }, request: new Request(`http://127.0.0.1/farms/${s.farm.id}/planning`) } as never)) as { board: { rows: { name: string }[] } };
		expect(page.board.rows.map((r) => r.name)).toEqual(['C never planned']);
	});
});
