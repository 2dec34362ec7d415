// A farm of the test's own with a field whose adopted plan alternates corn and pasture lanes.
import { createField } from '$lib/server/fields';
import { savePlan } from '$lib/server/plans';
import { requireMember } from '$lib/server/access';
import type { SessionUser } from '$lib/server/auth';
import { fakeEvent, makeFarmWithTeam } from './helpers';
import { rectangle } from '../fixtures/rectangle';

export const CORN = { kind: 'crop' as const, crop: 'corn', rows: 8, rowSpacingIn: 30 };
export const PASTURE = { kind: 'pasture' as const, crop: 'pasture', widthFt: 10 };

/** A JSON request event as SvelteKit hands it to a +server.ts handler. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export function apiEvent(user: SessionUser, method: string, path: string, params: Record<string, string>, body?: unknown): any {
	const url = new URL(`http://127.0.0.1${path}`);
	const init: RequestInit = { method };
	if (body !== undefined) {
		init.headers = { 'content-type': 'application/json' };
		init.body = JSON.stringify(body);
	}
	return { locals: { user, session: null }, url, params, request: new Request(url, init), route: { id: path } };
}

export async function livestockFarm() {
	const { farm, members } = await makeFarmWithTeam();
	const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
	const boundary = rectangle(300, 1320, -94.23, 43.9);
	const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
	const field = await createField(access, { name: 'Lane pasture', boundary, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
	const plan = await savePlan(access, field.id, 2026, { guidance: { a: sw, b: nw }, pattern: [CORN, PASTURE] as never, offsetFt: 0, headlandFt: 30, variant: 'main', version: 0, assignments: [], notes: null, rebase: false });
	const pastureLanes = plan.lanes.filter((l) => l.kind === 'pasture').map((l) => l.index);
	const cropLanes = plan.lanes.filter((l) => l.kind === 'crop').map((l) => l.index);
	return { farm, members, access, field, plan, pastureLanes, cropLanes };
}
