import { describe, expect, it } from 'vitest';
import { checkAssignmentVarieties, withCatalogueUnits, type CatalogueVariety } from '$lib/catalog/variety-check';

const catalogue: CatalogueVariety[] = [
	{ id: 'c1', crop: 'corn', name: 'hybrid A', relativeMaturity: 105, seedsPerUnit: 80_000 },
	{ id: 's1', crop: 'soybean', name: 'line 2.1', relativeMaturity: 2.1, seedsPerUnit: 140_000 },
	{ id: 's2', crop: 'Soybean', name: 'line big bag', relativeMaturity: 2, seedsPerUnit: 150_000 }
];
const lanes = [{ index: 0, crop: 'corn' }, { index: 1, crop: 'soybean' }];

describe('checkAssignmentVarieties', () => {
	it('refuses a catalogue name of another crop, by name in any case and spacing, and by id', () => {
		const { fields } = checkAssignmentVarieties(lanes, [{ laneIndex: 0, variety: ' LINE  2.1 ' }, { laneIndex: 1, variety: null, varietyId: 'c1' }], catalogue);
		expect(fields).toEqual({
			'assignments.0.variety': ['Lane 1 is a corn lane, but "line 2.1" is a soybean variety in the seed catalogue. Choose a corn variety, or change the lane\'s crop.'],
			'assignments.1.variety': ['Lane 2 is a soybean lane, but "hybrid A" is a corn variety in the seed catalogue. Choose a soybean variety, or change the lane\'s crop.']
		});
	});

	it('passes the lane crop\'s varieties and free text, and names an id by its catalogue name', () => {
		const { fields, varieties } = checkAssignmentVarieties(lanes, [{ laneIndex: 0, variety: 'Hybrid A' }, { laneIndex: 1, variety: 'whatever', varietyId: 's2' }, { laneIndex: 0, variety: 'bin-run seed' }], catalogue);
		expect(fields).toEqual({});
		expect(varieties).toEqual(['Hybrid A', 'line big bag', 'bin-run seed']);
	});

	it('flags an unknown id on varietyId', () => {
		expect(Object.keys(checkAssignmentVarieties(lanes, [{ laneIndex: 0, variety: null, varietyId: 'gone' }], catalogue).fields)).toEqual(['assignments.0.varietyId']);
	});
});

describe('withCatalogueUnits', () => {
	it('uses the catalogue variety\'s seeds per unit and crop', () => {
		const [row] = withCatalogueUnits([{ crop: 'soybean', variety: 'line big bag', acres: 10, seeds: 1_500_000, seedsPerUnit: 140_000, unitsExact: 10.71, unitsWhole: 11 }], catalogue);
		expect(row).toEqual({ crop: 'Soybean', variety: 'line big bag', acres: 10, seeds: 1_500_000, seedsPerUnit: 150_000, unitsExact: 10, unitsWhole: 10, fromCatalogue: true });
	});

	it('a corn hybrid on a soybean lane is counted in corn units', () => {
		const [row] = withCatalogueUnits([{ crop: 'soybean', variety: 'hybrid A', acres: 4, seeds: 160_000, seedsPerUnit: 140_000, unitsExact: 1.14, unitsWhole: 2 }], catalogue);
		expect([row.crop, row.seedsPerUnit, row.unitsExact, row.unitsWhole]).toEqual(['corn', 80_000, 2, 2]);
	});

	it('leaves a variety the catalogue does not know as it was', () => {
		const need = { crop: 'corn', variety: 'bin-run', acres: 1, seeds: 34_000, seedsPerUnit: 80_000, unitsExact: 0.425, unitsWhole: 1 };
		expect(withCatalogueUnits([need], catalogue)).toEqual([{ ...need, fromCatalogue: false }]);
	});
});
