import { describe, expect, it } from 'vitest';
import { createField, updateField } from '$lib/server/fields';
import { adoptVariant, getPlan, listPlans, planNextSeason, savePlan } from '$lib/server/plans';
import { requireMember } from '$lib/server/access';
import { db } from '$lib/server/db';
import { fakeEvent, makeFarmWithTeam, thrown } from './helpers';
import type { LaneSpec } from '$lib/geometry/index';
import { rectangle } from '../fixtures/rectangle';

// A 650 × 1,320 ft rectangle near 43.9 N (local offsets; the plan is what is tested here).

const cornSoy: LaneSpec[] = [
	{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 },
	{ kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 }
];

async function setup() {
	const { farm, members } = await makeFarmWithTeam();
	const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
	const boundary = rectangle(650, 1320);
	const field = await createField(access, { name: 'Strip test', boundary, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
	const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
	const settings = { guidance: { a: sw, b: nw }, pattern: cornSoy, offsetFt: 0, headlandFt: 0, variant: 'main', assignments: [], notes: null, rebase: false };
	return { access, field, settings, members, farm };
}

describe('plans', () => {
	it('creates the adopted plan with version 0, then increments; a stale version changes nothing', async () => {
		const { access, field, settings } = await setup();
		const first = await savePlan(access, field.id, 2027, { ...settings, version: 0 });
		expect(first.version).toBe(1);
		expect(first.adopted).toBe(true);
		// 650 ft ÷ 20-ft lanes (8 rows × 30 in, common practice) = 32 whole lanes and a half one.
		expect(first.lanes).toHaveLength(33);
		expect(first.lanes.every((l) => Math.abs(l.widthFt - 20) < 1e-9)).toBe(true);
		expect(first.byCrop.corn.lanes).toBe(17);
		expect(first.byCrop.soybean.lanes).toBe(16);
		expect(first.plantedAcres).toBeCloseTo(field.acres, 3);

		const second = await savePlan(access, field.id, 2027, { ...settings, headlandFt: 30, version: 1 });
		expect(second.version).toBe(2);
		expect(second.plantedAcres).toBeLessThan(first.plantedAcres);

		const stale = await thrown(() => savePlan(access, field.id, 2027, { ...settings, headlandFt: 60, version: 1 }));
		expect(stale.status).toBe(409);
		const stored = await getPlan(access, field.id, 2027);
		expect(stored.version).toBe(2);
		expect(stored.headlandFt).toBe(30);
		expect(await db()('plan_lanes').where({ plan_id: stored.id }).count('* as n').first()).toEqual({ n: stored.lanes.length });
	});

	it('refuses an invalid layout with the error on the input that caused it', async () => {
		const { access, field, settings } = await setup();
		const same = await thrown(() => savePlan(access, field.id, 2027, { ...settings, guidance: { a: settings.guidance.a, b: settings.guidance.a }, version: 0 }));
		expect(same.status).toBe(400);
		expect(Object.keys((same as unknown as { fields: object }).fields)).toEqual(['guidance']);
		const noSpacing = await thrown(() => savePlan(access, field.id, 2027, { ...settings, pattern: [{ kind: 'crop', crop: 'corn', rows: 8 }], version: 0 }));
		expect(Object.keys((noSpacing as unknown as { fields: object }).fields)).toEqual(['pattern']);
		expect(await listPlans(access, field.id)).toEqual([]);
	});

	it('plans the next season one lane over: every acre changes crop, and the matrix says so', async () => {
		const { access, field, settings } = await setup();
		await savePlan(access, field.id, 2026, { ...settings, version: 0 });
		const next = await planNextSeason(access, field.id, 2026, { shift: 'default' });
		expect(next.shiftFt).toBe(20);
		expect(next.plan.season).toBe(2027);
		expect(next.plan.offsetFt).toBe(20);
		const byPair = Object.fromEntries(next.rotation.map((r) => [`${r.from}>${r.to}`, r.acres]));
		expect(byPair['corn>corn'] ?? 0).toBeLessThan(0.001);
		expect(byPair['soybean>soybean'] ?? 0).toBeLessThan(0.001);
		expect(byPair['corn>soybean'] + byPair['soybean>corn']).toBeCloseTo(field.acres, 3);
		expect(next.warnings.filter((w) => w.kind === 'same_crop')).toEqual([]);
		// Every new corn lane stands beside old corn: rootworm edge-row warning (common practice).
		expect(next.warnings.filter((w) => w.kind === 'corn_borders_corn').length).toBeGreaterThan(10);
		const again = await thrown(() => planNextSeason(access, field.id, 2026, { shift: 'default' }));
		expect(again.status).toBe(409);
	});

	it('warns when a crop follows itself (shift of a whole pattern)', async () => {
		const { access, field, settings } = await setup();
		await savePlan(access, field.id, 2026, { ...settings, version: 0 });
		const next = await planNextSeason(access, field.id, 2026, { shift: 40 });
		const same = next.warnings.filter((w) => w.kind === 'same_crop').map((w) => w.message);
		expect(same).toHaveLength(2);
		expect(same[0]).toMatch(/ac of corn follows corn\.$/);
	});

	it('keeps a past plan on the boundary it was laid out on', async () => {
		const { access, field, settings } = await setup();
		const before = await savePlan(access, field.id, 2025, { ...settings, version: 0 });
		await updateField(access, field.id, { boundary: rectangle(700, 1320), version: field.version });
		const past = await getPlan(access, field.id, 2025);
		expect(past.boundaryVersion).toBe(1);
		expect(past.plantedAcres).toBeCloseTo(before.plantedAcres, 6);
		const resaved = await savePlan(access, field.id, 2025, { ...settings, version: past.version, notes: 'variety fixed' });
		expect(resaved.boundaryVersion).toBe(1);
		const rebased = await savePlan(access, field.id, 2025, { ...settings, version: resaved.version, rebase: true });
		expect(rebased.boundaryVersion).toBe(2);
		expect(rebased.plantedAcres).toBeGreaterThan(before.plantedAcres);
	});

	it('keeps variants side by side with one adopted', async () => {
		const { access, field, settings } = await setup();
		await savePlan(access, field.id, 2027, { ...settings, version: 0 });
		const wide = await savePlan(access, field.id, 2027, {
			...settings,
			variant: '12/12 strips',
			pattern: [{ kind: 'crop', crop: 'corn', rows: 12, rowSpacingIn: 30 }, { kind: 'crop', crop: 'soybean', rows: 12, rowSpacingIn: 30 }],
			version: 0
		});
		expect(wide.adopted).toBe(false);
		expect((await getPlan(access, field.id, 2027)).variant).toBe('main');
		await adoptVariant(access, field.id, 2027, '12/12 strips');
		expect((await getPlan(access, field.id, 2027)).variant).toBe('12/12 strips');
		expect((await listPlans(access, field.id)).map((p) => [p.variant, p.adopted])).toEqual([['12/12 strips', true], ['main', false]]);
	});

	it('keeps lane assignments with the lanes and drops ones for lanes that no longer exist', async () => {
		const { access, field, settings } = await setup();
		const a = { variety: 'hybrid A', relativeMaturity: 105, populationPerAcre: 34_000, seedLot: 'L-1', trialLabel: 'hybrid comparison', notes: null };
		const plan = await savePlan(access, field.id, 2027, { ...settings, version: 0, assignments: [{ laneIndex: 0, ...a }, { laneIndex: 500, ...a }] });
		expect(plan.assignments.map((x) => x.laneIndex)).toEqual([0]);
		expect(plan.lanes[0].assignment).toMatchObject({ variety: 'hybrid A', populationPerAcre: 34_000 });
		const row = await db()('plan_lanes').where({ plan_id: plan.id, lane_index: 0 }).first();
		expect(row).toMatchObject({ variety: 'hybrid A', population_per_acre: 34000, trial_label: 'hybrid comparison' });
	});

	it('is not readable from another farm', async () => {
		const { access, field, settings } = await setup();
		await savePlan(access, field.id, 2027, { ...settings, version: 0 });
		const other = await setup();
		expect((await thrown(() => getPlan(other.access, field.id, 2027))).status).toBe(404);
		expect((await thrown(() => savePlan(other.access, field.id, 2027, { ...settings, version: 1 }))).status).toBe(404);
	});
});
