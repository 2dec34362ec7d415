import { describe, expect, it } from 'vitest';
import { EquipmentError, implementChecks, implementFitChecks, type ImplementInput } from '../../../src/lib/equipment/index';
import type { LaneSpec } from '../../../src/lib/geometry/index';
import { corn8, rectangleLayout } from './fixtures';

const pasture10: LaneSpec = { kind: 'pasture', crop: 'pasture', widthFt: 10 };
const buffer15: LaneSpec = { kind: 'buffer', crop: 'grass', widthFt: 15 };
// Lanes: corn 20 ft, pasture 10 ft, corn, pasture, buffer 15 ft.
const lanes = rectangleLayout([corn8, pasture10, corn8, pasture10, buffer15], 75).lanes;

const drill: ImplementInput = { id: 'd1', name: 'Grain drill', kind: 'drill', workingWidthFt: 15 };
const toolbar: ImplementInput = { name: 'Side-dress bar', kind: 'sidedress', workingWidthFt: 20 };
const head: ImplementInput = { name: 'Corn head', kind: 'combine_head', workingWidthFt: 20 };
const shelter: ImplementInput = { name: 'Hog shelter', kind: 'shelter', workingWidthFt: 12 };

describe('implementChecks', () => {
	it('a 15-ft drill in a 10-ft pasture lane overhangs 30 in each side', () => {
		expect(lanes.map((l) => [l.kind, l.widthFt])).toEqual([
			['crop', 20],
			['pasture', 10],
			['crop', 20],
			['pasture', 10],
			['buffer', 15]
		]);
		const [report] = implementChecks(lanes, [drill]);
		expect(report.implement).toEqual({ id: 'd1', name: 'Grain drill', kind: 'drill', workingWidthFt: 15 });
		expect(report.fitsEveryLane).toBe(false);
		// Buffer lanes are not travel lanes (NRCS 332): the drill is not checked against lane 5.
		expect(report.lanes.map((f) => f.laneIndex)).toEqual([0, 1, 2, 3]);
		const pasture = report.lanes[1];
		expect(pasture).toMatchObject({ laneKind: 'pasture', passes: 1, fits: false, overhangEachSideIn: 30, severity: 'warn' });
		expect(pasture.lastPassCoverage).toBeCloseTo(10 / 15, 12);
		expect(pasture.message).toBe('Lane 2 (pasture), 10 ft: the 15-ft drill or seeder is wider than the lane; centred, it reaches 30 in onto each neighbouring lane.');
		// 20-ft corn lane: two passes, the second covering 5 of 15 ft.
		const cropLane = report.lanes[0];
		expect(cropLane).toMatchObject({ passes: 2, fits: false, overhangEachSideIn: 0 });
		expect(cropLane.lastPassCoverage).toBeCloseTo(1 / 3, 12);
		expect(cropLane.message).toBe('Lane 1 (corn), 20 ft: 2 passes of the 15-ft drill or seeder; the last covers 33 % of its width, so it overlaps the pass before it.');
	});

	it('a side-dress bar and a corn head the width of the corn lanes fit; only crop lanes are checked', () => {
		const [bar, combine] = implementChecks(lanes, [toolbar, head]);
		for (const r of [bar, combine]) {
			expect(r.fitsEveryLane).toBe(true);
			expect(r.lanes.map((f) => [f.laneIndex, f.passes, f.fits, f.overhangEachSideIn, f.lastPassCoverage])).toEqual([
				[0, 1, true, 0, 1],
				[2, 1, true, 0, 1]
			]);
		}
		expect(bar.lanes[0].message).toBe('Lane 1 (corn), 20 ft: 1 pass of the 20-ft side-dress toolbar, no overlap.');
	});

	it('a 12-ft shelter is checked on pasture lanes only: 12 in each side of a 10-ft lane', () => {
		const [r] = implementChecks(lanes, [shelter]);
		expect(r.lanes.map((f) => [f.laneIndex, f.overhangEachSideIn])).toEqual([
			[1, 12],
			[3, 12]
		]);
	});

	it('a 15-ft sprayer on a 40-ft lane takes 3 passes, the last covering 10/15', () => {
		const corn16: LaneSpec = { kind: 'crop', crop: 'corn', rows: 16, rowSpacingIn: 30 };
		const wide = rectangleLayout([corn16], 40).lanes;
		const [r] = implementChecks(wide, [{ name: 'Sprayer', kind: 'sprayer', workingWidthFt: 15 }]);
		expect(r.lanes[0].passes).toBe(3);
		expect(r.lanes[0].lastPassCoverage).toBeCloseTo(0.6667, 4);
	});

	it('lane kinds per implement can be changed per call', () => {
		const [r] = implementChecks(lanes, [drill], { laneKinds: { drill: ['buffer'] } });
		expect(r.lanes.map((f) => [f.laneIndex, f.fits, f.passes])).toEqual([[4, true, 1]]);
	});

	it('gives sheet warnings for the lanes that do not fit', () => {
		const checks = implementFitChecks(implementChecks(lanes, [drill, toolbar]));
		expect(checks.map((c) => [c.kind, c.laneIndex])).toEqual([
			['partial_pass', 0],
			['overhang', 1],
			['partial_pass', 2],
			['overhang', 3]
		]);
		expect(checks[1].message.startsWith('Grain drill: Lane 2 (pasture), 10 ft')).toBe(true);
		expect(checks.every((c) => c.severity === 'warn' && c.unit === null)).toBe(true);
	});

	it('refuses a width that is not more than zero', () => {
		expect(() => implementChecks(lanes, [{ ...drill, workingWidthFt: 0 }])).toThrow(EquipmentError);
		expect(() => implementChecks(lanes, [{ ...drill, workingWidthFt: Number.NaN }])).toThrow(/Grain drill has a working width of NaN ft/);
	});
});
