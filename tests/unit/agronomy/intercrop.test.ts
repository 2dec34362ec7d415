import { describe, expect, it } from 'vitest';
import { landEquivalentRatio, landEquivalentRatioFromStrips } from '../../../src/lib/agronomy/index.js';
import { expectAgronomyError, frozenCopy } from './expect-error.js';

describe('landEquivalentRatio', () => {
	it('matches the worked values', () => {
		// Computed: Mead & Willey, Exp. Agric. 16:217–228 (1980): sole corn 200, sole soybean 60; strips on half
		// the land yielding 230 and 57 per strip acre → 115 and 28.5 per total acre → LER 1.050
		expect(
			landEquivalentRatio([
				{ intercropYield: 115, soleYield: 200 },
				{ intercropYield: 28.5, soleYield: 60 }
			])
		).toBeCloseTo(1.05, 10);
		// Computed: Mead & Willey (1980): strips yielding 220 and 54 → 110 and 27 per total acre → LER 1.000
		expect(
			landEquivalentRatio([
				{ intercropYield: 110, soleYield: 200 },
				{ intercropYield: 27, soleYield: 60 }
			])
		).toBeCloseTo(1, 10);
	});

	it('gives 1 for a sole crop compared with itself, and counts a failed crop as 0', () => {
		expect(landEquivalentRatio([{ intercropYield: 200, soleYield: 200 }])).toBe(1);
		expect(
			landEquivalentRatio([
				{ intercropYield: 0, soleYield: 200 },
				{ intercropYield: 30, soleYield: 60 }
			])
		).toBeCloseTo(0.5, 12);
	});

	it('rejects bad input', () => {
		expectAgronomyError(
			() => landEquivalentRatio([]),
			'empty_list',
			'crops must be a list with at least one entry; got an empty list'
		);
		expectAgronomyError(
			() =>
				landEquivalentRatio([
					{ intercropYield: 115, soleYield: 200 },
					{ intercropYield: 28.5, soleYield: 0 }
				]),
			'not_positive',
			'crop 2 sole yield must be more than 0; got 0'
		);
		expectAgronomyError(
			() => landEquivalentRatio([{ intercropYield: -1, soleYield: 200 }]),
			'negative',
			'crop 1 intercrop yield must be 0 or more; got -1'
		);
		expectAgronomyError(
			() => landEquivalentRatio([{ intercropYield: NaN, soleYield: 200 }]),
			'not_finite',
			'crop 1 intercrop yield must be a finite number; got NaN'
		);
	});

	it('does not change its input', () => {
		const input = frozenCopy([
			{ intercropYield: 115, soleYield: 200 },
			{ intercropYield: 28.5, soleYield: 60 }
		]);
		const before = structuredClone(input);
		landEquivalentRatio(input);
		expect(input).toEqual(before);
	});
});

describe('landEquivalentRatioFromStrips', () => {
	it('matches the worked values', () => {
		// Computed: Mead & Willey (1980): strips at half the land each, yielding 230 and 57 → LER 1.050
		expect(
			landEquivalentRatioFromStrips([
				{ stripYield: 230, landShare: 0.5, soleYield: 200 },
				{ stripYield: 57, landShare: 0.5, soleYield: 60 }
			])
		).toBeCloseTo(1.05, 10);
		// Computed: Mead & Willey (1980): 220 and 54 → LER 1.000
		expect(
			landEquivalentRatioFromStrips([
				{ stripYield: 220, landShare: 0.5, soleYield: 200 },
				{ stripYield: 54, landShare: 0.5, soleYield: 60 }
			])
		).toBeCloseTo(1, 10);
	});

	it('weights strips by their share of the land', () => {
		// Computed: corn on 60 % at 220, soybean on 40 % at 57: 0.6 × 220/200 + 0.4 × 57/60 = 0.66 + 0.38 = 1.04
		expect(
			landEquivalentRatioFromStrips([
				{ stripYield: 220, landShare: 0.6, soleYield: 200 },
				{ stripYield: 57, landShare: 0.4, soleYield: 60 }
			])
		).toBeCloseTo(1.04, 10);
	});

	it('rejects bad input', () => {
		expectAgronomyError(
			() => landEquivalentRatioFromStrips([]),
			'empty_list',
			'crops must be a list with at least one entry; got an empty list'
		);
		expectAgronomyError(
			() => landEquivalentRatioFromStrips([{ stripYield: 230, landShare: 50, soleYield: 200 }]),
			'out_of_range',
			'crop 1 land share must be more than 0 and at most 1 (a fraction: 0.5 for half the land); got 50'
		);
		expectAgronomyError(
			() =>
				landEquivalentRatioFromStrips([
					{ stripYield: 230, landShare: 0.6, soleYield: 200 },
					{ stripYield: 57, landShare: 0.6, soleYield: 60 }
				]),
			'out_of_range',
			'land shares must add up to at most 1; got 1.2'
		);
		expectAgronomyError(
			() =>
				landEquivalentRatioFromStrips([
					{ stripYield: 230, landShare: 0.5, soleYield: 200 },
					{ stripYield: 57, landShare: 0.5, soleYield: -60 }
				]),
			'not_positive',
			'crop 2 sole yield must be more than 0; got -60'
		);
		expectAgronomyError(
			() => landEquivalentRatioFromStrips([{ stripYield: -230, landShare: 0.5, soleYield: 200 }]),
			'negative',
			'crop 1 strip yield must be 0 or more; got -230'
		);
	});

	it('does not change its input', () => {
		const input = frozenCopy([
			{ stripYield: 230, landShare: 0.5, soleYield: 200 },
			{ stripYield: 57, landShare: 0.5, soleYield: 60 }
		]);
		const before = structuredClone(input);
		landEquivalentRatioFromStrips(input);
		expect(input).toEqual(before);
	});
});
