// Lane assignments against the seed catalogue: a catalogue variety of another crop than the
// lane's is refused (by id or by name), free text the catalogue does not know is kept, and the
// plan is left as it was when anything is refused.
import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { createField } from '$lib/server/fields';
import { getPlan, savePlan } from '$lib/server/plans';
import { createVariety } from '$lib/server/varieties';
import { requireMember } from '$lib/server/access';
import type { SessionUser } from '$lib/server/auth';
import { PUT as putPlan } from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/plans/[season]/+server';
import { actions as planActions } from '../../src/routes/(app)/farms/[farmId]/fields/[fieldId]/plans/[season]/+page.server';
import { fakeEvent, makeFarmWithTeam } from './helpers';
import { rectangle } from '../fixtures/rectangle';

const corn = { kind: 'crop' as const, crop: 'corn', rows: 8, rowSpacingIn: 30 };
const soybean = { kind: 'crop' as const, crop: 'soybean', rows: 8, rowSpacingIn: 30 };

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function put(user: SessionUser, path: string, params: Record<string, string>, body: unknown): any {
	const url = new URL(`http://127.0.0.1${path}`);
	return { locals: { user, session: null }, url, params, request: new Request(url, { method: 'PUT', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) }) };
}

const seed = (laneIndex: number, variety: string | null, extra: Record<string, unknown> = {}) => ({ laneIndex, variety, relativeMaturity: null, populationPerAcre: 34_000, seedLot: null, trialLabel: null, notes: null, ...extra });

