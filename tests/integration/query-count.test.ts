import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createField } from '$lib/server/fields';
import { savePlan } from '$lib/server/plans';
import { createEquipment } from '$lib/server/equipment';
import { equipmentSchema } from '$lib/schemas/equipment';
import { requireMember } from '$lib/server/access';
import { db } from '$lib/server/db';
import type { SessionUser } from '$lib/server/auth';
import { GET as planJson } from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/plans/[season]/+server';
import { GET as lanesGeojson } from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/plans/[season]/lanes.geojson/+server';
import { load as planPage } from '../../src/routes/(app)/farms/[farmId]/fields/[fieldId]/plans/[season]/+page.server';
import { load as fieldsPage } from '../../src/routes/(app)/farms/[farmId]/fields/+page.server';
import { load as comparePage } from '../../src/routes/(app)/farms/[farmId]/fields/[fieldId]/compare/+page.server';
import { fakeEvent, makeFarmWithTeam } from './helpers';
import { rectangle } from '../fixtures/rectangle';

// Counts the SQL statements a request sends, through Knex's own query event: a page whose count
// grows with its lanes or fields is running one query per row.

let sql: string[] = [];
const onQuery = (q: { sql: string }) => sql.push(q.sql);
beforeEach(() => void db().on('query', onQuery));
afterEach(() => void db().removeListener('query', onQuery));

async function count(run: () => Promise<unknown>): Promise<number> {
	sql = [];
	await run();
	return sql.length;
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function event(user: SessionUser, path: string, params: Record<string, string>, search = ''): any {
	const url = new URL(`http://127.0.0.1${path}${search}`);
	return { locals: { user, session: null }, url, params, request: new Request(url), route: { id: path }, parent: async () => ({}), depends: () => {}, setHeaders: () => {} };
}

/** A farm with a planter and a field `widthFt` wide (199 ft: ten lanes, the last 19 ft), planned for two seasons in 20-ft lanes. */
async function plannedField(widthFt: number) {
	const { farm, members } = await makeFarmWithTeam();
	const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
	const boundary = rectangle(widthFt, 600);
	const field = await createField(access, { name: `Wide ${widthFt}`, boundary, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
	const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
	const settings = {
		guidance: { a: sw, b: nw },
		pattern: [{ kind: 'crop' as const, crop: 'corn', rows: 8, rowSpacingIn: 30 }, { kind: 'crop' as const, crop: 'soybean', rows: 8, rowSpacingIn: 30 }],
		offsetFt: 0, headlandFt: 0, variant: 'main', notes: null, rebase: false, version: 0
	};
	const assign = (n: number) => Array.from({ length: n }, (_, i) => ({ laneIndex: i, variety: `hybrid ${i % 3}`, relativeMaturity: 104, populationPerAcre: 34_000, seedLot: null, trialLabel: null, notes: null }));
	const first = await savePlan(access, field.id, 2026, { ...settings, assignments: [] });
	await savePlan(access, field.id, 2027, { ...settings, offsetFt: 20, assignments: assign(first.lanes.length) });
	const rows = Array.from({ length: 16 }, (_, i) => ({ unit: i + 1, seed: { crop: i < 8 ? 'corn' : 'soybean', variety: null }, fertilizerOn: [] }));
	await createEquipment(access, equipmentSchema.parse({ name: 'Planter', kind: 'planter', isDefaultPlanter: true, planter: { rowSpacingIn: 30, rowUnits: rows, fertilizerLines: [] } }));
	const params = { farmId: farm.id, fieldId: field.id, season: '2027' };
	const api = `/api/farms/${farm.id}/fields/${field.id}/plans/2027`;
	const page = `/farms/${farm.id}/fields/${field.id}/plans/2027`;
	return {
		lanes: first.lanes.length,
		plan: () => count(async () => expect((await planJson(event(members.crew, api, params))).status).toBe(200)),
		geojson: () => count(async () => expect((await lanesGeojson(event(members.crew, `${api}/lanes.geojson`, params))).status).toBe(200)),
		page: () => count(async () => expect(((await planPage(event(members.crew, page, params))) as { plan: { lanes: unknown[] } }).plan.lanes).toHaveLength(first.lanes.length)),
		compare: () => count(async () => expect(await comparePage(event(members.crew, `/farms/${farm.id}/fields/${field.id}/compare`, params, '?a=2026&b=2027'))).toBeTruthy())
	};
}

async function farmWithFields(n: number) {
	const { farm, members } = await makeFarmWithTeam();
	const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
	for (let i = 0; i < n; i++) {
		await createField(access, { name: `Field ${i + 1}`, boundary: rectangle(300, 300, -94.2 + i * 0.01), exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
	}
	return () => count(async () => expect(((await fieldsPage(event(members.crew, `/farms/${farm.id}/fields`, { farmId: farm.id }))) as { fields: unknown[] }).fields).toHaveLength(n));
}

describe('queries per request do not grow with the data', () => {
	it('plan JSON, lanes.geojson, the plan page and compare: the same count for 10 lanes and 200', async () => {
		const small = await plannedField(199);
		const large = await plannedField(3990);
		expect(small.lanes).toBe(10);
		expect(large.lanes).toBe(200);
		const counts = {
			plan: [await small.plan(), await large.plan()],
			geojson: [await small.geojson(), await large.geojson()],
			page: [await small.page(), await large.page()],
			compare: [await small.compare(), await large.compare()]
		};
		for (const [what, [few, many]] of Object.entries(counts)) expect(many, what).toBe(few);
		// Membership, the plan's version stamp, plan row, lanes: a few statements whatever its size.
		expect(counts.plan[0]).toBeLessThanOrEqual(4);
		expect(counts.geojson[0]).toBeLessThanOrEqual(5); // and the field's name for the file
		expect(counts.page[0]).toBeLessThanOrEqual(16);
	}, 60_000);

	it("a page read asks for the membership once for the layout's and the page's loads; a write asks each time", async () => {
		const { farm, members } = await makeFarmWithTeam();
		const path = `/farms/${farm.id}/fields`;
		const read = event(members.crew, path, { farmId: farm.id });
		const memberships = () => sql.filter((q) => q.includes('"memberships"')).length;
		await count(async () => {
			const [a, b] = await Promise.all([requireMember(read, farm.id), requireMember({ ...read }, farm.id)]);
			expect([a.role, b.role]).toEqual(['crew', 'crew']);
		});
		expect(memberships()).toBe(1);
		const write = { ...read, request: new Request(read.url, { method: 'POST' }) };
		await count(async () => {
			await requireMember(write, farm.id);
			await requireMember(write, farm.id);
		});
		expect(memberships()).toBe(2);
		// Another request (its own locals) reads afresh.
		await count(() => requireMember(event(members.crew, path, { farmId: farm.id }), farm.id));
		expect(memberships()).toBe(1);
	});

	it('the fields page: the same count for 2 fields and 20', async () => {
		const two = await farmWithFields(2);
		const twenty = await farmWithFields(20);
		const [few, many] = [await two(), await twenty()];
		expect(many).toBe(few);
		expect(few).toBe(2); // membership, fields
	}, 60_000);
});
