import { requirePositive } from './validate.js';

/** Widest row spacing credited in full, inches (7 CFR 718.108). */
export const MAX_CREDITED_ROW_SPACING_IN = 40;

/**
 * Share of a uniformly wide-rowed area that counts as planted to the crop: 1 for rows 40 in apart
 * or closer; otherwise each row is credited 40 in, so 40 ÷ row spacing.
 * This ignores the allowance of half the normal spacing beyond the outside rows; the local FSA
 * office determines acreage.
 *
 * Source: 7 CFR 718.108.
 *
 * @example creditedRowFraction(60) // ≈ 0.6667
 */
export function creditedRowFraction(rowSpacingIn: number): number {
	const spacing = requirePositive('row spacing', rowSpacingIn, 'in');
	return spacing <= MAX_CREDITED_ROW_SPACING_IN ? 1 : MAX_CREDITED_ROW_SPACING_IN / spacing;
}