async function setup() {
	const { farm, members } = await makeFarmWithTeam();
	const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
	const boundary = rectangle(400, 1320);
	const field = await createField(access, { name: 'Seed check', boundary, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
	const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
	const settings = { guidance: { a: sw, b: nw }, pattern: [corn, soybean], headlandFt: 0, offsetFt: 0, variant: 'main', notes: null, rebase: false };
	const plan = await savePlan(access, field.id, 2026, { ...settings, version: 0, assignments: [] });
	const hybrid = await createVariety(access, { crop: 'corn', name: 'hybrid T', relativeMaturity: 104, seedsPerUnit: 80_000, traits: null, notes: null });
	const line = await createVariety(access, { crop: 'soybean', name: 'line T', relativeMaturity: 2, seedsPerUnit: 140_000, traits: null, notes: null });
	const cornLane = plan.lanes.find((l) => l.crop === 'corn')!.index;
	const soyLane = plan.lanes.find((l) => l.crop === 'soybean')!.index;
	const params = { farmId: farm.id, fieldId: field.id, season: '2026' };
	const path = `/api/farms/${farm.id}/fields/${field.id}/plans/2026`;
	return { farm, members, access, field, settings, plan, hybrid, line, cornLane, soyLane, params, path };
}

describe('plan PUT checks lane varieties against the seed catalogue', () => {
	it('a soybean line named on a corn lane answers 400 with a field error naming both crops, and nothing changes', async () => {
		const { members, access, field, settings, cornLane, soyLane, params, path } = await setup();
		const res = await putPlan(put(members.manager, path, params, { ...settings, version: 1, assignments: [seed(soyLane, 'line T', { populationPerAcre: 140_000 }), seed(cornLane, 'LINE t')] }));
		expect(res.status).toBe(400);
		const { error } = await res.json();
		expect(error.code).toBe('invalid');
		const message = `Lane ${cornLane + 1} is a corn lane, but "line T" is a soybean variety in the seed catalogue. Choose a corn variety, or change the lane's crop.`;
		expect(error.message).toBe(message);
		expect(error.fields).toEqual({ 'assignments.1.variety': [message] });
		const stored = await getPlan(access, field.id, 2026);
		expect(stored.version).toBe(1);
		expect(stored.lanes.every((l) => l.assignment === null)).toBe(true);
		expect(await db()('plan_lanes').where({ plan_id: stored.id }).whereNotNull('variety').count('* as n').first()).toEqual({ n: 0 });
	});

	it('a variety picked by id of another crop is refused; of the lane\'s crop it is saved under its catalogue name', async () => {
		const { members, access, field, settings, hybrid, line, cornLane, soyLane, params, path } = await setup();
		const wrong = await putPlan(put(members.owner, path, params, { ...settings, version: 1, assignments: [seed(soyLane, null, { varietyId: hybrid.id })] }));
		expect(wrong.status).toBe(400);
		expect((await wrong.json()).error.fields).toEqual({
			'assignments.0.variety': [`Lane ${soyLane + 1} is a soybean lane, but "hybrid T" is a corn variety in the seed catalogue. Choose a soybean variety, or change the lane's crop.`]
		});

		const right = await putPlan(put(members.owner, path, params, { ...settings, version: 1, assignments: [seed(cornLane, null, { varietyId: hybrid.id }), seed(soyLane, 'typed over', { varietyId: line.id, populationPerAcre: 140_000 })] }));
		expect(right.status).toBe(200);
		const body = await right.json();
		expect(body.version).toBe(2);
		expect(body.assignments).toEqual([seed(cornLane, 'hybrid T'), seed(soyLane, 'line T', { populationPerAcre: 140_000 })]);
		const stored = await getPlan(access, field.id, 2026);
		expect(stored.lanes.find((l) => l.index === cornLane)!.assignment!.variety).toBe('hybrid T');
		expect(stored.lanes.find((l) => l.index === soyLane)!.assignment!.variety).toBe('line T');
	});

	it('an id that is not in this farm\'s catalogue is a 400 on varietyId', async () => {
		const { members, settings, cornLane, params, path } = await setup();
		const other = await setup();
		const res = await putPlan(put(members.owner, path, params, { ...settings, version: 1, assignments: [seed(cornLane, null, { varietyId: other.hybrid.id })] }));
		expect(res.status).toBe(400);
		expect(Object.keys((await res.json()).error.fields)).toEqual(['assignments.0.varietyId']);
	});

	it('free text the catalogue does not know is kept on any lane; a name two crops share passes on either', async () => {
		const { members, access, settings, cornLane, soyLane, params, path } = await setup();
		await createVariety(access, { crop: 'soybean', name: 'hybrid T', relativeMaturity: null, seedsPerUnit: null, traits: null, notes: null });
		const res = await putPlan(put(members.owner, path, params, { ...settings, version: 1, assignments: [seed(cornLane, 'hybrid T'), seed(soyLane, 'a line from the neighbour', { populationPerAcre: 140_000 })] }));
		expect(res.status).toBe(200);
		expect((await res.json()).assignments.map((a: { variety: string }) => a.variety)).toEqual(['hybrid T', 'a line from the neighbour']);
	});

	it('a deleted catalogue entry no longer refuses its name', async () => {
		const { members, settings, cornLane, line, params, path } = await setup();
		await db()('varieties').where({ id: line.id }).update({ deleted_at: new Date() });
		const res = await putPlan(put(members.owner, path, params, { ...settings, version: 1, assignments: [seed(cornLane, 'line T')] }));
		expect(res.status).toBe(200);
	});

	it('the plan page save action refuses the same way with the message for the page', async () => {
		const { farm, members, field, settings, cornLane } = await setup();
		const url = new URL(`http://127.0.0.1/farms/${farm.id}/fields/${field.id}/plans/2026?/save`);
		const body = new FormData();
		body.set('settings', JSON.stringify({ ...settings, version: 1, assignments: [seed(cornLane, 'line T')] }));
		const result = (await planActions.save({ locals: { user: members.owner, session: null }, url, params: { farmId: farm.id, fieldId: field.id, season: '2026' }, request: new Request(url, { method: 'POST', body }) } as never)) as { status: number; data: { actionError: string } };
		expect(result.status).toBe(400);
		expect(result.data.actionError).toBe(`Lane ${cornLane + 1} is a corn lane, but "line T" is a soybean variety in the seed catalogue. Choose a corn variety, or change the lane's crop.`);
	});
});
