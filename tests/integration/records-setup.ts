// Shared set-up for the record book tests: a farm with one member per role, a 650 × 1,320 ft field
// whose adopted plan has 20-ft lanes (8 rows × 30 in, corn and soybean by turns), products of its
// own, and the record routes called as the server calls them.
import { randomUUID } from 'node:crypto';
import { createField } from '$lib/server/fields';
import { savePlan } from '$lib/server/plans';
import { requireMember } from '$lib/server/access';
import { db } from '$lib/server/db';
import type { SessionUser } from '$lib/server/auth';
import type { LaneSpec } from '$lib/geometry/index';
import { makeFarmWithTeam } from './helpers';
import { rectangle } from '../fixtures/rectangle';
import * as listRoute from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/seasons/[season]/records/+server';
import * as oneRoute from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/seasons/[season]/records/[recordId]/+server';
import * as restoreRoute from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/seasons/[season]/records/[recordId]/restore/+server';
import * as restrictionsRoute from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/seasons/[season]/restrictions/+server';
import * as csvRoute from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/seasons/[season]/records.csv/+server';

export const routes = { listRoute, oneRoute, restoreRoute, restrictionsRoute, csvRoute };

/** The season of work done lately (records cannot be dated in the future). */
export const THIS_SEASON = new Date().getUTCFullYear();

export const cornSoy: LaneSpec[] = [
	{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 },
	{ kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 }
];

/** A farm with its team, a field with an adopted plan for `season`, and four products of its own. */
export async function recordFarm(season = THIS_SEASON) {
	const { farm, members } = await makeFarmWithTeam();
	const access = await requireMember(event(members.owner), farm.id, 'editPlans');
	const boundary = rectangle(650, 1320);
	const field = await createField(access, { name: 'Record test', boundary, exclusions: [], farmNumber: '1234', tractNumber: '56', fieldNumber: '3', landlord: null, notes: null });
	const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
	const plan = await savePlan(access, field.id, season, { guidance: { a: sw, b: nw }, pattern: cornSoy, offsetFt: 0, headlandFt: 0, variant: 'main', assignments: [], notes: null, rebase: false, version: 0 });
	const product = async (values: Record<string, unknown>) =>
		(await db()('products').insert({ farm_id: farm.id, created_by: members.owner.id, ...values }).returning('id'))[0].id as string;
	const products = {
		herbicide: await product({ name: `residual herbicide A ${randomUUID().slice(0, 4)}`, kind: 'herbicide', unit: 'pt', epa_reg_no: '00000-111', rei_hours: 12, phi_days: 30, grazing_days: 14 }),
		fungicide: await product({ name: 'fungicide D', kind: 'fungicide', unit: 'fl oz', epa_reg_no: '00000-444', rei_hours: 24, phi_days: 7, grazing_days: null }),
		rup: await product({ name: 'insecticide C', kind: 'insecticide', unit: 'fl oz', epa_reg_no: '00000-333', restricted_use: true, rei_hours: 48, phi_days: 21, grazing_days: 30 }),
		rupNoEpa: await product({ name: 'insecticide without number', kind: 'insecticide', unit: 'fl oz', restricted_use: true, rei_hours: 24 }),
		uan: await product({ name: 'UAN 32 %', kind: 'fertilizer', unit: 'gal', analysis: '32-0-0' })
	};
	const params = { farmId: farm.id, fieldId: field.id, season: String(season) };
	return { farm, members, field, plan, access, products, params };
}

export function event(user: SessionUser | null, path = '/api/test', init: RequestInit = {}) {
	const url = new URL(`http://127.0.0.1${path}`);
	return { locals: { user, session: null }, url, request: new Request(url, init) };
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Handler = (event: any) => Response | Promise<Response>;

/** Calls a route handler as SvelteKit would; answers status, parsed JSON (or text) and headers. */
export async function call(handler: Handler, user: SessionUser | null, params: Record<string, string>, opts: { method?: string; json?: unknown; query?: string } = {}) {
	const path = `/api/x${opts.query ? `?${opts.query}` : ''}`;
	const init: RequestInit = { method: opts.method ?? 'GET', headers: {} };
	if (opts.json !== undefined) {
		init.body = JSON.stringify(opts.json);
		(init.headers as Record<string, string>)['content-type'] = 'application/json';
	}
	const res = await handler({ ...event(user, path, init), params });
	const type = res.headers.get('content-type') ?? '';
	// eslint-disable-next-line @typescript-eslint/no-explicit-any
	const body: any = type.includes('json') ? await res.json() : await res.text();
	return { status: res.status, body, headers: res.headers };
}

/** An ISO time `hours` before now. */
export const hoursAgo = (hours: number) => new Date(Date.now() - hours * 3_600_000).toISOString();

/** How many operations the field has, deleted or not: nothing half-written shows here. */
export async function operationCount(fieldId: string): Promise<number> {
	return Number((await db()('operations').where({ field_id: fieldId }).count('* as n').first())?.n ?? 0);
}
