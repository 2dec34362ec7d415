import { describe, expect, it } from 'vitest';
import { cropChange, cropTotals, kindTotals, sumCropTotals } from '$lib/farm/totals';
import { rotationAcres, rotationAxes, sumRotations } from '$lib/farm/rotation';

const groups = [
	{ fieldId: 'a', crop: 'corn', kind: 'crop' as const, acres: 40.5, lanes: 16 },
	{ fieldId: 'a', crop: 'soybean', kind: 'crop' as const, acres: 39.25, lanes: 16 },
	{ fieldId: 'b', crop: 'corn', kind: 'crop' as const, acres: 10, lanes: 4 },
	{ fieldId: 'b', crop: 'pasture', kind: 'pasture' as const, acres: 7.75, lanes: 3 },
	{ fieldId: 'b', crop: 'constructor', kind: 'cover' as const, acres: 1, lanes: 1 }
];

describe('farm crop totals', () => {
	it('sums acres and lanes per crop, names sorted, with crop names that are object internals kept as data', () => {
		const t = cropTotals(groups);
		expect(Object.keys(t)).toEqual(['constructor', 'corn', 'pasture', 'soybean']);
		expect(t.corn).toEqual({ acres: 50.5, lanes: 20 });
		expect(t.constructor).toEqual({ acres: 1, lanes: 1 });
	});

	it('summing two fields equals totalling all their lanes at once', () => {
		const a = cropTotals(groups.filter((g) => g.fieldId === 'a'));
		const b = cropTotals(groups.filter((g) => g.fieldId === 'b'));
		expect(sumCropTotals([a, b])).toEqual(cropTotals(groups));
		expect(sumCropTotals([])).toEqual({});
	});

	it('lists every lane kind, zero where absent', () => {
		expect(kindTotals(groups)).toEqual({
			crop: { acres: 89.75, lanes: 36 },
			pasture: { acres: 7.75, lanes: 3 },
			cover: { acres: 1, lanes: 1 },
			buffer: { acres: 0, lanes: 0 }
		});
	});

	it('gives the change from the season before for crops of either season', () => {
		const now = { corn: { acres: 50, lanes: 20 }, oats: { acres: 5, lanes: 2 } };
		const before = { corn: { acres: 30, lanes: 12 }, soybean: { acres: 45, lanes: 18 } };
		expect(cropChange(now, before)).toEqual([
			{ crop: 'corn', acres: 50, previousAcres: 30, change: 20, lanes: 20, previousLanes: 12 },
			{ crop: 'oats', acres: 5, previousAcres: 0, change: 5, lanes: 2, previousLanes: 0 },
			{ crop: 'soybean', acres: 0, previousAcres: 45, change: -45, lanes: 0, previousLanes: 18 }
		]);
	});
});

describe('farm rotation matrix', () => {
	it('adds the fields’ matrices pair by pair, sorted like rotationMatrix', () => {
		const sum = sumRotations([
			[{ from: 'corn', to: 'soybean', acres: 40 }, { from: 'soybean', to: 'corn', acres: 39 }],
			[{ from: 'corn', to: 'soybean', acres: 10.5 }, { from: 'corn', to: 'corn', acres: 0.25 }],
			[]
		]);
		expect(sum).toEqual([
			{ from: 'corn', to: 'corn', acres: 0.25 },
			{ from: 'corn', to: 'soybean', acres: 50.5 },
			{ from: 'soybean', to: 'corn', acres: 39 }
		]);
		expect(rotationAxes(sum)).toEqual({ from: ['corn', 'soybean'], to: ['corn', 'soybean'] });
		expect(rotationAcres(sum, 'soybean', 'soybean')).toBe(0);
		expect(rotationAcres(sum, 'corn', 'soybean')).toBe(50.5);
	});

	it('does not change the matrices it is given', () => {
		const one = [{ from: 'corn', to: 'soybean', acres: 1 }];
		sumRotations([one, one]);
		expect(one).toEqual([{ from: 'corn', to: 'soybean', acres: 1 }]);
	});
});
