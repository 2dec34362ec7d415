import { describe, expect, it } from 'vitest';
import { harvestFigures, harvestedAcres, harvestProblems, type HarvestLane } from '$lib/harvest/entry';

const lane = (laneIndex: number, crop = 'corn', acres = 2, rows = 8, borderRows = 2): HarvestLane => ({ laneIndex, kind: 'crop', crop, acres, rows, borderRows });

describe('harvest entry figures', () => {
	it('corn: 8 rows × 30 in × 1,000 ft, 5,000 lb at 20 % → 184.11 bu/ac at 15.5 %', () => {
		// Formula: extension strip-trial calibration guidance, acres = length × width ÷ 43,560 and
		// bu/ac = lb ÷ 56 ÷ acres × (100 − M) ÷ 84.5; standards from Univ. of Wisconsin-Extension,
		// M. Rankin, "Bushels, Test Weight, Shrink, and Storage". The figure is that formula worked by hand.
		const f = harvestFigures({ crop: 'corn', wetWeightLb: 5000, moisturePct: 20, rowPosition: 'all', lengthFt: 1000, rows: 8, rowSpacingIn: 30 }, [lane(0)]);
		expect(f.harvestedAcres).toBeCloseTo(20_000 / 43_560, 10);
		expect(f.bushelsPerAcre.toFixed(2)).toBe('184.11');
		expect(f.bushels.toFixed(2)).toBe('84.53');
		expect(f.standardMoisturePct).toBe(15.5);
		expect(f.poundsPerBushel).toBe(56);
	});

	it('soybean drier than 13 % is raised to it: 6 rows × 30 in × 800 ft, 1,000 lb at 11 % → 61.89 bu/ac (not 60.50)', () => {
		// Mulvaney & Devkota, "Adjusting Crop Yield to a Standard Moisture Content", UF/IFAS EDIS SS-AGR-443 (2020):
		// W_std = W_wet × (100 − M_wet) ÷ (100 − M_std); soybean 60 lb/bu at 13 % (Rankin, UW-Extension).
		const f = harvestFigures({ crop: 'soybean', wetWeightLb: 1000, moisturePct: 11, rowPosition: 'all', lengthFt: 800, rows: 6, rowSpacingIn: 30 }, [lane(0, 'soybean')]);
		expect(f.bushelsPerAcre.toFixed(2)).toBe('61.89');
		expect(f.standardMoisturePct).toBe(13);
	});

	it('corn at 25 % loses 11.24 % of its weight on the way to 15.5 % (Mulvaney & Devkota 2020)', () => {
		const f = harvestFigures({ crop: 'corn', wetWeightLb: 10_000, moisturePct: 25, rowPosition: 'all' }, [lane(0, 'corn', 1)]);
		expect(((1 - (f.bushels * 56) / 10_000) * 100).toFixed(2)).toBe('11.24');
	});

	it('without a measured length the lanes\u2019 acres are the area; outside or inside rows take their share of the rows', () => {
		const lanes = [lane(3, 'corn', 2, 8, 2), lane(4, 'corn', 1.5, 8, 4)];
		expect(harvestedAcres({ rowPosition: 'all' }, lanes)).toBeCloseTo(3.5, 12);
		expect(harvestedAcres({ rowPosition: 'outside' }, lanes)).toBeCloseTo(2 * 2 / 8 + 1.5 * 4 / 8, 12);
		expect(harvestedAcres({ rowPosition: 'inside' }, lanes)).toBeCloseTo(2 * 6 / 8 + 1.5 * 4 / 8, 12);
	});
});

describe('harvest entry problems', () => {
	const ok = { crop: 'corn', wetWeightLb: 5000, moisturePct: 20, rowPosition: 'all' as const };
	it('accepts a plain load', () => expect(harvestProblems(ok, [lane(0)])).toEqual({}));
	it('refuses moisture outside 5–40 %, weights ≤ 0, another crop and a half-measured area', () => {
		expect(Object.keys(harvestProblems({ ...ok, moisturePct: 4.9 }, [lane(0)]))).toEqual(['moisturePct']);
		expect(Object.keys(harvestProblems({ ...ok, moisturePct: 40.1 }, [lane(0)]))).toEqual(['moisturePct']);
		expect(harvestProblems({ ...ok, moisturePct: 40 }, [lane(0)])).toEqual({});
		expect(Object.keys(harvestProblems({ ...ok, wetWeightLb: 0 }, [lane(0)]))).toEqual(['wetWeightLb']);
		expect(Object.keys(harvestProblems({ ...ok, wetWeightLb: -5 }, [lane(0)]))).toEqual(['wetWeightLb']);
		// Values a number column rounds to 0 lb or cannot hold are refused before they reach the database.
		expect(harvestProblems({ ...ok, wetWeightLb: 6.4e-323 }, [lane(0)]).wetWeightLb).toEqual(['The weight must be between 1 lb and 10,000,000 lb; 6.4e-323 lb is outside it.']);
		expect(Object.keys(harvestProblems({ ...ok, wetWeightLb: 1e15 }, [lane(0)]))).toEqual(['wetWeightLb']);
		expect(harvestProblems({ ...ok, wetWeightLb: 1 }, [lane(0)])).toEqual({});
		expect(harvestProblems({ ...ok, crop: 'soybean' }, [lane(0), lane(1, 'soybean')]).crop).toEqual(['Lane 1 is corn, not soybean.']);
		expect(Object.keys(harvestProblems({ ...ok, lengthFt: 100 }, [lane(0)]))).toEqual(['lengthFt']);
		expect(Object.keys(harvestProblems({ ...ok, crop: 'pasture' }, [lane(0, 'pasture')]))).toEqual(['crop']);
		expect(Object.keys(harvestProblems({ ...ok, rowPosition: 'outside' }, [lane(0, 'corn', 2, 8, 0)]))).toEqual(['rowPosition']);
	});
});
