import { describe, expect, it } from 'vitest';
import { checkPasses, planPasses, type PlannedPass } from '../../../src/lib/equipment/index';
import { toSheetChecks } from '../../../src/lib/sheet/passes';
import type { LaneSpec } from '../../../src/lib/geometry/index';
import { corn, corn8, nitrogenLine, planter, range, rectangleLayout, soy8, soybean } from './fixtures';

const pasture20: LaneSpec = { kind: 'pasture', crop: 'pasture', widthFt: 20 };

describe('fertilizer plumbing', () => {
	const pattern = [corn8, soy8];
	const lanes = rectangleLayout(pattern, 80).lanes;

	it('nitrogen left on at the soybean units is a stop naming pass, lane and units', () => {
		// Split planter with the nitrogen line also turned on at units 9–16, which carry soybean.
		const misplumbed = planter(16, (u) => ({ seed: u <= 8 ? corn() : soybean(), fertilizerOn: ['n'] }));
		const plan = planPasses({ lanes, pattern, planter: misplumbed });
		const checks = checkPasses(plan.passes, plan.lanes, misplumbed);
		const fert = checks.filter((c) => c.problem === 'fertilizer_wrong_crop');
		expect(fert.map((c) => [c.severity, c.kind, c.passNumber, c.laneIndex, c.unit, c.units])).toEqual([
			['stop', 'fertilizer_wrong_crop', 1, 1, 9, range(9, 16)],
			['stop', 'fertilizer_wrong_crop', 2, 3, 9, range(9, 16)]
		]);
		expect(fert[0].message).toBe(
			'Pass 1 (from A): Nitrogen is on at row units 9–16 over lane 2 (soybean), but that line is meant for corn. Turn it off at those units or re-plumb the line.'
		);
	});

	it('a line meant for both crops is not flagged', () => {
		const starter = planter(16, (u) => ({ seed: u <= 8 ? corn() : soybean(), fertilizerOn: ['starter'] }));
		const plan = planPasses({ lanes, pattern, planter: starter });
		expect(checkPasses(plan.passes, plan.lanes, starter).filter((c) => c.severity === 'stop')).toEqual([]);
	});

	it('one misplumbed unit is named alone', () => {
		const one = planter(16, (u) => ({ seed: u <= 8 ? corn() : soybean(), fertilizerOn: u <= 8 || u === 12 ? ['n'] : [] }));
		const plan = planPasses({ lanes, pattern, planter: one });
		const fert = checkPasses(plan.passes, plan.lanes, one).filter((c) => c.problem === 'fertilizer_wrong_crop');
		expect(fert.map((c) => c.units)).toEqual([[12], [12]]);
		expect(fert[0].message).toContain('Nitrogen is on at row unit 12 over lane 2 (soybean)');
		expect(fert[0].message).toContain('Turn it off at that unit');
	});
});

describe('seed boxes and lanes', () => {
	it('a unit planting into a pasture lane is a stop', () => {
		const pattern = [corn8, pasture20];
		const lanes = rectangleLayout(pattern, 40).lanes;
		const p = planter(16, () => ({ seed: corn(), fertilizerOn: [] }));
		const plan = planPasses({ lanes, pattern, planter: p });
		expect(plan.passes).toHaveLength(1);
		expect(plan.passes[0].units.slice(8).every((u) => !u.on && u.offReason === 'non-planting-lane')).toBe(true);
		// The operator forgets to shut units 9–10 off over the pasture.
		const careless: PlannedPass = structuredClone(plan.passes[0]);
		for (const i of [8, 9]) careless.units[i] = { ...careless.units[i], on: true };
		const stop = checkPasses([careless], plan.lanes, p).find((c) => c.severity === 'stop');
		expect(stop).toMatchObject({ problem: 'seed_in_non_crop_lane', kind: 'seed_wrong_crop', laneIndex: 1, unit: 9, units: [9, 10] });
		expect(stop?.message).toBe('Pass 1 (from A): row units 9–10 would plant corn into lane 2 (pasture). Shut them off over that lane.');
	});

	it('rows no unit can plant are reported per lane', () => {
		const pattern = [corn8, soy8];
		const lanes = rectangleLayout(pattern, 40).lanes;
		const p = planter(8, () => ({ seed: corn(), fertilizerOn: [] }));
		const plan = planPasses({ lanes, pattern, planter: p });
		const missing = checkPasses(plan.passes, plan.lanes, p).filter((c) => c.problem === 'rows_not_planted');
		expect(missing.map((c) => [c.severity, c.laneIndex, c.message])).toEqual([
			['warn', 1, 'Lane 2 (soybean): 8 of 8 rows are not planted by these passes; no row unit carries soybean.']
		]);
	});
});

