import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { requireMember } from '$lib/server/access';
import { AppError } from '$lib/server/errors';
import { zodFields } from '$lib/server/api';
import { createEquipment, deleteEquipment, findPlanter, getEquipment, listEquipment, updateEquipment } from '$lib/server/equipment';
import { equipmentSchema, type EquipmentInput } from '$lib/schemas/equipment';
import type { PlanterSetup, RowUnit } from '$lib/equipment/types';
import type { SessionUser } from '$lib/server/auth';
import { actions as newActions } from '../../src/routes/(app)/farms/[farmId]/equipment/new/+page.server';
import { actions as itemActions, load as itemLoad } from '../../src/routes/(app)/farms/[farmId]/equipment/[equipmentId]/+page.server';
import { fakeEvent, makeFarmWithTeam, thrown } from './helpers';

/** Units 1…n: the first `cornUnits` carry corn with the nitrogen line on, the rest soybean. */
function planterSetup(n: number, spacingIn: number, cornUnits: number): PlanterSetup {
	const rowUnits: RowUnit[] = Array.from({ length: n }, (_, i) => ({
		unit: i + 1,
		seed: i < cornUnits ? { crop: 'corn', variety: 'hybrid A' } : { crop: 'soybean', variety: null },
		fertilizerOn: i < cornUnits ? ['n'] : []
	}));
	return {
		rowSpacingIn: spacingIn,
		rowUnits,
		fertilizerLines: [{ id: 'n', name: 'Nitrogen', product: 'UAN 32 %', forCrops: ['corn'], gallonsPerAcre: 15, poundsPerGallon: 11.06, percentN: 32 }]
	};
}

function input(over: Partial<Record<keyof EquipmentInput, unknown>>): EquipmentInput {
	return equipmentSchema.parse({ name: 'Implement', kind: 'drill', workingWidthFt: 15, ...over });
}

async function farmAccess() {
	const { farm, members } = await makeFarmWithTeam();
	const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
	return { farm, members, access };
}

/** A SvelteKit action event posting the form as a browser would. */
function postEvent(user: SessionUser, path: string, params: Record<string, string>, form: Record<string, string>) {
	const url = new URL(`http://127.0.0.1${path}`);
	const body = new FormData();
	for (const [k, v] of Object.entries(form)) body.set(k, v);
	// eslint-disable-next-line @typescript-eslint/no-explicit-any
	return { locals: { user, session: null }, url, params, request: new Request(url, { method: 'POST', body }) } as any;
}

