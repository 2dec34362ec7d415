// The farm's product list through its JSON API: label data in and out in camelCase, the checks on
// bad input, edits guarded by version, soft deletes, the audit log, and who may write.
import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import type { SessionUser } from '$lib/server/auth';
import { GET as listRoute, POST as createRoute } from '../../src/routes/api/farms/[farmId]/products/+server';
import { GET as getRoute, PATCH as patchRoute, DELETE as deleteRoute } from '../../src/routes/api/farms/[farmId]/products/[productId]/+server';
import { makeFarmWithTeam } from './helpers';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function event(user: SessionUser | null, method: string, path: string, params: Record<string, string>, body?: unknown): any {
	const url = new URL(`http://127.0.0.1${path}`);
	const init: RequestInit = { method };
	if (body !== undefined) Object.assign(init, { headers: { 'content-type': 'application/json' }, body: typeof body === 'string' ? body : JSON.stringify(body) });
	return { locals: { user, session: null }, url, params, request: new Request(url, init) };
}

const residualA = {
	name: 'residual herbicide A',
	kind: 'herbicide',
	unit: 'pt',
	epaRegNo: '1234-56',
	restrictedUse: true,
	reiHours: 24,
	phiDays: 60,
	grazingDays: 30,
	activeIngredients: 'ingredient one; ingredient two',
	formulation: 'emulsifiable concentrate'
};

async function setup() {
	const { farm, members } = await makeFarmWithTeam();
	const base = `/api/farms/${farm.id}/products`;
	const create = (user: SessionUser, body: unknown) => createRoute(event(user, 'POST', base, { farmId: farm.id }, body));
	return { farm, members, base, create };
}

