import { describe, expect, it } from 'vitest';
import { checkPasses, EquipmentError, planPasses, type PlannedPass } from '../../../src/lib/equipment/index';
import { toSheetPasses } from '../../../src/lib/sheet/passes';
import type { LaneSpec } from '../../../src/lib/geometry/index';
import { corn, corn8, frozen, planter, range, rectangleLayout, soy8, soybean, splitPlanter16, unitsOnByLane } from './fixtures';

const pasture20: LaneSpec = { kind: 'pasture', crop: 'pasture', widthFt: 20 };
const cornPlanter8 = () => planter(8, () => ({ seed: corn(), fertilizerOn: ['n'] }));

function expectError(fn: () => unknown, code: string, message: RegExp): void {
	let caught: unknown;
	try {
		fn();
	} catch (e) {
		caught = e;
	}
	expect(caught).toBeInstanceOf(EquipmentError);
	expect((caught as EquipmentError).code).toBe(code);
	expect((caught as EquipmentError).message).toMatch(message);
}

describe('single-crop lanes with a matching planter', () => {
	const pattern = [corn8];
	const layout = rectangleLayout(pattern, 60);

	it('drives one pass per 8-row lane, back and forth, every unit on its own row', () => {
		expect(layout.lanes.map((l) => l.offsetFt)).toEqual([0, 20, 40]);
		const plan = planPasses({ lanes: layout.lanes, pattern, planter: cornPlanter8() });
		expect(plan.planterWidthFt).toBe(20);
		expect(plan.passes.map((p) => [p.startsAt, p.leftEdgeFt, p.unitsOn])).toEqual([
			['A', 0, 8],
			['B', 20, 8],
			['A', 40, 8]
		]);
		expect(plan.passes.every((p) => !p.sameEndAsPrevious)).toBe(true);
		// A→B: unit 1 on the lane's first row (15 in from its left edge).
		const first = plan.passes[0].units;
		expect(first[0]).toMatchObject({ unit: 1, laneIndex: 0, rowNumber: 1, on: true, fertilizerOn: ['n'] });
		expect(first[0].positionFt).toBeCloseTo(1.25, 9);
		// B→A the operator's left is the field's right: unit 1 runs on row 8 of lane 2, unit 8 on row 1.
		const back = plan.passes[1].units;
		expect(back[0]).toMatchObject({ unit: 1, laneIndex: 1, rowNumber: 8, on: true });
		expect(back[0].positionFt).toBeCloseTo(38.75, 9);
		expect(back[7]).toMatchObject({ unit: 8, laneIndex: 1, rowNumber: 1, on: true });
		expect(plan.unplantedRows).toEqual([]);
		expect(plan.warnings).toEqual([]);
		expect(checkPasses(plan.passes, plan.lanes, cornPlanter8())).toEqual([]);
	});

	it('skips pasture lanes: the next pass starts at the next corn lane', () => {
		const mixed = [corn8, pasture20];
		const lanes = rectangleLayout(mixed, 80).lanes;
		const plan = planPasses({ lanes, pattern: mixed, planter: cornPlanter8() });
		expect(plan.passes.map((p) => [p.startsAt, p.leftEdgeFt, p.plantsLaneIndexes])).toEqual([
			['A', 0, [0]],
			['B', 40, [2]]
		]);
		expect(plan.passes[1].summary).toBe('Lane 3: units 1–8 corn (hybrid A) on lane 3');
		expect(checkPasses(plan.passes, plan.lanes, cornPlanter8())).toEqual([]);
	});

	it('starts from the right side when asked, driving B→A first when asked', () => {
		const plan = planPasses({ lanes: layout.lanes, pattern, planter: cornPlanter8(), startSide: 'right', firstPassStartsAt: 'B' });
		expect(plan.passes.map((p) => [p.startsAt, p.leftEdgeFt])).toEqual([
			['B', 40],
			['A', 20],
			['B', 0]
		]);
		expect(unitsOnByLane(plan.passes[0].units)).toEqual({ 2: range(1, 8) });
		expect(plan.passes[0].units[0].rowNumber).toBe(8);
	});

	it('does not change its inputs', () => {
		const input = frozen({ lanes: layout.lanes, pattern, planter: cornPlanter8() });
		expect(() => planPasses(input)).not.toThrow();
	});
});