describe('equipment', () => {
	it('creates, lists by kind, updates with a version and soft-deletes', async () => {
		const { access } = await farmAccess();
		const planter = await createEquipment(access, input({ name: '16-row planter', kind: 'planter', workingWidthFt: undefined, planter: planterSetup(16, 30, 8) }));
		// 16 units × 30 in ÷ 12 = 40 ft; rows follow the units.
		expect(planter.workingWidthFt).toBe(40);
		expect(planter.rows).toBe(16);
		expect(planter.version).toBe(1);
		expect(planter.planter!.fertilizerLines[0]).toMatchObject({ id: 'n', gallonsPerAcre: 15, poundsPerGallon: 11.06, percentN: 32 });
		const sprayer = await createEquipment(access, input({ name: 'Sprayer', kind: 'sprayer', workingWidthFt: 90, sections: 9 }));
		await createEquipment(access, input({ name: 'Hog hut', kind: 'shelter', workingWidthFt: 12, lengthFt: 24 }));
		await createEquipment(access, input({ name: 'Eight-row head', kind: 'combine_head', workingWidthFt: 20, rows: 8 }));

		const list = await listEquipment(access);
		expect(list.map((e) => [e.kind, e.name, e.workingWidthFt])).toEqual([
			['combine_head', 'Eight-row head', 20],
			['planter', '16-row planter', 40],
			['shelter', 'Hog hut', 12],
			['sprayer', 'Sprayer', 90]
		]);
		expect(list.find((e) => e.kind === 'shelter')!.lengthFt).toBe(24);
		expect(list.find((e) => e.kind === 'combine_head')!.rows).toBe(8);

		const wider = await updateEquipment(access, sprayer.id, input({ name: 'Sprayer', kind: 'sprayer', workingWidthFt: 120, sections: 12, version: 1 }));
		expect(wider).toMatchObject({ workingWidthFt: 120, sections: 12, version: 2 });
		const audit = await db()('audit_log').where({ entity: 'equipment', entity_id: sprayer.id }).orderBy('id');
		expect(audit.map((a) => a.action)).toEqual(['create', 'update']);

		await deleteEquipment(access, sprayer.id);
		expect((await listEquipment(access)).map((e) => e.name)).not.toContain('Sprayer');
		const gone = await thrown(() => getEquipment(access, sprayer.id));
		expect(gone.status).toBe(404);
		// Soft: the row is still there for the history.
		expect((await db()('equipment').where({ id: sprayer.id }).first()).deleted_at).not.toBeNull();
	});

	it('refuses a stale version with 409 and overwrites nothing', async () => {
		const { access } = await farmAccess();
		const drill = await createEquipment(access, input({ name: 'Drill', workingWidthFt: 15 }));
		await updateEquipment(access, drill.id, input({ name: 'Drill', workingWidthFt: 20, version: 1 }));
		const e = await thrown(() => updateEquipment(access, drill.id, input({ name: 'Drill renamed', workingWidthFt: 30, version: 1 })));
		expect(e).toBeInstanceOf(AppError);
		expect(e.status).toBe(409);
		expect((e as unknown as AppError).message).toMatch(/Someone else saved this implement after you opened it \(version 2, yours 1\)\. .*nothing of yours was saved/);
		const stored = await getEquipment(access, drill.id);
		expect(stored).toMatchObject({ name: 'Drill', workingWidthFt: 20, version: 2 });
	});

	it('refuses a duplicate name in the same farm, whatever the case, and frees it on delete', async () => {
		const { access } = await farmAccess();
		const first = await createEquipment(access, input({ name: 'Grain drill' }));
		const e = (await thrown(() => createEquipment(access, input({ name: 'GRAIN DRILL' })))) as unknown as AppError;
		expect(e.status).toBe(400);
		expect(e.fields).toEqual({ name: ['The farm already has an implement named GRAIN DRILL.'] });
		const other = await createEquipment(access, input({ name: 'Other drill' }));
		const renamed = (await thrown(() => updateEquipment(access, other.id, input({ name: 'Grain drill', version: 1 })))) as unknown as AppError;
		expect(renamed.status).toBe(400);
		expect((await getEquipment(access, other.id)).name).toBe('Other drill');
		// Another farm may use the same name.
		const { access: elsewhere } = await farmAccess();
		expect((await createEquipment(elsewhere, input({ name: 'Grain drill' }))).name).toBe('Grain drill');
		await deleteEquipment(access, first.id);
		expect((await createEquipment(access, input({ name: 'Grain drill' }))).version).toBe(1);
	});

	it('keeps one default planter per farm: a new default takes the mark from the old one', async () => {
		const { access } = await farmAccess();
		const planter = (name: string, isDefaultPlanter: boolean) =>
			input({ name, kind: 'planter', workingWidthFt: undefined, planter: planterSetup(12, 30, 6), isDefaultPlanter });
		const a = await createEquipment(access, planter('Planter A', true));
		const b = await createEquipment(access, planter('Planter B', true));
		const defaults = async () => (await listEquipment(access)).filter((e) => e.isDefaultPlanter).map((e) => e.name);
		expect(await defaults()).toEqual(['Planter B']);
		expect((await findPlanter(access))!.id).toBe(b.id);
		await updateEquipment(access, a.id, { ...planter('Planter A', true), version: 1 });
		expect(await defaults()).toEqual(['Planter A']);
		// The database itself refuses a second default, whatever the code path.
		const direct = await thrown(() => db()('equipment').where({ id: b.id }).update({ is_default_planter: true }));
		expect((direct as unknown as { constraint: string }).constraint).toBe('equipment_default_planter_key');
		await deleteEquipment(access, a.id);
		expect(await defaults()).toEqual([]);
		// Only a planter may carry the mark.
		const drill = equipmentSchema.safeParse({ name: 'Drill', kind: 'drill', workingWidthFt: 15, isDefaultPlanter: true });
		expect(drill.success).toBe(false);
		expect(zodFields(drill.error!)).toEqual({ isDefaultPlanter: ['Only a planter can be the default planter.'] });
	});

	it('refuses setups the sheet could not trust, each message at the input that caused it', () => {
		const fields = (value: unknown) => {
			const r = equipmentSchema.safeParse(value);
			expect(r.success).toBe(false);
			return zodFields(r.error!);
		};
		expect(fields({ name: 'P', kind: 'planter', planter: { rowSpacingIn: 30, rowUnits: [], fertilizerLines: [] } })).toEqual({
			'planter.rowUnits': ['A planter needs at least one row unit.']
		});
		const gap = planterSetup(4, 30, 2);
		gap.rowUnits[2].unit = 4;
		gap.rowUnits[3].unit = 5;
		expect(fields({ name: 'P', kind: 'planter', planter: gap })).toEqual({
			'planter.rowUnits.2.unit': ["Row units are numbered 1 to 4 from the operator's left; unit 3 is numbered 4."],
			'planter.rowUnits.3.unit': ["Row units are numbered 1 to 4 from the operator's left; unit 4 is numbered 5."]
		});
		const ghost = planterSetup(4, 30, 2);
		ghost.rowUnits[3].fertilizerOn = ['starter'];
		expect(fields({ name: 'P', kind: 'planter', planter: ghost })).toEqual({
			'planter.rowUnits.3.fertilizerOn': ['Row unit 4 has line "starter" on, but there is no such fertilizer line.']
		});
		expect(fields({ name: 'Drill', kind: 'drill' })).toEqual({ workingWidthFt: ['Enter the working width in feet.'] });
		expect(fields({ name: 'Hut', kind: 'shelter', workingWidthFt: 12 })).toEqual({ lengthFt: ['Enter the shelter length in feet.'] });
		expect(fields({ name: 'Bar', kind: 'sidedress', workingWidthFt: 40 })).toEqual({ planter: ['A planter or side-dress bar needs its row units set up.'] });
		const heavy = planterSetup(2, 30, 2);
		heavy.fertilizerLines[0].poundsPerGallon = 20;
		expect(fields({ name: 'P', kind: 'planter', planter: heavy })).toEqual({ 'planter.fertilizerLines.0.poundsPerGallon': ['Liquid fertilizer weighs 5–15 lb/gal.'] });
	});

	it("answers 404 for another farm's farm id and implement id", async () => {
		const mine = await farmAccess();
		const theirs = await farmAccess();
		const theirDrill = await createEquipment(theirs.access, input({ name: 'Their drill' }));
		const farm = await thrown(() => requireMember(fakeEvent(mine.members.owner), theirs.farm.id, 'read'));
		expect(farm.status).toBe(404);
		for (const call of [() => getEquipment(mine.access, theirDrill.id), () => updateEquipment(mine.access, theirDrill.id, input({ name: 'Taken', version: 1 })), () => deleteEquipment(mine.access, theirDrill.id)]) {
			const e = await thrown(call);
			expect(e.status).toBe(404);
		}
		expect((await getEquipment(theirs.access, theirDrill.id)).name).toBe('Their drill');
		// The page itself answers 404 too, not a hint that the id exists.
		const page = await thrown(() => itemLoad({ ...fakeEvent(mine.members.owner), params: { farmId: mine.farm.id, equipmentId: theirDrill.id } } as never));
		expect(page.status).toBe(404);
	});
});

