import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createField, deleteField, updateField } from '$lib/server/fields';
import { adoptVariant, getPlan, savePlan } from '$lib/server/plans';
import { requireMember } from '$lib/server/access';
import { db } from '$lib/server/db';
import type { SessionUser } from '$lib/server/auth';
import { GET as planJson } from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/plans/[season]/+server';
import { GET as lanesGeojson } from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/plans/[season]/lanes.geojson/+server';
import { load as planPage } from '../../src/routes/(app)/farms/[farmId]/fields/[fieldId]/plans/[season]/+page.server';
import { fakeEvent, makeFarmWithTeam } from './helpers';
import { rectangle } from '../fixtures/rectangle';

// Plan answers and stored lanes are kept per plan version. These check that a kept answer is the one
// a fresh read gives, that a new version is never answered from an older one, and that access is
// decided on every request before anything kept is used.

const corn = { kind: 'crop' as const, crop: 'corn', rows: 8, rowSpacingIn: 30 };
const soybean = { kind: 'crop' as const, crop: 'soybean', rows: 8, rowSpacingIn: 30 };

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function event(user: SessionUser, path: string, params: Record<string, string>, headers: Record<string, string> = {}): any {
	const url = new URL(`http://127.0.0.1${path}`);
	return { locals: { user, session: null }, url, request: new Request(url, { headers }), params, route: { id: path }, parent: async () => ({}), depends: () => {}, setHeaders: () => {} };
}