describe('16-row split planter (units 1–8 corn, 9–16 soybean) over 8-row corn / 8-row soybean at 30 in', () => {
	const pattern = [corn8, soy8];
	const layout = rectangleLayout(pattern, 80);

	it('driving plainly back and forth puts the corn units over the soybean lane on the return pass', () => {
		const plan = planPasses({ lanes: layout.lanes, pattern, planter: splitPlanter16(), ends: 'alternate' });
		expect(plan.passes.map((p) => p.startsAt)).toEqual(['A', 'B']);
		expect(unitsOnByLane(plan.passes[0].units)).toEqual({ 0: range(1, 8), 1: range(9, 16) });
		// Return pass, B→A: unit 1 is at the field's right, over lane 4 (soybean).
		expect(unitsOnByLane(plan.passes[1].units)).toEqual({ 3: range(1, 8), 2: range(9, 16) });
		const stops = checkPasses(plan.passes, plan.lanes, splitPlanter16()).filter((c) => c.severity === 'stop');
		expect(stops.map((c) => [c.problem, c.passNumber, c.laneIndex, c.units])).toEqual([
			['fertilizer_wrong_crop', 2, 3, range(1, 8)],
			['seed_wrong_crop', 2, 3, range(1, 8)],
			['seed_wrong_crop', 2, 2, range(9, 16)]
		]);
	});

	it('chooses to start the return pass from A again and reports it as drive back empty', () => {
		const plan = planPasses({ lanes: layout.lanes, pattern, planter: splitPlanter16() });
		expect(plan.passes.map((p) => [p.startsAt, p.leftEdgeFt, p.sameEndAsPrevious])).toEqual([
			['A', 0, false],
			['A', 40, true]
		]);
		expect(unitsOnByLane(plan.passes[1].units)).toEqual({ 2: range(1, 8), 3: range(9, 16) });
		expect(plan.passes[1].summary).toBe('Lanes 3–4: units 1–8 corn (hybrid A) on lane 3, units 9–16 soybean (variety S) on lane 4');
		expect(plan.warnings).toEqual([
			'Pass 2 starts from A again, like pass 1: drive back to A with the planter raised. Starting from B would put seed boxes over the wrong crop.'
		]);
		const checks = checkPasses(plan.passes, plan.lanes, splitPlanter16());
		expect(checks.map((c) => [c.severity, c.problem, c.passNumber])).toEqual([['warn', 'drive_back_empty', 2]]);
	});

	it('overrides a requested B start when only A matches the seed boxes', () => {
		const plan = planPasses({ lanes: layout.lanes, pattern, planter: splitPlanter16(), firstPassStartsAt: 'B' });
		expect(plan.passes.map((p) => p.startsAt)).toEqual(['A', 'A']);
		expect(plan.passes.map((p) => p.unitsOn)).toEqual([16, 16]);
	});

	it('starting from the right side, both passes still start from A', () => {
		const plan = planPasses({ lanes: layout.lanes, pattern, planter: splitPlanter16(), startSide: 'right' });
		expect(plan.passes.map((p) => [p.startsAt, p.leftEdgeFt])).toEqual([
			['A', 40],
			['A', 0]
		]);
		expect(unitsOnByLane(plan.passes[0].units)).toEqual({ 2: range(1, 8), 3: range(9, 16) });
	});

	it('with the soybean lane first (pattern shifted 20 ft) every pass starts from B, operator left on soybean', () => {
		const shifted = rectangleLayout(pattern, 80, 1320, 20);
		expect(shifted.lanes.map((l) => l.crop)).toEqual(['soybean', 'corn', 'soybean', 'corn']);
		const plan = planPasses({ lanes: shifted.lanes, pattern, planter: splitPlanter16() });
		expect(plan.passes.map((p) => [p.startsAt, p.sameEndAsPrevious])).toEqual([
			['B', false],
			['B', true]
		]);
		expect(unitsOnByLane(plan.passes[0].units)).toEqual({ 0: range(9, 16), 1: range(1, 8) });
	});

	it('turns into sheet passes: seed shown only where the unit plants, lines by name', () => {
		const plan = planPasses({ lanes: layout.lanes, pattern, planter: splitPlanter16() });
		const sheet = toSheetPasses(plan.passes, splitPlanter16());
		expect(sheet[1]).toMatchObject({ number: 2, startsAt: 'A', laneIndexes: [2, 3], unitsOn: 16 });
		expect(sheet[1].units[0]).toEqual({ unit: 1, laneIndex: 2, seed: 'corn — hybrid A', fertilizer: ['Nitrogen'] });
		expect(sheet[1].units[15]).toEqual({ unit: 16, laneIndex: 3, seed: 'soybean — variety S', fertilizer: [] });
	});
});

