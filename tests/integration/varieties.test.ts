// The seed catalogue through its JSON API: varieties of each crop with their seed lots, checks on
// bad input, edits by version, soft deletes, the audit log, and who may write.
import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import type { SessionUser } from '$lib/server/auth';
import { GET as listRoute, POST as createRoute } from '../../src/routes/api/farms/[farmId]/varieties/+server';
import { GET as getRoute, PATCH as patchRoute, DELETE as deleteRoute } from '../../src/routes/api/farms/[farmId]/varieties/[varietyId]/+server';
import { GET as lotsRoute, POST as createLotRoute } from '../../src/routes/api/farms/[farmId]/varieties/[varietyId]/lots/+server';
import { DELETE as deleteLotRoute } from '../../src/routes/api/farms/[farmId]/varieties/[varietyId]/lots/[lotId]/+server';
import { makeFarmWithTeam } from './helpers';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function event(user: SessionUser | null, method: string, path: string, params: Record<string, string>, body?: unknown): any {
	const url = new URL(`http://127.0.0.1${path}`);
	const init: RequestInit = { method };
	if (body !== undefined) Object.assign(init, { headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
	return { locals: { user, session: null }, url, params, request: new Request(url, init) };
}

const hybrid = { crop: 'corn', name: 'hybrid T (104-day)', relativeMaturity: 104, seedsPerUnit: 80_000, traits: 'glyphosate tolerant' };

async function setup() {
	const { farm, members } = await makeFarmWithTeam();
	const base = `/api/farms/${farm.id}/varieties`;
	const create = (user: SessionUser, body: unknown) => createRoute(event(user, 'POST', base, { farmId: farm.id }, body));
	const addLot = (user: SessionUser, varietyId: string, body: unknown) =>
		createLotRoute(event(user, 'POST', `${base}/${varietyId}/lots`, { farmId: farm.id, varietyId }, body));
	return { farm, members, base, create, addLot };
}

/** What an action or load answered or threw (a redirect or an error), for assertions on its status. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const settle = (p: unknown): Promise<any> => Promise.resolve(p).catch((e) => e);

describe('POST /api/farms/:farmId/varieties', () => {
	it('creates a variety: 201 and camelCase, numbers as numbers, no lots yet', async () => {
		const { farm, members, create } = await setup();
		const res = await create(members.manager, hybrid);
		expect(res.status).toBe(201);
		const v = await res.json();
		expect(v).toMatchObject({ ...hybrid, notes: null, version: 1, lots: [] });
		const row = await db()('varieties').where({ id: v.id }).first();
		expect([row.farm_id, row.crop, Number(row.relative_maturity), row.seeds_per_unit]).toEqual([farm.id, 'corn', 104, 80_000]);
	});

	it('takes {crop, name} alone, a soybean maturity group, and traits as a list', async () => {
		const { members, create } = await setup();
		const res = await create(members.owner, { crop: 'soybean', name: 'line T', relativeMaturity: 1.9, traits: ['tolerant to herbicide X', 'cyst nematode resistant'] });
		expect(res.status).toBe(201);
		expect(await res.json()).toMatchObject({ crop: 'soybean', relativeMaturity: 1.9, seedsPerUnit: null, traits: 'tolerant to herbicide X; cyst nematode resistant' });
		const bare = await create(members.owner, { crop: 'cereal rye', name: 'common' });
		expect(bare.status).toBe(201);
	});

	it('refuses bad input with 400 and field errors, and writes nothing', async () => {
		const { farm, members, create } = await setup();
		const cases: [unknown, string, string][] = [
			[{ ...hybrid, crop: '' }, 'crop', 'Name the crop (corn, soybean, cereal rye …).'],
			[{ ...hybrid, name: ' ' }, 'name', 'Name the variety or hybrid.'],
			[{ ...hybrid, relativeMaturity: -5 }, 'relativeMaturity', 'Relative maturity cannot be negative.'],
			[{ ...hybrid, seedsPerUnit: 0 }, 'seedsPerUnit', 'Seeds per unit must be at least 1.'],
			[{ ...hybrid, seedsPerUnit: 80_000.5 }, 'seedsPerUnit', 'Seeds per unit must be a whole number.']
		];
		for (const [body, field, message] of cases) {
			const res = await create(members.owner, body);
			expect(res.status, JSON.stringify(body)).toBe(400);
			expect((await res.json()).error.fields[field]).toEqual([message]);
		}
		expect(await db()('varieties').where({ farm_id: farm.id }).count('* as n').first()).toEqual({ n: 0 });
	});

	it('refuses the same name twice in one crop (any case), but the same name in another crop is another variety', async () => {
		const { members, create } = await setup();
		expect((await create(members.owner, hybrid)).status).toBe(201);
		const again = await create(members.owner, { ...hybrid, name: 'HYBRID T (104-day)' });
		expect(again.status).toBe(400);
		expect((await again.json()).error.fields.name).toEqual(['The catalogue already has a corn variety named "HYBRID T (104-day)".']);
		expect((await create(members.owner, { ...hybrid, crop: 'sorghum' })).status).toBe(201);
	});

	it('lets only owners and managers write: crew, advisor and viewer get 403; another farm\'s member 404', async () => {
		const { farm, members, create } = await setup();
		for (const role of ['crew', 'advisor', 'viewer'] as const) {
			const res = await create(members[role], { ...hybrid, name: role });
			expect(res.status, role).toBe(403);
		}
		const other = await setup();
		expect((await createRoute(event(other.members.owner, 'POST', `/api/farms/${farm.id}/varieties`, { farmId: farm.id }, hybrid))).status).toBe(404);
		expect(await db()('varieties').where({ farm_id: farm.id }).count('* as n').first()).toEqual({ n: 0 });
	});
});

describe('one variety, and its seed lots', () => {
	it('every member reads; PATCH by version (409 when stale); audited; another farm\'s variety 404', async () => {
		const { farm, members, base, create } = await setup();
		const v = await (await create(members.owner, hybrid)).json();
		const params = { farmId: farm.id, varietyId: v.id };
		for (const role of ['crew', 'advisor', 'viewer'] as const) {
			const list = await listRoute(event(members[role], 'GET', base, { farmId: farm.id }));
			expect((await list.json()).map((x: { name: string }) => x.name), role).toEqual(['hybrid T (104-day)']);
			expect((await getRoute(event(members[role], 'GET', `${base}/${v.id}`, params))).status).toBe(200);
			expect((await patchRoute(event(members[role], 'PATCH', `${base}/${v.id}`, params, { seedsPerUnit: 1, version: 1 }))).status).toBe(403);
		}
		const ok = await patchRoute(event(members.manager, 'PATCH', `${base}/${v.id}`, params, { relativeMaturity: 103, version: 1 }));
		expect(ok.status).toBe(200);
		expect(await ok.json()).toMatchObject({ ...hybrid, relativeMaturity: 103, version: 2 });
		const stale = await patchRoute(event(members.owner, 'PATCH', `${base}/${v.id}`, params, { relativeMaturity: 99, version: 1 }));
		expect(stale.status).toBe(409);
		expect(Number((await db()('varieties').where({ id: v.id }).first()).relative_maturity)).toBe(103);
		const audit = await db()('audit_log').where({ entity: 'variety', entity_id: v.id }).orderBy('id');
		expect(audit.map((a) => [a.action, a.user_id])).toEqual([['create', members.owner.id], ['update', members.manager.id]]);

		const other = await setup();
		const theirs = await (await other.create(other.members.owner, hybrid)).json();
		const foreign = { farmId: farm.id, varietyId: theirs.id };
		expect((await getRoute(event(members.owner, 'GET', `${base}/${theirs.id}`, foreign))).status).toBe(404);
		expect((await patchRoute(event(members.owner, 'PATCH', `${base}/${theirs.id}`, foreign, { name: 'x', version: 1 }))).status).toBe(404);
		expect((await createLotRoute(event(members.owner, 'POST', `${base}/${theirs.id}/lots`, foreign, { lotNumber: 'L1' }))).status).toBe(404);
		expect((await lotsRoute(event(members.owner, 'GET', `${base}/${theirs.id}/lots`, foreign))).status).toBe(404);
	});

	it('seed lots: 201 with germination and treatment, listed on the variety; bad germination and a repeated lot are 400', async () => {
		const { farm, members, base, create, addLot } = await setup();
		const v = await (await create(members.owner, hybrid)).json();
		const res = await addLot(members.manager, v.id, { lotNumber: 'T-2026-01', germinationPct: 95, treatment: 'fungicide seed treatment', unitsOnHand: 40 });
		expect(res.status).toBe(201);
		const lot = await res.json();
		expect(lot).toMatchObject({ varietyId: v.id, lotNumber: 'T-2026-01', germinationPct: 95, treatment: 'fungicide seed treatment', unitsOnHand: 40 });

		const over = await addLot(members.owner, v.id, { lotNumber: 'T-2026-02', germinationPct: 101 });
		expect(over.status).toBe(400);
		expect((await over.json()).error.fields.germinationPct).toEqual(['Germination is 0–100 %.']);
		const again = await addLot(members.owner, v.id, { lotNumber: 't-2026-01' });
		expect(again.status).toBe(400);
		expect((await again.json()).error.fields.lotNumber).toEqual(['Lot t-2026-01 is already listed for this variety.']);
		expect((await addLot(members.crew, v.id, { lotNumber: 'crew lot' })).status).toBe(403);

		const lots = await (await lotsRoute(event(members.viewer, 'GET', `${base}/${v.id}/lots`, { farmId: farm.id, varietyId: v.id }))).json();
		expect(lots.map((l: { lotNumber: string }) => l.lotNumber)).toEqual(['T-2026-01']);
		const listed = await (await listRoute(event(members.viewer, 'GET', base, { farmId: farm.id }))).json();
		expect(listed[0].lots.map((l: { id: string }) => l.id)).toEqual([lot.id]);

		const lotParams = { farmId: farm.id, varietyId: v.id, lotId: lot.id };
		expect((await deleteLotRoute(event(members.crew, 'DELETE', `${base}/${v.id}/lots/${lot.id}`, lotParams))).status).toBe(403);
		expect((await deleteLotRoute(event(members.owner, 'DELETE', `${base}/${v.id}/lots/${lot.id}`, lotParams))).status).toBe(204);
		expect((await db()('seed_lots').where({ id: lot.id }).first()).deleted_at).toBeInstanceOf(Date);
		expect(await (await lotsRoute(event(members.owner, 'GET', `${base}/${v.id}/lots`, { farmId: farm.id, varietyId: v.id }))).json()).toEqual([]);
	});

	it('DELETE is soft and frees the name', async () => {
		const { farm, members, base, create } = await setup();
		const v = await (await create(members.owner, hybrid)).json();
		const params = { farmId: farm.id, varietyId: v.id };
		expect((await deleteRoute(event(members.advisor, 'DELETE', `${base}/${v.id}`, params))).status).toBe(403);
		expect((await deleteRoute(event(members.owner, 'DELETE', `${base}/${v.id}`, params))).status).toBe(204);
		expect((await db()('varieties').where({ id: v.id }).first()).deleted_by).toBe(members.owner.id);
		expect((await getRoute(event(members.owner, 'GET', `${base}/${v.id}`, params))).status).toBe(404);
		expect((await create(members.owner, hybrid)).status).toBe(201);
	});
});

describe('seed catalogue pages', () => {
	// eslint-disable-next-line @typescript-eslint/no-explicit-any
	function formEvent(user: SessionUser, path: string, params: Record<string, string>, form: Record<string, string>): any {
		const url = new URL(`http://127.0.0.1${path}`);
		const body = new FormData();
		for (const [k, v] of Object.entries(form)) body.set(k, v);
		return { locals: { user, session: null }, url, params, request: new Request(url, { method: 'POST', body }) };
	}

	it('adding a variety or a lot through the pages is refused to crew, advisor and viewer; bad numbers answer beside their inputs', async () => {
		const list = await import('../../src/routes/(app)/farms/[farmId]/seeds/+page.server');
		const one = await import('../../src/routes/(app)/farms/[farmId]/seeds/[varietyId]/+page.server');
		const { farm, members, create } = await setup();
		const v = await (await create(members.owner, hybrid)).json();
		const variety = { crop: 'corn', name: 'hybrid U', relativeMaturity: '98', seedsPerUnit: '80,000', traits: '', notes: '' };
		for (const role of ['crew', 'advisor', 'viewer'] as const) {
			expect((await settle(list.actions.create(formEvent(members[role], `/farms/${farm.id}/seeds`, { farmId: farm.id }, variety)))).status, role).toBe(403);
			expect((await settle(one.actions.addLot(formEvent(members[role], `/farms/${farm.id}/seeds/${v.id}`, { farmId: farm.id, varietyId: v.id }, { lotNumber: 'X' })))).status, role).toBe(403);
		}
		const bad = (await list.actions.create(formEvent(members.owner, `/farms/${farm.id}/seeds`, { farmId: farm.id }, { ...variety, seedsPerUnit: 'a bag' }))) as { status: number; data: { errors: Record<string, string[]> } };
		expect(bad.status).toBe(400);
		expect(bad.data.errors.seedsPerUnit).toEqual(['Enter seeds per unit as a whole number, e.g. 80000.']);
		const made = await settle(list.actions.create(formEvent(members.manager, `/farms/${farm.id}/seeds`, { farmId: farm.id }, variety)));
		expect(made.status).toBe(303);
		expect((await db()('varieties').where({ farm_id: farm.id, name: 'hybrid U' }).first()).seeds_per_unit).toBe(80_000);
		const lot = await one.actions.addLot(formEvent(members.manager, `/farms/${farm.id}/seeds/${v.id}`, { farmId: farm.id, varietyId: v.id }, { lotNumber: 'U-1', germinationPct: '96', treatment: 'untreated', unitsOnHand: '' }));
		expect(lot).toEqual({ form: 'lot', added: 'U-1' });

		const other = await setup();
		const theirs = await (await other.create(other.members.owner, hybrid)).json();
		const foreign = await settle(one.load({ locals: { user: members.owner, session: null }, url: new URL(`http://127.0.0.1/farms/${farm.id}/seeds/${theirs.id}`), params: { farmId: farm.id, varietyId: theirs.id }, request: new Request('http://127.0.0.1/') } as never));
		expect(foreign.status).toBe(404);
	});
});
