import { describe, expect, it } from 'vitest';
import {
	GRAIN_STANDARDS,
	GRAIN_STANDARDS_SOURCE,
	moistureShrinkPercent,
	standardMoistureWeight,
	stripYield,
	yieldBushelsPerAcre
} from '../../../src/lib/agronomy/index.js';
import { expectAgronomyError, frozenCopy } from './expect-error.js';

const cornStrip = { crop: 'corn', lengthFt: 1_000, rows: 8, rowSpacingIn: 30, wetPounds: 5_000, moisturePct: 20 } as const;
const soyStrip = { crop: 'soybean', lengthFt: 800, rows: 6, rowSpacingIn: 30, wetPounds: 1_000, moisturePct: 11 } as const;

describe('GRAIN_STANDARDS', () => {
	it('holds the published bushel weights and moistures', () => {
		// Univ. of Wisconsin-Extension, M. Rankin, "Bushels, Test Weight, Shrink, and Storage":
		// corn 56 lb/bu at 15.5 %; soybean 60 at 13 %; wheat 60 at 13.5 %; oats 32 at 14 %
		expect(GRAIN_STANDARDS).toEqual({
			corn: { poundsPerBushel: 56, standardMoisturePct: 15.5 },
			soybean: { poundsPerBushel: 60, standardMoisturePct: 13 },
			wheat: { poundsPerBushel: 60, standardMoisturePct: 13.5 },
			oats: { poundsPerBushel: 32, standardMoisturePct: 14 }
		});
		expect(GRAIN_STANDARDS_SOURCE).toContain('Wisconsin');
		expect(Object.isFrozen(GRAIN_STANDARDS)).toBe(true);
		expect(Object.isFrozen(GRAIN_STANDARDS.corn)).toBe(true);
	});
});

describe('standardMoistureWeight', () => {
	it('holds dry matter constant', () => {
		// Computed: Mulvaney & Devkota, UF/IFAS SS-AGR-443 (2020) formula: 1,000 lb at 25 % → 887.57 lb at 15.5 %
		expect(standardMoistureWeight(1_000, 25, 15.5)).toBeCloseTo(887.574, 3);
		// Computed: same formula: grain drier than standard gains weight, 1,000 lb at 11 % → 1,022.99 lb at 13 %
		expect(standardMoistureWeight(1_000, 11, 13)).toBeCloseTo(1_022.989, 3);
		// Computed: at standard, unchanged
		expect(standardMoistureWeight(1_000, 15.5, 15.5)).toBe(1_000);
	});

	it('rejects bad input', () => {
		expectAgronomyError(() => standardMoistureWeight(-1, 20, 15.5), 'negative', 'wet weight must be 0 lb or more; got -1');
		expectAgronomyError(
			() => standardMoistureWeight(1_000, 100, 15.5),
			'out_of_range',
			'moisture must be at least 0 % and less than 100 %; got 100'
		);
		expectAgronomyError(
			() => standardMoistureWeight(1_000, -2, 15.5),
			'out_of_range',
			'moisture must be at least 0 % and less than 100 %; got -2'
		);
		expectAgronomyError(
			() => standardMoistureWeight(1_000, 20, 150),
			'out_of_range',
			'standard moisture must be at least 0 % and less than 100 %; got 150'
		);
	});
});

describe('moistureShrinkPercent', () => {
	it('matches the worked value', () => {
		// Computed: Mulvaney & Devkota, UF/IFAS SS-AGR-443 (2020): corn 25 % → 15.5 % loses 11.24 %
		expect(moistureShrinkPercent(25, 15.5)).toBeCloseTo(11.24, 2);
		// Computed: dry soybean 11 % → 13 % gains 2.30 % (a negative shrink)
		expect(moistureShrinkPercent(11, 13)).toBeCloseTo(-2.299, 3);
	});

	it('rejects bad input', () => {
		expectAgronomyError(
			() => moistureShrinkPercent(25, 100),
			'out_of_range',
			'standard moisture must be at least 0 % and less than 100 %; got 100'
		);
	});
});