describe('partial passes: lanes that are not a whole number of planter widths', () => {
	it('12-row corn planter on 8-row lanes: 8 units plant, 4 run shut off over the soybean lane', () => {
		const pattern = [corn8, soy8];
		const lanes = rectangleLayout(pattern, 80).lanes;
		const twelve = planter(12, () => ({ seed: corn(), fertilizerOn: [] }));
		const plan = planPasses({ lanes, pattern, planter: twelve });
		expect(plan.planterWidthFt).toBe(30);
		expect(plan.passes.map((p) => [p.startsAt, p.leftEdgeFt, p.laneIndexes, p.plantsLaneIndexes])).toEqual([
			['A', 0, [0, 1], [0]],
			['B', 40, [2, 3], [2]]
		]);
		expect(unitsOnByLane(plan.passes[0].units)).toEqual({ 0: range(1, 8) });
		expect(plan.passes[0].units.slice(8).map((u) => [u.laneIndex, u.offReason])).toEqual(range(9, 12).map(() => [1, 'other-crop']));
		// B→A: units 5–12 over lane 3, units 1–4 reach the soybean lane to its right.
		expect(unitsOnByLane(plan.passes[1].units)).toEqual({ 2: range(5, 12) });
		expect(plan.passes[1].summary).toBe('Lane 3: units 5–12 corn (hybrid A) on lane 3; units 1–4 off');
		expect(plan.unplantedRows).toEqual([
			{ laneIndex: 1, crop: 'soybean', rowNumbers: range(1, 8) },
			{ laneIndex: 3, crop: 'soybean', rowNumbers: range(1, 8) }
		]);
	});

	it('8-row planter on 12-row lanes: the second pass plants 4 rows with units 1–4 over the pasture', () => {
		const corn12: LaneSpec = { kind: 'crop', crop: 'corn', rows: 12, rowSpacingIn: 30 };
		const pattern = [corn12, pasture20];
		const lanes = rectangleLayout(pattern, 100).lanes;
		const plan = planPasses({ lanes, pattern, planter: cornPlanter8() });
		expect(plan.passes.map((p) => [p.startsAt, p.leftEdgeFt, p.unitsOn])).toEqual([
			['A', 0, 8],
			['B', 20, 4],
			['A', 50, 8],
			['B', 70, 4]
		]);
		expect(plan.passes[1].units.map((u) => [u.unit, u.laneIndex, u.rowNumber, u.on, u.offReason])).toEqual([
			[1, 1, null, false, 'non-planting-lane'],
			[2, 1, null, false, 'non-planting-lane'],
			[3, 1, null, false, 'non-planting-lane'],
			[4, 1, null, false, 'non-planting-lane'],
			[5, 0, 12, true, null],
			[6, 0, 11, true, null],
			[7, 0, 10, true, null],
			[8, 0, 9, true, null]
		]);
		expect(plan.unplantedRows).toEqual([]);
	});

	it('a twin-row lane counts each pair as one row at the pair centre', () => {
		const twin: LaneSpec = { kind: 'crop', crop: 'corn', rows: 4, rowSpacingIn: 60, twinSpacingIn: 8 };
		const cover: LaneSpec = { kind: 'cover', crop: 'cover mix', widthFt: 10 };
		const lanes = rectangleLayout([twin, cover], 30).lanes;
		const wide = planter(4, () => ({ seed: corn(), fertilizerOn: [] }), 60);
		const plan = planPasses({ lanes, pattern: [twin, cover], planter: wide });
		expect(plan.lanes[0].rowPositionsIn).toEqual([30, 90, 150, 210]);
		expect(plan.passes).toHaveLength(1);
		expect(plan.passes[0].unitsOn).toBe(4);
	});
});

