import { describe, expect, it } from 'vitest';
import { plantsPerAcreFromStandCount, rowFeetPerThousandthAcre } from '../../../src/lib/agronomy/index.js';
import { expectAgronomyError } from './expect-error.js';

/** Feet and whole inches, as the extension tables print them. */
function feetAndInches(feet: number): [number, number] {
	const totalInches = Math.round(feet * 12);
	return [Math.floor(totalInches / 12), totalInches % 12];
}

describe('rowFeetPerThousandthAcre', () => {
	// Iowa State Univ. Extension and Univ. of Wisconsin corn stand-count tables: row length equal to 1/1,000 acre
	it.each([
		[15, 34, 10],
		[20, 26, 2],
		[30, 17, 5],
		[36, 14, 6],
		[38, 13, 9]
	])('%i-in rows → %i ft %i in (extension table)', (spacing, feet, inches) => {
		expect(feetAndInches(rowFeetPerThousandthAcre(spacing))).toEqual([feet, inches]);
	});

	it('is 43,560 ÷ 1,000 ÷ spacing in feet', () => {
		expect(rowFeetPerThousandthAcre(30)).toBeCloseTo(17.424, 10);
		expect(rowFeetPerThousandthAcre(22)).toBeCloseTo(23.76, 10);
	});

	it('rejects a spacing that is not a positive number', () => {
		expectAgronomyError(() => rowFeetPerThousandthAcre(0), 'not_positive', 'row spacing must be more than 0 in; got 0');
		expectAgronomyError(() => rowFeetPerThousandthAcre(-30), 'not_positive', 'row spacing must be more than 0 in; got -30');
		expectAgronomyError(() => rowFeetPerThousandthAcre(NaN), 'not_finite', 'row spacing must be a finite number; got NaN');
	});
});

describe('plantsPerAcreFromStandCount', () => {
	it('multiplies by 1,000 when the 1/1,000-acre length is counted', () => {
		// Extension stand-count guides: plants in 1/1,000 acre of row × 1,000 = plants per acre
		expect(plantsPerAcreFromStandCount(32, rowFeetPerThousandthAcre(30), 30)).toBeCloseTo(32_000, 6);
		expect(plantsPerAcreFromStandCount(150, rowFeetPerThousandthAcre(15), 15)).toBeCloseTo(150_000, 6);
	});

	it('scales with any counted length', () => {
		// 10 ft of 30-in row is 25 sq ft; 14 plants → 14 × 43,560 ÷ 25 = 24,393.6
		expect(plantsPerAcreFromStandCount(14, 10, 30)).toBeCloseTo(24_393.6, 6);
		// Two 1/1,000-acre lengths counted together: 62 plants → 31,000 / ac
		expect(plantsPerAcreFromStandCount(62, 2 * 17.424, 30)).toBeCloseTo(31_000, 6);
		expect(plantsPerAcreFromStandCount(0, 17.424, 30)).toBe(0);
	});

	it('rejects impossible counts', () => {
		expectAgronomyError(() => plantsPerAcreFromStandCount(-1, 17.4, 30), 'negative', 'plants counted must be 0 or more; got -1');
		expectAgronomyError(() => plantsPerAcreFromStandCount(30, 0, 30), 'not_positive', 'row length counted must be more than 0 ft; got 0');
		expectAgronomyError(() => plantsPerAcreFromStandCount(30, 17.4, 0), 'not_positive', 'row spacing must be more than 0 in; got 0');
	});
});