async function setup() {
	const { farm, members } = await makeFarmWithTeam();
	const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
	const make = (name: string, west: number) =>
		createField(access, { name, boundary: rectangle(400, 900, west), exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
	const field = await make('Kept answers', -94.2);
	const other = await make('Granted elsewhere', -94.1);
	const [sw, , , nw] = field.boundary.coordinates[0] as [number, number][];
	const settings = { guidance: { a: sw, b: nw }, pattern: [corn, soybean], offsetFt: 0, headlandFt: 0, variant: 'main', assignments: [], notes: null, rebase: false };
	const plan = await savePlan(access, field.id, 2026, { ...settings, version: 0 });
	const params = { farmId: farm.id, fieldId: field.id, season: '2026' };
	return { farm, members, access, field, other, settings, plan, params, api: `/api/farms/${farm.id}/fields/${field.id}/plans/2026` };
}

let sql: string[] = [];
const onQuery = (q: { sql: string }) => sql.push(q.sql);
beforeEach(() => void db().on('query', onQuery));
afterEach(() => void db().removeListener('query', onQuery));

/** Reads until the membership and the stamp are answered from what is kept (no query goes out). */
async function warm(run: () => Response | Promise<Response>) {
	for (let i = 0; i < 40; i++) {
		sql = [];
		const res = await run();
		expect(res.status).toBe(200);
		if (sql.length === 0) return res;
		await new Promise((r) => setTimeout(r, 100)); // the setup's writes hold kept stamps back briefly
	}
	throw new Error('the plan stamp was never answered from what is kept');
}

describe('plan answers kept per version', () => {
	it('a repeat read, once nothing has been written for a moment, sends no query; the first read of another member asks for its membership', async () => {
		const { farm, members, params, api } = await setup();
		const read = async (run: () => Response | Promise<Response>) => {
			sql = [];
			expect((await run()).status).toBe(200);
			return [...sql];
		};
		// The setup's own writes hold the kept stamps back for a moment.
		let seen: string[] = ['not read yet'];
		for (let i = 0; i < 40 && seen.length !== 0; i++) {
			seen = await read(() => planJson(event(members.crew, api, params)));
			if (seen.length !== 0) await new Promise((r) => setTimeout(r, 100));
		}
		expect(seen).toEqual([]);
		await read(() => lanesGeojson(event(members.crew, `${api}/lanes.geojson`, params)));
		expect(await read(() => lanesGeojson(event(members.crew, `${api}/lanes.geojson`, params)))).toEqual([]);
		// Another member's read still asks for that member's own membership, and is refused.
		sql = [];
		expect((await planJson(event(members.viewer, api, params))).status).toBe(404);
		expect(sql.filter((q) => q.includes('"memberships"'))).toHaveLength(1);

		const page = `/farms/${farm.id}/fields/${params.fieldId}/plans/2026`;
		await planPage(event(members.crew, page, params));
		sql = [];
		await planPage(event(members.crew, page, params));
		expect(sql.filter((q) => q.includes('"plan_lanes"'))).toEqual([]);
		expect(sql.filter((q) => /from "fields"/.test(q))).toHaveLength(1);
	});

	it('a kept plan JSON body is byte for byte the fresh one, with its length', async () => {
		const { members, access, field, plan, params, api } = await setup();
		const cold = await planJson(event(members.owner, api, params));
		const coldText = await cold.text();
		const warm = await planJson(event(members.crew, api, params));
		const warmText = await warm.text();
		expect(warm.status).toBe(200);
		expect(warmText).toBe(coldText);
		expect(warm.headers.get('content-length')).toBe(String(Buffer.byteLength(warmText)));
		expect(warm.headers.get('etag')).toBe(cold.headers.get('etag'));
		// The same as serialising a fresh read, and as what the save returned.
		expect(warmText).toBe(JSON.stringify(await getPlan(access, field.id, 2026)));
		const lanes = JSON.parse(warmText).lanes as { index: number; crop: string; geometry: unknown }[];
		expect(lanes.map((l) => [l.index, l.crop, l.geometry])).toEqual(plan.lanes.map((l) => [l.index, l.crop, l.geometry]));
	});

	it('a new version is answered with its own lanes and tag, never the kept older body', async () => {
		const { members, access, field, settings, plan, params, api } = await setup();
		const before = await warm(() => planJson(event(members.crew, api, params)));
		const oldTag = before.headers.get('etag')!;
		const oldBody = await before.json();
		const next = await savePlan(access, field.id, 2026, { ...settings, offsetFt: 10, version: plan.version });
		expect(next.version).toBe(plan.version + 1);
		const after = await planJson(event(members.crew, api, params, { 'if-none-match': oldTag }));
		expect(after.status).toBe(200);
		expect(after.headers.get('etag')).not.toBe(oldTag);
		const body = await after.json();
		expect(body.version).toBe(next.version);
		expect(body.offsetFt).toBe(10);
		expect(body.lanes[0].geometry).toEqual(next.lanes[0].geometry);
		expect(body.lanes[0].geometry).not.toEqual(oldBody.lanes[0].geometry);
		// lanes.geojson follows the same version.
		const geo = await (await lanesGeojson(event(members.crew, `${api}/lanes.geojson`, params))).json();
		expect(geo.features.filter((f: { properties: { feature: string } }) => f.properties.feature === 'lane')).toHaveLength(next.lanes.length);
	});

	it('answers 304 only to the current tag, and a weak or listed tag matches too', async () => {
		const { members, params, api } = await setup();
		const first = await planJson(event(members.crew, api, params));
		const tag = first.headers.get('etag')!;
		expect((await planJson(event(members.crew, api, params, { 'if-none-match': tag }))).status).toBe(304);
		expect((await planJson(event(members.crew, api, params, { 'if-none-match': `"other", ${tag}` }))).status).toBe(304);
		expect((await planJson(event(members.crew, api, params, { 'if-none-match': tag.replace(/-v1a-/, '-v2a-') }))).status).toBe(200);
		const geo = await lanesGeojson(event(members.crew, `${api}/lanes.geojson`, params));
		const geoTag = geo.headers.get('etag')!;
		expect(geoTag).not.toBe(tag);
		expect((await lanesGeojson(event(members.crew, `${api}/lanes.geojson`, params, { 'if-none-match': geoTag }))).status).toBe(304);
		// A plan JSON tag does not stand for the GeoJSON body.
		expect((await lanesGeojson(event(members.crew, `${api}/lanes.geojson`, params, { 'if-none-match': tag }))).status).toBe(200);
	});

	it('a viewer not granted the field gets 404 after the owner warmed every kept answer; once granted, the same body', async () => {
		const { farm, members, other, params, api } = await setup();
		await db()('memberships').where({ farm_id: farm.id, user_id: members.viewer.id }).update({ field_scope: [other.id] });
		const warm = await planJson(event(members.owner, api, params));
		const warmText = await warm.text();
		const tag = warm.headers.get('etag')!;
		const geoTag = (await lanesGeojson(event(members.owner, `${api}/lanes.geojson`, params))).headers.get('etag')!;
		expect(((await planPage(event(members.owner, `/farms/${farm.id}/fields/${params.fieldId}/plans/2026`, params))) as { plan: unknown }).plan).toBeTruthy();

		for (const headers of [{}, { 'if-none-match': tag }] as Record<string, string>[]) {
			const refused = await planJson(event(members.viewer, api, params, headers));
			expect(refused.status).toBe(404);
			expect((await refused.json()).error.code).toBe('not_found');
		}
		for (const headers of [{}, { 'if-none-match': geoTag }] as Record<string, string>[]) {
			const refused = await lanesGeojson(event(members.viewer, `${api}/lanes.geojson`, params, headers));
			expect(refused.status).toBe(404);
			expect(await refused.text()).not.toContain('"FeatureCollection"');
		}
		const page = await Promise.resolve(planPage(event(members.viewer, `/farms/${farm.id}/fields/${params.fieldId}/plans/2026`, params))).then(
			() => null,
			(e: { status: number }) => e.status
		);
		expect(page).toBe(404);

		await db()('memberships').where({ farm_id: farm.id, user_id: members.viewer.id }).update({ field_scope: [other.id, params.fieldId] });
		const granted = await planJson(event(members.viewer, api, params));
		expect(granted.status).toBe(200);
		expect(await granted.text()).toBe(warmText);
	});

	it('a kept stamp gives way at once to an adopted variant, a renamed field and a deleted field', async () => {
		const { members, access, field, settings, params, api } = await setup();
		const trial = await savePlan(access, field.id, 2026, { ...settings, variant: 'trial', offsetFt: 10, version: 0 });
		const main = await warm(() => planJson(event(members.crew, api, params)));
		expect((await main.json()).variant).toBe('main');
		await adoptVariant(access, field.id, 2026, 'trial');
		const adopted = await planJson(event(members.crew, api, params));
		expect((await adopted.json()).id).toBe(trial.id);

		const geo = await warm(() => lanesGeojson(event(members.crew, `${api}/lanes.geojson`, params)));
		expect(geo.headers.get('content-disposition')).toContain('Kept-answers-2026');
		await updateField(access, field.id, { name: 'Renamed strip field', version: field.version });
		const renamed = await lanesGeojson(event(members.crew, `${api}/lanes.geojson`, params, { 'if-none-match': geo.headers.get('etag')! }));
		expect(renamed.status).toBe(200);
		expect(renamed.headers.get('content-disposition')).toContain('Renamed-strip-field-2026');

		await warm(() => planJson(event(members.crew, api, params)));
		await deleteField(access, field.id);
		expect((await planJson(event(members.crew, api, params))).status).toBe(404);
		expect((await lanesGeojson(event(members.crew, `${api}/lanes.geojson`, params))).status).toBe(404);
	});

	it('a reader that changes the lanes it got does not change what the next reader gets', async () => {
		const { access, field, plan } = await setup();
		const first = await getPlan(access, field.id, 2026);
		const ring = (first.lanes[0].geometry.coordinates[0] as number[][])[0];
		ring[0] = 0;
		first.lanes[0].crop = 'changed';
		const second = await getPlan(access, field.id, 2026);
		expect(second.lanes[0].crop).toBe(plan.lanes[0].crop);
		expect(second.lanes[0].geometry).toEqual(plan.lanes[0].geometry);
	});
});