describe('row spacing', () => {
	it('a 30-in planter on a lane laid out for 15-in rows is a stop', () => {
		const soy15: LaneSpec = { kind: 'crop', crop: 'soybean', rows: 16, rowSpacingIn: 15 };
		const pattern = [corn8, corn8, soy15];
		const lanes = rectangleLayout(pattern, 60).lanes;
		const p = planter(8, (u) => ({ seed: u <= 8 ? soybean() : null, fertilizerOn: [] }));
		const plan = planPasses({ lanes, pattern, planter: p });
		const spacing = checkPasses(plan.passes, plan.lanes, p).filter((c) => c.problem === 'spacing_mismatch');
		expect(spacing.map((c) => [c.severity, c.kind, c.laneIndex])).toEqual([['stop', 'spacing_mismatch', 2]]);
		expect(spacing[0].message).toMatch(/^Planter rows are 30 in apart; lane 3 is laid out for 15-in rows\./);
	});

	it('a 30-in planter on 60-in rows is only a warning: every other unit plants', () => {
		const corn60: LaneSpec = { kind: 'crop', crop: 'corn', rows: 4, rowSpacingIn: 60 };
		const lanes = rectangleLayout([corn60], 20).lanes;
		const p = planter(8, () => ({ seed: corn(), fertilizerOn: [] }));
		const plan = planPasses({ lanes, pattern: [corn60], planter: p });
		expect(plan.passes).toHaveLength(1);
		expect(plan.passes[0].units.filter((u) => u.on).map((u) => u.unit)).toEqual([1, 3, 5, 7]);
		expect(plan.passes[0].units[1].offReason).toBe('between-rows');
		const spacing = checkPasses(plan.passes, plan.lanes, p).filter((c) => c.problem === 'spacing_mismatch');
		expect(spacing.map((c) => [c.severity, c.message])).toEqual([
			['warn', 'Planter rows are 30 in apart; lane 1 is laid out for 60-in rows: only every other row unit runs on a row; shut the others off.']
		]);
	});

	it('lane rows given by the caller take precedence over the pattern', () => {
		const lanes = rectangleLayout([corn8], 20).lanes;
		const p = planter(8, () => ({ seed: corn(), fertilizerOn: [] }));
		const plan = planPasses({ lanes, pattern: [corn8], laneRows: [{ laneIndex: 0, rowSpacingIn: 20, rowPositionsIn: range(0, 11).map((i) => 10 + 20 * i) }], planter: p });
		expect(plan.lanes[0].rowSpacingIn).toBe(20);
		expect(checkPasses(plan.passes, plan.lanes, p).find((c) => c.problem === 'spacing_mismatch')?.severity).toBe('stop');
	});
});