describe('yieldBushelsPerAcre', () => {
	it('matches the worked corn strip', () => {
		// Computed: extension strip calibration guidance, Mulvaney & Devkota UF/IFAS SS-AGR-443, Univ. of Wisconsin-Extension standards:
		// 8 rows × 30 in × 1,000 ft, 5,000 lb at 20 % → 184.11 bu/ac at 15.5 %
		expect(yieldBushelsPerAcre('corn', 5_000, 20, 20_000 / 43_560)).toBeCloseTo(184.11, 2);
	});

	it('raises grain drier than standard to standard moisture', () => {
		// Computed: same sources: soybean 6 rows × 30 in × 800 ft, 1,000 lb at 11 % → 61.89 bu/ac at 13 %
		expect(yieldBushelsPerAcre('soybean', 1_000, 11, 12_000 / 43_560)).toBeCloseTo(61.89, 2);
	});

	it('uses each crop’s own standard', () => {
		// Computed: Wisconsin standards: 6,000 lb wheat at its 13.5 % standard on 1 ac → 100 bu/ac
		expect(yieldBushelsPerAcre('wheat', 6_000, 13.5, 1)).toBeCloseTo(100, 10);
		// Computed: Wisconsin standards: 3,200 lb oats at its 14 % standard on 1 ac → 100 bu/ac
		expect(yieldBushelsPerAcre('oats', 3_200, 14, 1)).toBeCloseTo(100, 10);
		// Computed: 6,000 lb wheat at 18 % on 1 ac → 6,000 × 82 ÷ 86.5 ÷ 60 = 94.80 bu/ac
		expect(yieldBushelsPerAcre('wheat', 6_000, 18, 1)).toBeCloseTo(94.798, 3);
	});

	it('rejects bad input', () => {
		expectAgronomyError(
			() => yieldBushelsPerAcre('rye' as 'corn', 5_000, 20, 1),
			'unknown_crop',
			'crop must be one of corn, soybean, wheat, oats; got "rye"'
		);
		expectAgronomyError(() => yieldBushelsPerAcre('corn', 5_000, 20, 0), 'not_positive', 'acres must be more than 0 ac; got 0');
		expectAgronomyError(() => yieldBushelsPerAcre('corn', -5, 20, 1), 'negative', 'wet weight must be 0 lb or more; got -5');
		expectAgronomyError(
			() => yieldBushelsPerAcre('corn', 5_000, 120, 1),
			'out_of_range',
			'moisture must be at least 0 % and less than 100 %; got 120'
		);
	});
});

describe('stripYield', () => {
	it('matches the worked corn strip', () => {
		// Computed: extension strip calibration guidance, Mulvaney & Devkota UF/IFAS SS-AGR-443: 8 rows × 30 in × 1,000 ft = 0.4591 ac;
		// 5,000 lb at 20 % → 184.11 bu/ac; wet grain, so both figures agree
		const result = stripYield(cornStrip);
		expect(result.acres).toBeCloseTo(0.459137, 6);
		expect(result.bushelsPerAcreAtStandard).toBeCloseTo(184.11, 2);
		expect(result.bushelsPerAcreShrinkOnly).toBeCloseTo(184.11, 2);
	});

	it('matches the worked soybean strip, with and without raising dry grain', () => {
		// Computed: same sources: 6 rows × 30 in × 800 ft = 0.2755 ac; 1,000 lb at 11 %
		// → 61.89 bu/ac raised to 13 %, 60.50 bu/ac left as weighed
		const result = stripYield(soyStrip);
		expect(result.acres).toBeCloseTo(0.275482, 6);
		expect(result.bushelsPerAcreAtStandard).toBeCloseTo(61.89, 2);
		expect(result.bushelsPerAcreShrinkOnly).toBeCloseTo(60.5, 2);
	});

	it('rejects bad input', () => {
		expectAgronomyError(
			() => stripYield({ ...cornStrip, crop: 'barley' as 'corn' }),
			'unknown_crop',
			'crop must be one of corn, soybean, wheat, oats; got "barley"'
		);
		expectAgronomyError(
			() => stripYield({ ...cornStrip, lengthFt: 0 }),
			'not_positive',
			'strip length must be more than 0 ft; got 0'
		);
		expectAgronomyError(() => stripYield({ ...cornStrip, rows: 8.5 }), 'not_integer', 'rows must be a whole number; got 8.5');
		expectAgronomyError(() => stripYield({ ...cornStrip, rows: 0 }), 'not_positive', 'rows must be more than 0; got 0');
		expectAgronomyError(
			() => stripYield({ ...cornStrip, rowSpacingIn: -30 }),
			'not_positive',
			'row spacing must be more than 0 in; got -30'
		);
		expectAgronomyError(
			() => stripYield({ ...cornStrip, wetPounds: NaN }),
			'not_finite',
			'wet weight must be a finite number; got NaN'
		);
		expectAgronomyError(
			() => stripYield({ ...cornStrip, moisturePct: 100 }),
			'out_of_range',
			'moisture must be at least 0 % and less than 100 %; got 100'
		);
	});

	it('does not change its input', () => {
		const input = frozenCopy({ ...soyStrip });
		const before = structuredClone(input);
		stripYield(input);
		expect(input).toEqual(before);
	});
});
