import { describe, expect, it } from 'vitest';
import { createField } from '$lib/server/fields';
import { getPlan, savePlan } from '$lib/server/plans';
import { requireMember } from '$lib/server/access';
import { db } from '$lib/server/db';
import * as storedTotals from '../../migrations/20261202010000_stored_plan_totals';
import { fakeEvent, makeFarmWithTeam } from './helpers';
import { rectangle } from '../fixtures/rectangle';

describe('the migration that stores plan totals', () => {
	it('fills them in for plans saved before it: crop totals from the stored lanes, headland and exclusions from one layout', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
		const boundary = rectangle(650, 1320);
		const pond = rectangle(100, 100, -94.2095, 43.901);
		const field = await createField(access, { name: 'Before totals', boundary, exclusions: [{ name: 'pond', kind: 'other', geometry: pond }], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
		const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
		const saved = await savePlan(access, field.id, 2024, {
			guidance: { a: sw, b: nw },
			pattern: [{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }, { kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 }],
			offsetFt: 0, headlandFt: 40, variant: 'main', assignments: [], notes: null, rebase: false, version: 0
		});
		expect(saved.headlandAcres).toBeGreaterThan(1);
		expect(saved.excludedAcres).toBeGreaterThan(0.2);
		// A stored lane the layout code would not draw today: the crop totals must follow it.
		await db()('plan_lanes').where({ plan_id: saved.id, lane_index: 0 }).update({ acres: 0.5 });

		await storedTotals.down(db());
		await storedTotals.up(db());

		const plan = await getPlan(access, field.id, 2024);
		const corn = saved.byCrop.corn;
		expect(plan.byCrop.corn.lanes).toBe(corn.lanes);
		expect(plan.byCrop.corn.rows).toBe(corn.rows);
		expect(plan.byCrop.corn.acres).toBeCloseTo(corn.acres - saved.lanes[0].acres + 0.5, 5);
		expect(plan.byCrop.soybean.acres).toBeCloseTo(saved.byCrop.soybean.acres, 5);
		expect(plan.headlandAcres).toBeCloseTo(saved.headlandAcres, 9);
		expect(plan.excludedAcres).toBeCloseTo(saved.excludedAcres, 9);
		expect(plan.lanes[0].acres).toBe(0.5);
	});
});