describe('overhang and partial passes', () => {
	it('12-row planter on 8-row lanes: reaches 120 in onto the soybean lane, lane not a whole number of passes', () => {
		const pattern = [corn8, soy8];
		const lanes = rectangleLayout(pattern, 80).lanes;
		const twelve = planter(12, () => ({ seed: corn(), fertilizerOn: [] }));
		const plan = planPasses({ lanes, pattern, planter: twelve });
		const checks = checkPasses(plan.passes, plan.lanes, twelve);
		const overhang = checks.filter((c) => c.problem === 'overhang');
		expect(overhang.map((c) => [c.severity, c.passNumber, c.laneIndex, c.units, c.overhangIn])).toEqual([
			['warn', 1, 1, range(9, 12), 120],
			['warn', 2, 3, range(1, 4), 120]
		]);
		// Centred on the 20-ft lane the 30-ft planter would reach (30 − 20) ÷ 2 ft = 60 in each side (equipmentFit).
		expect(overhang[0].message).toBe(
			'Pass 1 (from A): the 30-ft planter reaches 120 in onto lane 2 (soybean), where row units 9–12 run shut off. Centred on that lane it would reach 60 in onto each side.'
		);
		const partial = checks.filter((c) => c.problem === 'partial_pass');
		expect(partial.map((c) => [c.severity, c.laneIndex, c.units])).toEqual([
			['warn', 0, range(9, 12)],
			['warn', 2, range(1, 4)]
		]);
		expect(partial[0].message).toBe(
			'Lane 1 (corn) is 20 ft wide, not a whole number of 30-ft planter widths (1 pass, the last covering 67 %): pass 1 runs with row units 9–12 shut off.'
		);
		expect(checks.some((c) => c.severity === 'stop')).toBe(false);
	});

	it('8-row planter on 12-row lanes: two passes, the second covering 50 %', () => {
		const corn12: LaneSpec = { kind: 'crop', crop: 'corn', rows: 12, rowSpacingIn: 30 };
		const pattern = [corn12, pasture20];
		const lanes = rectangleLayout(pattern, 50).lanes;
		const p = planter(8, () => ({ seed: corn(), fertilizerOn: [] }));
		const plan = planPasses({ lanes, pattern, planter: p });
		const checks = checkPasses(plan.passes, plan.lanes, p);
		expect(checks.map((c) => [c.problem, c.laneIndex, c.passNumber])).toEqual([
			['overhang', 1, 2],
			['partial_pass', 0, 1]
		]);
		expect(checks[0].overhangIn).toBeCloseTo(120, 9);
		expect(checks[1].message).toContain('(2 passes, the last covering 50 %): pass 2 runs with row units 1–4 shut off');
	});

	it('a split planter exactly two lanes wide neither overhangs nor leaves a partial pass', () => {
		const pattern = [corn8, soy8];
		const lanes = rectangleLayout(pattern, 160).lanes;
		const split = planter(16, (u) => ({ seed: u <= 8 ? corn() : soybean(), fertilizerOn: u <= 8 ? ['n'] : [] }));
		const plan = planPasses({ lanes, pattern, planter: split });
		expect(plan.passes).toHaveLength(4);
		const checks = checkPasses(plan.passes, plan.lanes, split);
		expect(checks.map((c) => c.problem)).toEqual(['drive_back_empty', 'drive_back_empty', 'drive_back_empty']);
	});
});

describe('no lanes to plant', () => {
	it('a field of pasture lanes gives no passes and one stop', () => {
		const lanes = rectangleLayout([pasture20], 40).lanes;
		const p = planter(8, () => ({ seed: corn(), fertilizerOn: [] }));
		const plan = planPasses({ lanes, pattern: [pasture20], planter: p });
		expect(plan.passes).toEqual([]);
		const checks = checkPasses(plan.passes, plan.lanes, p);
		expect(checks.map((c) => [c.severity, c.kind])).toEqual([['stop', 'no_lanes']]);
	});
});

describe('toSheetChecks', () => {
	it('keeps what the sheet stores, stops first', () => {
		const pattern = [corn8, soy8];
		const lanes = rectangleLayout(pattern, 80).lanes;
		const split = planter(16, (u) => ({ seed: u <= 8 ? corn() : soybean(), fertilizerOn: u <= 8 ? ['n'] : [] }), 30, [nitrogenLine]);
		const plan = planPasses({ lanes, pattern, planter: split, ends: 'alternate' });
		const sheet = toSheetChecks(checkPasses(plan.passes, plan.lanes, split));
		expect(sheet[0]).toEqual({
			severity: 'stop',
			kind: 'fertilizer_wrong_crop',
			message: 'Pass 2 (from B): Nitrogen is on at row units 1–8 over lane 4 (soybean), but that line is meant for corn. Turn it off at those units or re-plumb the line.',
			laneIndex: 3,
			unit: 1
		});
		expect(sheet.map((c) => c.severity)).toEqual(['stop', 'stop', 'stop']);
		expect(Object.keys(sheet[0]).sort()).toEqual(['kind', 'laneIndex', 'message', 'severity', 'unit']);
	});
});
