// A farm with two planned fields for the report, export and tour tests: "Wide rows" (12 rows of
// corn on 60-in centres beside 8 rows of soybean at 30 in) and "Strips" (8/8 corn and soybean).
import type { SessionUser } from '$lib/server/auth';
import { db } from '$lib/server/db';
import { requireMember } from '$lib/server/access';
import { createField } from '$lib/server/fields';
import { savePlan } from '$lib/server/plans';
import { fakeEvent, makeFarmWithTeam } from './helpers';
import { rectangle } from '../fixtures/rectangle';

export async function reportFarm(season = 2027) {
	const { farm, members } = await makeFarmWithTeam();
	const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
	const wideBoundary = rectangle(400, 900, -94.3, 43.91);
	const wide = await createField(access, {
		name: 'Wide rows', boundary: wideBoundary, exclusions: [], farmNumber: '4410', tractNumber: '1207', fieldNumber: '2', landlord: 'Landlord one', notes: null
	});
	const stripBoundary = rectangle(300, 700, -94.29, 43.915);
	const strips = await createField(access, {
		name: 'Strips', boundary: stripBoundary, exclusions: [], farmNumber: '4410', tractNumber: '1208', fieldNumber: '1', landlord: null, notes: null
	});
	const ab = (b: typeof wideBoundary) => {
		const [sw, , , nw] = b.coordinates[0] as [number, number][];
		return { a: sw, b: nw };
	};
	const base = { offsetFt: 0, headlandFt: 0, version: 0, variant: 'main', assignments: [], notes: null, rebase: false };
	const widePlan = await savePlan(access, wide.id, season, {
		...base,
		guidance: ab(wideBoundary),
		pattern: [{ kind: 'crop', crop: 'corn', rows: 12, rowSpacingIn: 60, twinSpacingIn: 8 }, { kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 }]
	});
	const stripPlan = await savePlan(access, strips.id, season, {
		...base,
		guidance: ab(stripBoundary),
		pattern: [{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }, { kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 }]
	});
	return { farm, members, access, wide, strips, widePlan, stripPlan, season };
}

/** Logs a record straight into the record book tables, lanes copied as the app copies them. */
export async function logOperation(s: Awaited<ReturnType<typeof reportFarm>>, fieldId: string, type: string, startedAt: string, laneIndexes: number[], by: SessionUser, products: { name: string; rate: number; rateUnit: string; totalUnit: string }[] = []) {
	const plan = await db()('plans').where({ field_id: fieldId, season: s.season, adopted: true }).whereNull('deleted_at').first();
	const lanes = await db()('plan_lanes').where({ plan_id: plan.id }).whereIn('lane_index', laneIndexes);
	const acres = lanes.reduce((sum, l) => sum + Number(l.acres), 0);
	const [op] = await db()('operations')
		.insert({ farm_id: s.farm.id, field_id: fieldId, season: s.season, plan_id: plan.id, plan_version: plan.version, type, started_at: startedAt, ended_at: startedAt, acres, created_by: by.id })
		.returning('*');
	await db()('operation_lanes').insert(
		lanes.map((l) => ({ farm_id: s.farm.id, operation_id: op.id, lane_index: l.lane_index, kind: l.kind, crop: l.crop, lane_acres: l.acres, acres: l.acres, geometry: JSON.stringify(l.geometry) }))
	);
	for (const [i, p] of products.entries()) {
		const [product] = await db()('products').insert({ farm_id: s.farm.id, name: `${p.name} ${op.id.slice(0, 6)}`, kind: 'fertilizer', unit: p.rateUnit.split('/')[0] }).returning('*');
		await db()('operation_products').insert({
			farm_id: s.farm.id, operation_id: op.id, product_id: product.id, position: i, rate: p.rate, rate_unit: p.rateUnit,
			total: p.rate * acres, total_unit: p.totalUnit, product_name: p.name, restricted_use: false
		});
	}
	return { id: op.id as string, acres };
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
export function routeEvent(user: SessionUser | null, path: string, params: Record<string, string>, method = 'GET', body?: unknown): any {
	const url = new URL(`http://127.0.0.1${path}`);
	const init: RequestInit = { method };
	if (body !== undefined) Object.assign(init, { headers: { 'content-type': 'application/json' }, body: typeof body === 'string' ? body : JSON.stringify(body) });
	return { locals: { user, session: null }, url, params, request: new Request(url, init), getClientAddress: () => '127.0.0.1' };
}
