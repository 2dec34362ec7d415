import { describe, expect, it } from 'vitest';
import { MAX_CREDITED_ROW_SPACING_IN, creditedRowFraction } from '../../../src/lib/agronomy/index.js';
import { expectAgronomyError } from './expect-error.js';

describe('creditedRowFraction', () => {
	it('matches the worked values for wide rows', () => {
		// Computed: from 7 CFR 718.108 (each row credited at most 40 in): 60 in → 0.6667
		expect(creditedRowFraction(60)).toBeCloseTo(0.6667, 4);
		// Computed: 7 CFR 718.108: 72 in → 0.5556
		expect(creditedRowFraction(72)).toBeCloseTo(0.5556, 4);
		// Computed: 7 CFR 718.108: 90 in → 0.4444
		expect(creditedRowFraction(90)).toBeCloseTo(0.4444, 4);
	});

	it('credits rows 40 in apart or closer in full', () => {
		// 7 CFR 718.108: the rule applies only to rows more than 40 in apart
		expect(MAX_CREDITED_ROW_SPACING_IN).toBe(40);
		expect(creditedRowFraction(30)).toBe(1);
		expect(creditedRowFraction(15)).toBe(1);
		expect(creditedRowFraction(40)).toBe(1);
		expect(creditedRowFraction(40.5)).toBeCloseTo(40 / 40.5, 12);
	});

	it('rejects bad input', () => {
		expectAgronomyError(() => creditedRowFraction(0), 'not_positive', 'row spacing must be more than 0 in; got 0');
		expectAgronomyError(() => creditedRowFraction(-60), 'not_positive', 'row spacing must be more than 0 in; got -60');
		expectAgronomyError(() => creditedRowFraction(NaN), 'not_finite', 'row spacing must be a finite number; got NaN');
	});
});