describe('refusals', () => {
	const pattern = [corn8, soy8];
	const lanes = rectangleLayout(pattern, 80).lanes;

	it('a planter with no row units is an error, not an empty sheet', () => {
		const none = { rowSpacingIn: 30, rowUnits: [], fertilizerLines: [] };
		expectError(() => planPasses({ lanes, pattern, planter: none }), 'no-row-units', /no row units/);
		expectError(() => checkPasses([], lanes, none), 'no-row-units', /no row units/);
	});

	it('a planter whose seed boxes are all empty is refused', () => {
		expectError(() => planPasses({ lanes, pattern, planter: planter(8, () => ({ seed: null, fertilizerOn: [] })) }), 'no-seed', /No seed box/);
	});

	it('unit numbers must run 1 to n and fertilizer lines must exist', () => {
		const missingUnit = planter(4, () => ({ seed: corn(), fertilizerOn: [] }));
		missingUnit.rowUnits[3] = { ...missingUnit.rowUnits[3], unit: 5 };
		expectError(() => planPasses({ lanes, pattern, planter: missingUnit }), 'unit-numbering', /numbered 1 to 4.*found 1, 2, 3, 5/);
		const unknown = planter(4, (u) => ({ seed: corn(), fertilizerOn: u === 2 ? ['potash'] : [] }));
		expectError(() => planPasses({ lanes, pattern, planter: unknown }), 'unknown-fertilizer-line', /Row unit 2 has fertilizer line "potash"/);
	});

	it('bad row spacing, lanes and options are refused with a plain message', () => {
		expectError(() => planPasses({ lanes, pattern, planter: planter(4, () => ({ seed: corn(), fertilizerOn: [] }), 0) }), 'invalid-row-spacing', /more than zero inches/);
		expectError(() => planPasses({ lanes: [{ ...lanes[0], widthFt: 0 }], planter: splitPlanter16() }), 'invalid-lane', /Lane 1 is 0 ft wide/);
		expectError(() => planPasses({ lanes: [lanes[0], lanes[0]], planter: splitPlanter16() }), 'invalid-lane', /Lane 1 appears twice/);
		expectError(() => planPasses({ lanes, planter: splitPlanter16(), startSide: 'middle' as 'left' }), 'invalid-option', /'left' or 'right'/);
	});

	it('hand-made passes are checked the same way', () => {
		const plan = planPasses({ lanes, pattern, planter: splitPlanter16() });
		const edited: PlannedPass = structuredClone(plan.passes[0]);
		edited.units[2] = { ...edited.units[2], seed: soybean() };
		const checks = checkPasses([edited], plan.lanes, splitPlanter16());
		const seed = checks.find((c) => c.problem === 'seed_wrong_crop');
		expect(seed).toMatchObject({ severity: 'stop', laneIndex: 0, unit: 3, units: [3] });
		expect(seed?.message).toBe('Pass 1 (from A): row unit 3 carries soybean but runs over lane 1 (corn). Start this pass from B or change the seed boxes.');
	});
});