describe('equipment form actions', () => {
	const setupJson = (s: PlanterSetup) => JSON.stringify(s);

	it('saves a posted planter and redirects to the list', async () => {
		const { farm, members, access } = await farmAccess();
		const path = `/farms/${farm.id}/equipment/new`;
		const r = await thrown(() => newActions.create(postEvent(members.manager, path, { farmId: farm.id }, { name: 'Twelve-row', kind: 'planter', setup: setupJson(planterSetup(12, 30, 6)), isDefaultPlanter: 'on', workingWidthFt: '999', notes: '' })));
		expect(r.status).toBe(303);
		const [saved] = await listEquipment(access);
		expect(r.location).toBe(`/farms/${farm.id}/equipment?saved=${saved.id}`);
		// The width comes from the units, not from a stray width input.
		expect(saved).toMatchObject({ name: 'Twelve-row', kind: 'planter', workingWidthFt: 30, isDefaultPlanter: true });
	});

	it('answers a bad setup with 400 and messages keyed by the input, keeping what was typed', async () => {
		const { farm, members } = await farmAccess();
		const ghost = planterSetup(4, 30, 2);
		ghost.rowUnits[3].fertilizerOn = ['starter'];
		const event = postEvent(members.owner, `/farms/${farm.id}/equipment/new`, { farmId: farm.id }, { name: 'Bad plumbing', kind: 'planter', setup: setupJson(ghost) });
		const result = (await newActions.create(event)) as { status: number; data: { errors: Record<string, string[]>; values: { name: string } } };
		expect(result.status).toBe(400);
		expect(result.data.errors).toEqual({ 'planter.rowUnits.3.fertilizerOn': ['Row unit 4 has line "starter" on, but there is no such fertilizer line.'] });
		expect(result.data.values.name).toBe('Bad plumbing');

		const cases: [Record<string, string>, Record<string, string[]>][] = [
			[{ name: 'Drill', kind: 'drill', workingWidthFt: 'wide' }, { workingWidthFt: ['Enter the width as a number of feet, e.g. 30 or 12.5.'] }],
			[{ name: 'Drill', kind: 'drill', workingWidthFt: '' }, { workingWidthFt: ['Enter the working width in feet.'] }],
			[{ name: 'P', kind: 'planter', setup: '{"rowSpacingIn": 30,' }, { planter: [expect.stringMatching(/^The row-unit setup is not valid JSON: /) as unknown as string] }],
			[{ name: 'P', kind: 'planter', setup: JSON.stringify({ ...planterSetup(2, 30, 2), rowSpacingIn: null }) }, { 'planter.rowSpacingIn': ['Enter the row spacing in inches, e.g. 30.'] }],
			[{ name: 'Bar', kind: 'sidedress', setup: setupJson(planterSetup(2, 30, 1)) }, {
				'planter.rowUnits.0.seed': ["A side-dress toolbar carries no seed; set row unit 1's seed to null."],
				'planter.rowUnits.1.seed': ["A side-dress toolbar carries no seed; set row unit 2's seed to null."]
			}],
			[{ name: '', kind: 'tractor', workingWidthFt: '10' }, { name: ['Name the implement.'], kind: ['Choose what kind of implement it is.'] }]
		];
		for (const [form, errors] of cases) {
			const res = (await newActions.create(postEvent(members.owner, `/farms/${farm.id}/equipment/new`, { farmId: farm.id }, form))) as { status: number; data: { errors: unknown } };
			expect(res.status, JSON.stringify(form)).toBe(400);
			expect(res.data.errors, JSON.stringify(form)).toEqual(errors);
		}
		const { access } = { access: await requireMember(fakeEvent(members.owner), farm.id) };
		expect(await listEquipment(access)).toEqual([]);
	});

	it('refuses crew, advisor and viewer with 403 on every write action; a manager may delete', async () => {
		const { farm, members, access } = await farmAccess();
		const drill = await createEquipment(access, input({ name: 'Drill' }));
		for (const role of ['crew', 'advisor', 'viewer'] as const) {
			const create = await thrown(() => newActions.create(postEvent(members[role], `/farms/${farm.id}/equipment/new`, { farmId: farm.id }, { name: 'Sneaky', kind: 'drill', workingWidthFt: '10' })));
			expect(create.status, role).toBe(403);
			const params = { farmId: farm.id, equipmentId: drill.id };
			const save = await thrown(() => itemActions.save(postEvent(members[role], `/farms/${farm.id}/equipment/${drill.id}`, params, { name: 'Sneaky', kind: 'drill', workingWidthFt: '10', version: '1' })));
			expect(save.status, role).toBe(403);
			const del = await thrown(() => itemActions.delete(postEvent(members[role], `/farms/${farm.id}/equipment/${drill.id}`, params, {})));
			expect(del.status, role).toBe(403);
		}
		expect((await listEquipment(access)).map((e) => [e.name, e.version])).toEqual([['Drill', 1]]);
		const params = { farmId: farm.id, equipmentId: drill.id };
		const del = await thrown(() => itemActions.delete(postEvent(members.manager, `/farms/${farm.id}/equipment/${drill.id}`, params, {})));
		expect(del).toMatchObject({ status: 303, location: `/farms/${farm.id}/equipment?deleted=Drill` });
		expect(await listEquipment(access)).toEqual([]);
	});

	it('answers a stale edit with a 409 message and keeps the stored implement', async () => {
		const { farm, members, access } = await farmAccess();
		const drill = await createEquipment(access, input({ name: 'Drill', workingWidthFt: 15 }));
		await updateEquipment(access, drill.id, input({ name: 'Drill', workingWidthFt: 20, version: 1 }));
		const params = { farmId: farm.id, equipmentId: drill.id };
		const res = (await itemActions.save(postEvent(members.manager, `/farms/${farm.id}/equipment/${drill.id}`, params, { name: 'Drill', kind: 'drill', workingWidthFt: '40', version: '1' }))) as {
			status: number;
			data: { message: string; conflict: boolean; values: { workingWidthFt: string } };
		};
		expect(res.status).toBe(409);
		expect(res.data.conflict).toBe(true);
		expect(res.data.message).toContain('(version 2, yours 1)');
		expect(res.data.values.workingWidthFt).toBe('40');
		expect(await getEquipment(access, drill.id)).toMatchObject({ workingWidthFt: 20, version: 2 });
	});
});