/** What an action or load answered or threw (a redirect or an error), for assertions on its status. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const settle = (p: unknown): Promise<any> => Promise.resolve(p).catch((e) => e);

describe('POST /api/farms/:farmId/products', () => {
	it('creates a product with its label data: 201, camelCase, numbers as numbers', async () => {
		const { farm, members, create } = await setup();
		const res = await create(members.manager, residualA);
		expect(res.status).toBe(201);
		const p = await res.json();
		expect(p).toMatchObject({ ...residualA, analysis: null, poundsPerGallon: null, notes: null, version: 1 });
		expect(p.id).toMatch(/^[0-9a-f-]{36}$/);
		const row = await db()('products').where({ id: p.id }).first();
		expect([row.farm_id, row.epa_reg_no, Number(row.rei_hours), row.phi_days, row.grazing_days, row.restricted_use]).toEqual([farm.id, '1234-56', 24, 60, 30, true]);
		expect(row.created_by).toBe(members.manager.id);
	});

	it('takes the minimum {name, kind, unit}, a list of active ingredients, and a distributor registration number', async () => {
		const { members, create } = await setup();
		const uan = await create(members.owner, { name: 'UAN 32 %', kind: 'fertilizer', unit: 'Gal', analysis: '32-0-0', poundsPerGallon: 11.06 });
		expect(uan.status).toBe(201);
		expect(await uan.json()).toMatchObject({ name: 'UAN 32 %', unit: 'gal', restrictedUse: false, epaRegNo: null, reiHours: null, phiDays: null, grazingDays: null, poundsPerGallon: 11.06, analysis: '32-0-0' });
		const c = await create(members.owner, { name: 'insecticide C', kind: 'insecticide', unit: 'fl oz', epaRegNo: '1234-56-7890', activeIngredients: ['one', 'two'] });
		expect(c.status).toBe(201);
		expect(await c.json()).toMatchObject({ epaRegNo: '1234-56-7890', activeIngredients: 'one; two' });
	});

	it('refuses bad input with 400 and field errors, and writes nothing', async () => {
		const { farm, members, create } = await setup();
		const cases: [unknown, string, string][] = [
			[{ ...residualA, epaRegNo: '12-34-56-78' }, 'epaRegNo', 'An EPA registration number looks like 1234-56 or 1234-56-7890 (company, product, distributor).'],
			[{ ...residualA, epaRegNo: 'EPA 1234' }, 'epaRegNo', 'An EPA registration number looks like 1234-56 or 1234-56-7890 (company, product, distributor).'],
			[{ ...residualA, reiHours: -1 }, 'reiHours', 'An interval cannot be negative.'],
			[{ ...residualA, phiDays: -3 }, 'phiDays', 'An interval cannot be negative.'],
			[{ ...residualA, grazingDays: 2.5 }, 'grazingDays', 'Days must be a whole number.'],
			[{ ...residualA, kind: 'miticide' }, 'kind', 'Kind must be one of herbicide, insecticide, fungicide, fertilizer, seed-treatment, other.'],
			[{ ...residualA, unit: 'bucket' }, 'unit', 'The unit must be one of fl oz, pt, qt, gal, oz, lb, ton, bu, seeds, units.'],
			[{ ...residualA, name: '   ' }, 'name', 'Name the product.'],
			[{ kind: 'herbicide', unit: 'pt' }, 'name', 'Name the product.']
		];
		for (const [body, field, message] of cases) {
			const res = await create(members.owner, body);
			expect(res.status, JSON.stringify(body)).toBe(400);
			const { error } = await res.json();
			expect(error.code).toBe('invalid');
			expect(error.fields[field]).toEqual([message]);
		}
		const bad = await create(members.owner, '{"name": ');
		expect(bad.status).toBe(400);
		expect((await bad.json()).error.code).toBe('bad_json');
		expect(await db()('products').where({ farm_id: farm.id }).count('* as n').first()).toEqual({ n: 0 });
	});

	it('refuses a second product of the same name (any case) with 400 on name', async () => {
		const { farm, members, create } = await setup();
		expect((await create(members.owner, residualA)).status).toBe(201);
		const again = await create(members.manager, { ...residualA, name: 'Residual Herbicide A' });
		expect(again.status).toBe(400);
		const { error } = await again.json();
		expect(error.fields.name).toEqual(['The farm already has a product named "Residual Herbicide A". Edit that one, or give this one another name.']);
		const rows = await db()('products').where({ farm_id: farm.id });
		expect(rows.map((r) => r.name)).toEqual(['residual herbicide A']);
	});

	it('lets only owners and managers write: crew, advisor and viewer get 403; strangers 404', async () => {
		const { farm, members, create } = await setup();
		for (const role of ['crew', 'advisor', 'viewer'] as const) {
			const res = await create(members[role], { ...residualA, name: `by ${role}` });
			expect(res.status, role).toBe(403);
			expect((await res.json()).error.code).toBe('forbidden');
		}
		const other = await setup();
		const foreign = await createRoute(event(other.members.owner, 'POST', `/api/farms/${farm.id}/products`, { farmId: farm.id }, residualA));
		expect(foreign.status).toBe(404);
		expect(await db()('products').where({ farm_id: farm.id }).count('* as n').first()).toEqual({ n: 0 });
		const anonymous = await create(null as unknown as SessionUser, residualA);
		expect(anonymous.status).toBe(401);
	});
});

describe('GET, PATCH and DELETE /api/farms/:farmId/products/:productId', () => {
	it('every member reads the list and one product; another farm\'s product is 404', async () => {
		const { farm, members, base, create } = await setup();
		const p = await (await create(members.owner, residualA)).json();
		for (const role of ['owner', 'manager', 'crew', 'advisor', 'viewer'] as const) {
			const list = await listRoute(event(members[role], 'GET', base, { farmId: farm.id }));
			expect(list.status, role).toBe(200);
			expect((await list.json()).map((x: { name: string }) => x.name)).toEqual(['residual herbicide A']);
			const one = await getRoute(event(members[role], 'GET', `${base}/${p.id}`, { farmId: farm.id, productId: p.id }));
			expect(one.status).toBe(200);
			expect((await one.json()).epaRegNo).toBe('1234-56');
		}
		const other = await setup();
		const theirs = await (await other.create(other.members.owner, { name: 'their product', kind: 'other', unit: 'lb' })).json();
		// Their product through our farm's address, and our product by someone outside the farm: both 404.
		const viaOurFarm = await getRoute(event(members.owner, 'GET', `${base}/${theirs.id}`, { farmId: farm.id, productId: theirs.id }));
		expect(viaOurFarm.status).toBe(404);
		expect((await viaOurFarm.json()).error.code).toBe('not_found');
		const patchTheirs = await patchRoute(event(members.owner, 'PATCH', `${base}/${theirs.id}`, { farmId: farm.id, productId: theirs.id }, { name: 'taken', version: 1 }));
		expect(patchTheirs.status).toBe(404);
		const deleteTheirs = await deleteRoute(event(members.owner, 'DELETE', `${base}/${theirs.id}`, { farmId: farm.id, productId: theirs.id }));
		expect(deleteTheirs.status).toBe(404);
		expect((await db()('products').where({ id: theirs.id }).first()).name).toBe('their product');
		const stranger = await getRoute(event(other.members.owner, 'GET', `${base}/${p.id}`, { farmId: farm.id, productId: p.id }));
		expect(stranger.status).toBe(404);
	});

	it('PATCH changes only what is sent, bumps the version, answers a stale version with 409 and keeps the audit trail', async () => {
		const { farm, members, base, create } = await setup();
		const p = await (await create(members.owner, residualA)).json();
		const path = `${base}/${p.id}`;
		const params = { farmId: farm.id, productId: p.id };
		const ok = await patchRoute(event(members.manager, 'PATCH', path, params, { reiHours: 48, version: 1 }));
		expect(ok.status).toBe(200);
		expect(await ok.json()).toMatchObject({ ...residualA, reiHours: 48, version: 2 });

		const stale = await patchRoute(event(members.owner, 'PATCH', path, params, { phiDays: 1, version: 1 }));
		expect(stale.status).toBe(409);
		expect((await stale.json()).error.code).toBe('version_conflict');

		const noVersion = await patchRoute(event(members.owner, 'PATCH', path, params, { phiDays: 1 }));
		expect(noVersion.status).toBe(400);
		expect((await noVersion.json()).error.fields.version).toEqual(['Send the version you edited.']);

		const negative = await patchRoute(event(members.owner, 'PATCH', path, params, { grazingDays: -1, version: 2 }));
		expect(negative.status).toBe(400);

		const crew = await patchRoute(event(members.crew, 'PATCH', path, params, { reiHours: 1, version: 2 }));
		expect(crew.status).toBe(403);

		const row = await db()('products').where({ id: p.id }).first();
		expect([Number(row.rei_hours), row.phi_days, row.grazing_days, row.version]).toEqual([48, 60, 30, 2]);
		const audit = await db()('audit_log').where({ entity: 'product', entity_id: p.id }).orderBy('id');
		expect(audit.map((a) => a.action)).toEqual(['create', 'update']);
		expect([audit[1].user_id, audit[1].before.reiHours, audit[1].after.reiHours]).toEqual([members.manager.id, 24, 48]);
	});

	it('renaming onto another product\'s name is a 400 on name', async () => {
		const { farm, members, base, create } = await setup();
		await create(members.owner, residualA);
		const b = await (await create(members.owner, { name: 'post herbicide B', kind: 'herbicide', unit: 'fl oz' })).json();
		const res = await patchRoute(event(members.owner, 'PATCH', `${base}/${b.id}`, { farmId: farm.id, productId: b.id }, { name: 'RESIDUAL herbicide a', version: 1 }));
		expect(res.status).toBe(400);
		expect(Object.keys((await res.json()).error.fields)).toEqual(['name']);
	});

	it('DELETE is soft: the row stays with deleted_at, the list and reads drop it, and the name is free again', async () => {
		const { farm, members, base, create } = await setup();
		const p = await (await create(members.owner, residualA)).json();
		const params = { farmId: farm.id, productId: p.id };
		expect((await deleteRoute(event(members.viewer, 'DELETE', `${base}/${p.id}`, params))).status).toBe(403);
		expect((await deleteRoute(event(members.crew, 'DELETE', `${base}/${p.id}`, params))).status).toBe(403);
		expect((await deleteRoute(event(members.manager, 'DELETE', `${base}/${p.id}?version=9`, params))).status).toBe(409);
		const res = await deleteRoute(event(members.manager, 'DELETE', `${base}/${p.id}?version=1`, params));
		expect(res.status).toBe(204);
		const row = await db()('products').where({ id: p.id }).first();
		expect(row.deleted_at).toBeInstanceOf(Date);
		expect(row.deleted_by).toBe(members.manager.id);
		expect(await (await listRoute(event(members.owner, 'GET', base, { farmId: farm.id }))).json()).toEqual([]);
		expect((await getRoute(event(members.owner, 'GET', `${base}/${p.id}`, params))).status).toBe(404);
		expect((await deleteRoute(event(members.manager, 'DELETE', `${base}/${p.id}`, params))).status).toBe(404);
		expect((await create(members.owner, residualA)).status).toBe(201);
		const audit = await db()('audit_log').where({ entity: 'product', entity_id: p.id }).orderBy('id');
		expect(audit.map((a) => a.action)).toEqual(['create', 'delete']);
	});
});

describe('product pages', () => {
	// eslint-disable-next-line @typescript-eslint/no-explicit-any
	function formEvent(user: SessionUser, path: string, params: Record<string, string>, form: Record<string, string>): any {
		const url = new URL(`http://127.0.0.1${path}`);
		const body = new FormData();
		for (const [k, v] of Object.entries(form)) body.set(k, v);
		return { locals: { user, session: null }, url, params, request: new Request(url, { method: 'POST', body }) };
	}
	const filled = { name: 'post herbicide T', kind: 'herbicide', unit: 'fl oz', epaRegNo: '1234-56', reiHours: '4', phiDays: '45', grazingDays: '', activeIngredients: '', formulation: '', analysis: '', poundsPerGallon: '', notes: '' };

	it('the add action refuses crew, advisor and viewer with 403 and answers bad values beside their inputs', async () => {
		const { actions } = await import('../../src/routes/(app)/farms/[farmId]/products/new/+page.server');
		const { farm, members } = await setup();
		const path = `/farms/${farm.id}/products/new`;
		for (const role of ['crew', 'advisor', 'viewer'] as const) {
			const refused = await settle(actions.create(formEvent(members[role], path, { farmId: farm.id }, filled)));
			expect(refused.status, role).toBe(403);
		}
		const bad = (await actions.create(formEvent(members.owner, path, { farmId: farm.id }, { ...filled, reiHours: 'twelve', phiDays: '-1' }))) as { status: number; data: { errors: Record<string, string[]>; values: { name: string } } };
		expect(bad.status).toBe(400);
		expect(bad.data.errors.reiHours).toEqual(['Enter the restricted-entry interval in hours, e.g. 12, or leave it empty.']);
		expect(bad.data.errors.phiDays).toEqual(['An interval cannot be negative.']);
		expect(bad.data.values.name).toBe('post herbicide T');
		expect(await db()('products').where({ farm_id: farm.id }).count('* as n').first()).toEqual({ n: 0 });
		const made = await settle(actions.create(formEvent(members.manager, path, { farmId: farm.id }, { ...filled, restrictedUse: 'on' })));
		expect(made.status).toBe(303);
		const row = await db()('products').where({ farm_id: farm.id }).first();
		expect([row.name, row.unit, row.restricted_use, Number(row.rei_hours), row.phi_days, row.grazing_days]).toEqual(['post herbicide T', 'fl oz', true, 4, 45, null]);
	});

	it('the edit page of another farm\'s product is a 404, and a stale edit form gets 409', async () => {
		const page = await import('../../src/routes/(app)/farms/[farmId]/products/[productId]/+page.server');
		const { farm, members, create } = await setup();
		const p = await (await create(members.owner, residualA)).json();
		const other = await setup();
		const theirs = await (await other.create(other.members.owner, { name: 'theirs', kind: 'other', unit: 'lb' })).json();
		const params = { farmId: farm.id, productId: theirs.id };
		const missing = await settle(page.load({ locals: { user: members.owner, session: null }, url: new URL(`http://127.0.0.1/farms/${farm.id}/products/${theirs.id}`), params, request: new Request('http://127.0.0.1/') } as never));
		expect(missing.status).toBe(404);
		const path = `/farms/${farm.id}/products/${p.id}`;
		await settle(page.actions.save(formEvent(members.owner, path, { farmId: farm.id, productId: p.id }, { ...filled, name: p.name, version: '1' })));
		const stale = (await page.actions.save(formEvent(members.manager, path, { farmId: farm.id, productId: p.id }, { ...filled, name: p.name, reiHours: '99', version: '1' }))) as { status: number; data: { conflict: boolean } };
		expect(stale.status).toBe(409);
		expect(stale.data.conflict).toBe(true);
		expect(Number((await db()('products').where({ id: p.id }).first()).rei_hours)).toBe(4);
	});
});
