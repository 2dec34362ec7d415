import { AgronomyError } from './errors.js';
import { requireInRange, requireNonEmpty, requireNonNegative, requirePositive } from './validate.js';

/**
 * Land Equivalent Ratio: Σ Yᵢ(intercrop) ÷ Yᵢ(sole). Above 1, the mixture produced more than the
 * same land split into sole crops would have.
 *
 * Each `intercropYield` must be per acre of the TOTAL intercrop land (not per acre of the crop's own
 * strips); {@link landEquivalentRatioFromStrips} converts strip yields.
 *
 * Source: R. Mead & R. W. Willey, Experimental Agriculture 16:217–228 (1980).
 *
 * @example landEquivalentRatio([{ intercropYield: 115, soleYield: 200 }, { intercropYield: 28.5, soleYield: 60 }]) // 1.05
 */
export function landEquivalentRatio(crops: { intercropYield: number; soleYield: number }[]): number {
	const list = requireNonEmpty<{ intercropYield: number; soleYield: number }>('crops', crops);
	let total = 0;
	list.forEach((crop, i) => {
		const intercrop = requireNonNegative(`crop ${i + 1} intercrop yield`, crop?.intercropYield);
		const sole = requirePositive(`crop ${i + 1} sole yield`, crop?.soleYield);
		total += intercrop / sole;
	});
	return total;
}

/**
 * Land Equivalent Ratio from strip yields: each crop's yield per acre of its own strips is scaled by
 * the share of the intercrop land its strips occupy, then {@link landEquivalentRatio} applies.
 * Shares must not add up to more than 1.
 *
 * Source: R. Mead & R. W. Willey, Experimental Agriculture 16:217–228 (1980).
 *
 * @example landEquivalentRatioFromStrips([
 *   { stripYield: 230, landShare: 0.5, soleYield: 200 },
 *   { stripYield: 57, landShare: 0.5, soleYield: 60 }
 * ]) // 1.05
 */
export function landEquivalentRatioFromStrips(
	crops: { stripYield: number; landShare: number; soleYield: number }[]
): number {
	const list = requireNonEmpty<{ stripYield: number; landShare: number; soleYield: number }>('crops', crops);
	let shareTotal = 0;
	const converted = list.map((crop, i) => {
		const stripYield = requireNonNegative(`crop ${i + 1} strip yield`, crop?.stripYield);
		const share = requireInRange(`crop ${i + 1} land share`, crop?.landShare, {
			min: 0,
			max: 1,
			minInclusive: false,
			maxInclusive: true,
			hint: 'a fraction: 0.5 for half the land'
		});
		shareTotal += share;
		return { intercropYield: stripYield * share, soleYield: crop.soleYield };
	});
	if (shareTotal > 1 + 1e-9) {
		throw new AgronomyError(
			'out_of_range',
			'land shares',
			`land shares must add up to at most 1; got ${Number(shareTotal.toPrecision(12))}`
		);
	}
	return landEquivalentRatio(converted);
}
