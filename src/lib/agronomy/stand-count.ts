import { requireNonNegative, requirePositive } from './validate.js';

const SQUARE_FEET_PER_ACRE = 43_560;

/**
 * Length of one row that makes up 1/1,000 acre: 43,560 ÷ 1,000 ÷ (row spacing in ft).
 * Count the plants in that length and multiply by 1,000 to get plants per acre.
 *
 * Source: extension stand-count guides (Iowa State Univ. Extension and Univ. of Wisconsin corn
 * stand-count tables): 30-in rows → 17 ft 5 in; 15 in → 34 ft 10 in; 38 in → 13 ft 9 in.
 *
 * @param rowSpacingIn distance between rows, inches (> 0)
 * @returns feet of row, unrounded
 * @example rowFeetPerThousandthAcre(30) // 17.424 (17 ft 5 in)
 */
export function rowFeetPerThousandthAcre(rowSpacingIn: number): number {
	const spacing = requirePositive('row spacing', rowSpacingIn, 'in');
	return SQUARE_FEET_PER_ACRE / 1_000 / (spacing / 12);
}

/**
 * Plants per acre from a stand count: plants counted ÷ the acres of row counted, where the row
 * counted covers rowFeetCounted × (row spacing in ft) square feet. Counting exactly the 1/1,000-acre
 * length gives plants × 1,000.
 *
 * Source: extension stand-count guides (Iowa State Univ. Extension; Univ. of Wisconsin corn
 * stand-count tables): plants in 1/1,000 acre of row × 1,000 = plants per acre.
 *
 * @param plantsCounted plants counted (0 or more)
 * @param rowFeetCounted length of row counted, feet (> 0)
 * @param rowSpacingIn distance between rows, inches (> 0)
 * @returns plants per acre, unrounded
 * @example plantsPerAcreFromStandCount(30, 17.424, 30) // 30,000
 */
export function plantsPerAcreFromStandCount(plantsCounted: number, rowFeetCounted: number, rowSpacingIn: number): number {
	const plants = requireNonNegative('plants counted', plantsCounted);
	const length = requirePositive('row length counted', rowFeetCounted, 'ft');
	const spacing = requirePositive('row spacing', rowSpacingIn, 'in');
	return (plants * SQUARE_FEET_PER_ACRE) / (length * (spacing / 12));
}
