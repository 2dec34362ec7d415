import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { fertilizerNeeds, needsCsv, seedNeeds, type SeedLane } from '$lib/farm/needs';

const lane = (fieldId: string, crop: string, variety: string | null, acres: number, populationPerAcre: number | null, kind: SeedLane['kind'] = 'crop'): SeedLane => ({ fieldId, crop, kind, variety, acres, populationPerAcre });

describe('seed needs by variety', () => {
	it('sums seeds over fields and rounds units up once, from the catalogue’s seeds per unit', () => {
		const { seed, unrated } = seedNeeds(
			[lane('a', 'corn', 'hybrid A', 40, 34_000), lane('b', 'corn', 'Hybrid A', 40, 34_000), lane('a', 'soybean', 'variety S', 30, 140_000), lane('b', 'corn', 'hybrid B', 10.1, 32_000)],
			[{ crop: 'Corn', name: 'hybrid A', seedsPerUnit: 80_000 }, { crop: 'soybean', name: 'variety S', seedsPerUnit: 150_000 }]
		);
		expect(unrated).toEqual([]);
		expect(seed.map((s) => [s.crop, s.variety])).toEqual([['corn', 'hybrid A'], ['corn', 'hybrid B'], ['soybean', 'variety S']]);
		// 80 ac × 34,000 = 2,720,000 seeds = 34 units of 80,000 exactly: not 35.
		expect(seed[0]).toMatchObject({ fields: 2, lanes: 2, acres: 80, seeds: 2_720_000, seedsPerUnit: 80_000, basis: 'catalogue', unitsExact: 34, unitsToOrder: 34 });
		// Not in the catalogue: the common-practice corn unit; 10.1 × 32,000 / 80,000 = 4.04 → 5.
		expect(seed[1]).toMatchObject({ basis: 'common practice', seedsPerUnit: 80_000, unitsToOrder: 5 });
		expect(seed[1].unitsExact).toBeCloseTo(4.04, 10);
		// 30 × 140,000 / 150,000 = 28 units from the catalogue figure.
		expect(seed[2]).toMatchObject({ basis: 'catalogue', seedsPerUnit: 150_000, unitsExact: 28, unitsToOrder: 28 });
	});

	it('lists lanes with no rate apart, and leaves pasture and buffer lanes out', () => {
		const { seed, unrated } = seedNeeds(
			[lane('a', 'corn', 'hybrid A', 20, null), lane('b', 'corn', 'hybrid A', 5, 0), lane('a', 'pasture', null, 9, 1000, 'pasture'), lane('a', 'buffer', null, 1, null, 'buffer'), lane('a', 'sorghum', null, 3, 60_000)],
			[]
		);
		expect(unrated).toEqual([{ crop: 'corn', variety: 'hybrid A', fields: 2, lanes: 2, acres: 25 }]);
		expect(seed).toHaveLength(1);
		expect(seed[0]).toMatchObject({ crop: 'sorghum', variety: null, seedsPerUnit: null, basis: null, unitsExact: null, unitsToOrder: null, seeds: 180_000 });
	});
});

describe('fertilizer needs', () => {
	it('sums gallons and pounds of N per product over fields', () => {
		const needs = fertilizerNeeds([
			{ fieldId: 'a', product: 'UAN 32 %', lineName: 'N', gallonsPerAcre: 15, acres: 40, gallons: 600, poundsN: 2128.8 },
			{ fieldId: 'b', product: 'uan 32 %', lineName: 'N', gallonsPerAcre: 12, acres: 10, gallons: 120, poundsN: 425.76 },
			{ fieldId: 'b', product: null, lineName: 'Starter', gallonsPerAcre: 5, acres: 10, gallons: 50, poundsN: null },
			{ fieldId: 'c', product: 'UAN 32 %', lineName: 'N', gallonsPerAcre: 15, acres: 0, gallons: 0, poundsN: 0 }
		]);
		expect(needs).toHaveLength(2);
		expect(needs[0]).toEqual({ product: 'Starter', fields: 1, acres: 10, gallons: 50, poundsN: null, ratesGallonsPerAcre: [5] });
		expect(needs[1].product).toBe('UAN 32 %');
		expect(needs[1]).toMatchObject({ fields: 2, acres: 50, gallons: 720, ratesGallonsPerAcre: [12, 15] });
		expect(needs[1].poundsN).toBeCloseTo(2554.56, 6);
	});
});

describe('needs CSV', () => {
	it('has one row per item with units in the headers, and text that looks like a formula stays text', () => {
		const { seed, unrated } = seedNeeds([lane('a', 'corn', '=HYPERLINK("x")', 80, 34_000), lane('a', 'soybean', 'S, "two"', 10, null)], []);
		const csv = needsCsv(2027, seed, unrated, [{ product: 'UAN 32 %', fields: 1, acres: 40, gallons: 600, poundsN: 2128.8, ratesGallonsPerAcre: [15] }]);
		const parsed = Papa.parse<string[]>(csv.trim()).data;
		expect(parsed[0]).toContain('acres_ac');
		expect(parsed[0]).toContain('units_to_order');
		expect(parsed).toHaveLength(4);
		expect(parsed[1].slice(0, 7)).toEqual(['2027', 'seed', 'corn', '\'=HYPERLINK("x")', '1', '1', '80.00']);
		expect(parsed[1][parsed[0].indexOf('units_to_order')]).toBe('34');
		expect(parsed[2].slice(1, 4)).toEqual(['seed without a rate', 'soybean', 'S, "two"']);
		expect(parsed[3][parsed[0].indexOf('gallons_gal')]).toBe('600.0');
		expect(parsed[3][parsed[0].indexOf('pounds_n_lb')]).toBe('2128.8');
	});
});
