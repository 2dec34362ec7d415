import { describe, expect, it } from 'vitest';
import { dailyWater, groupFigures, laneWidthFt, moveFigures, stretchLengthFt } from '../../src/lib/livestock/figures';
import { DEFAULT_INTAKE, PUBLISHED_AU_EQUIVALENTS, WATER_PER_HEAD } from '../../src/lib/livestock/species';

describe('group figures', () => {
	it('animal units are head × weight ÷ 1,000 lb, with the published per-head equivalent beside them', () => {
		// National Drought Mitigation Center: one animal unit is a 1,000-lb cow (with calf).
		// Computed: 30 ewes × 150 lb ÷ 1,000 = 4.5 AU.
		const ewes = groupFigures('sheep', 30, 150);
		expect(ewes.animalUnits).toBeCloseTo(4.5, 12);
		// NRCS National Range and Pasture Handbook, mature sheep 0.20 AU a head (from memory): 30 × 0.2 = 6.0.
		expect(ewes.publishedEquivalentPerHead).toBe(0.2);
		expect(ewes.publishedAnimalUnits).toBeCloseTo(6, 12);
		// NRPH goat 0.15 (from memory): 20 goats → 3.0 AU by the table, 20 × 120 ÷ 1,000 = 2.4 by weight.
		const goats = groupFigures('goat', 20, 120);
		expect(goats.animalUnits).toBeCloseTo(2.4, 12);
		expect(goats.publishedAnimalUnits).toBeCloseTo(3, 12);
	});

	it('hogs and poultry have no forage-table equivalent, only the weight figure', () => {
		// 24 feeder pigs × 180 lb ÷ 1,000 = 4.32 AU.
		const pigs = groupFigures('hog', 24, 180);
		expect(pigs.animalUnits).toBeCloseTo(4.32, 12);
		expect(pigs.publishedAnimalUnits).toBeNull();
		expect(pigs.publishedSource).toBeNull();
		expect(PUBLISHED_AU_EQUIVALENTS.poultry).toBeUndefined();
	});

	it('a group sold down to 0 head has 0 animal units and needs no water', () => {
		const empty = groupFigures('sheep', 0, 150);
		expect(empty.animalUnits).toBe(0);
		expect(empty.water.lowGal).toBe(0);
		expect(empty.water.highGal).toBe(0);
	});
});

describe('daily water', () => {
	it('is head × the published per-head figure, with the source named', () => {
		// J. Renewable Energy (Hindawi) 2017, art. 8504283, Table 1: 6–12 gal per 100 chickens a day.
		const birds = dailyWater('poultry', 300);
		expect(birds.lowGal).toBeCloseTo(18, 10);
		expect(birds.highGal).toBeCloseTo(36, 10);
		expect(birds.source).toBe(WATER_PER_HEAD.poultry.source);
		// Lincoln University (J. Pennington): 150-lb ewes 0.75–1.5 gal; the same table gives 2 gal for a sheep.
		const ewes = dailyWater('sheep', 40);
		expect(ewes.lowGal).toBe(30);
		expect(ewes.highGal).toBe(80);
		// Same table: cattle 10–15 gal a day.
		expect(dailyWater('cattle', 10)).toMatchObject({ lowGal: 100, highGal: 150 });
	});

	it('refuses a negative or fractional head count', () => {
		expect(() => dailyWater('hog', -1)).toThrow('head must be a whole number of 0 or more; got -1');
		expect(() => dailyWater('hog', 2.5)).toThrow('head must be a whole number of 0 or more; got 2.5');
	});
});

describe('move figures', () => {
	it('grazing days and stocking density follow the worked example of Grazier’s Math', () => {
		// NCAT ATTRA, "Grazier's Math": 30 ewes × 150 lb × 3.5 % = 157.5 lb DM/day;
		// 2 ac × 2,400 lb × 50 % = 2,400 lb → 15.24 days.
		const f = moveFigures({ species: 'sheep', head: 30, averageWeightLb: 150, acres: 2, forageLbPerAcre: 2400, utilization: 0.5, intakePct: 3.5, days: 10 });
		expect(f.dailyDryMatterLb).toBeCloseTo(157.5, 10);
		expect(f.grazingDays!).toBeCloseTo(15.238095, 5);
		// Stocking density: 4.5 AU on 2 ac = 2.25 AU/ac.
		expect(f.stockingDensityAuPerAcre).toBeCloseTo(2.25, 12);
		expect(f.plannedDryMatterLb).toBeCloseTo(1575, 10);
	});

	it('takes the species’ default intake when the move gives none, and no grazing days without forage', () => {
		const f = moveFigures({ species: 'goat', head: 10, averageWeightLb: 100, acres: 1, forageLbPerAcre: null, utilization: null, intakePct: null, days: 1 });
		// NCAT ATTRA: goats eat 4–5 % of body weight; default 4.5 % → 10 × 100 × 4.5 % = 45 lb/day.
		expect(f.intakePct).toBe(DEFAULT_INTAKE.goat.pct);
		expect(f.dailyDryMatterLb).toBeCloseTo(45, 10);
		expect(f.grazingDays).toBeNull();
	});
});

describe('stretch length for planned days', () => {
	it('solves the grazing-days formula for the length of lane', () => {
		// The worked example backwards: 15.238 days need 2 ac; on a 10-ft lane that is 87,120 ÷ 10 = 8,712 ft.
		const days = 2400 / 157.5;
		expect(stretchLengthFt({ days, laneWidthFt: 10, forageLbPerAcre: 2400, utilization: 0.5, head: 30, weightLb: 150, intakePct: 3.5 })).toBeCloseTo(8712, 6);
		// One day for the same flock: 157.5 lb ÷ (2,400 × 0.5) = 0.13125 ac = 5,717.25 sq ft → 571.725 ft.
		expect(stretchLengthFt({ days: 1, laneWidthFt: 10, forageLbPerAcre: 2400, utilization: 0.5, head: 30, weightLb: 150, intakePct: 3.5 })).toBeCloseTo(571.725, 6);
	});

	it('refuses no forage, no width or no days', () => {
		const base = { days: 1, laneWidthFt: 10, forageLbPerAcre: 2400, utilization: 0.5, head: 30, weightLb: 150, intakePct: 3.5 };
		expect(() => stretchLengthFt({ ...base, forageLbPerAcre: 0 })).toThrow('forage above residual must be more than 0 lb/ac; got 0');
		expect(() => stretchLengthFt({ ...base, laneWidthFt: 0 })).toThrow('lane width must be more than 0 ft; got 0');
		expect(() => stretchLengthFt({ ...base, days: -2 })).toThrow('days must be more than 0; got -2');
	});

	it('a lane’s average width is its area over its length', () => {
		// 1 ac over 4,356 ft = 10 ft.
		expect(laneWidthFt(1, 4356)).toBeCloseTo(10, 12);
		expect(laneWidthFt(1, 0)).toBe(0);
	});
});
