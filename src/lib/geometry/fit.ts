import { GeometryError } from './errors';
import { INCHES_PER_FOOT } from './units';

/** Widths that agree within this (≈ 0.3 mm) count as equal. */
const TOLERANCE_FT = 0.001;

export interface EquipmentFit {
	/** Passes needed to cover the lane. */
	passes: number;
	/** True when the lane takes a whole number of passes with nothing hanging over a neighbour. */
	fits: boolean;
	/** How far the implement reaches onto each neighbouring lane when centred in a narrower lane, inches. */
	overlapInEachSide: number;
	/** Share (0–1) of the last pass's working width that lands on this lane; 1 when passes divide evenly. */
	lastPassCoverage: number;
}

/**
 * How an implement of a given working width covers a lane.
 * - Implement wider than the lane: one pass, centred, overhanging (implement − lane) ÷ 2 onto each
 *   neighbour (a 15-ft drill in a 10-ft lane: 30 in each side); coverage lane ÷ implement; no fit.
 * - Otherwise: ⌈lane ÷ implement⌉ passes kept inside the lane (the last one overlaps the previous
 *   pass rather than the neighbour); the last pass covers the remainder ÷ implement (40-ft lane,
 *   15-ft drill: 3 passes, 10/15 = 0.667). It fits only when the passes divide the lane evenly.
 * Whole-multiple widths follow USDA NRCS Conservation Practice Standard 332, Contour Buffer Strips
 * (national standard, 2014): cropped strips a multiple of the full equipment width.
 *
 * @param laneWidthFt lane width, feet (> 0)
 * @param implementWidthFt implement working width, feet (> 0)
 * @returns passes, fits, overhang per side (in), last pass coverage
 * @throws GeometryError when a width is not a positive number
 * @example equipmentFit(20, 20) // { passes: 1, fits: true, overlapInEachSide: 0, lastPassCoverage: 1 }
 */
export function equipmentFit(laneWidthFt: number, implementWidthFt: number): EquipmentFit {
	for (const [name, v] of [['lane width', laneWidthFt], ['implement width', implementWidthFt]] as const) {
		if (typeof v !== 'number' || !Number.isFinite(v)) throw new GeometryError('not-finite', `The ${name} must be a number, got ${String(v)}.`);
		if (v <= 0) throw new GeometryError('invalid-number', `The ${name} is ${v} ft; it must be more than zero.`);
	}
	if (implementWidthFt > laneWidthFt + TOLERANCE_FT) {
		return {
			passes: 1,
			fits: false,
			overlapInEachSide: ((implementWidthFt - laneWidthFt) / 2) * INCHES_PER_FOOT,
			lastPassCoverage: laneWidthFt / implementWidthFt
		};
	}
	const passes = Math.max(1, Math.ceil(laneWidthFt / implementWidthFt - TOLERANCE_FT / implementWidthFt));
	const remainder = laneWidthFt - (passes - 1) * implementWidthFt;
	const even = Math.abs(remainder - implementWidthFt) <= TOLERANCE_FT;
	return {
		passes,
		fits: even,
		overlapInEachSide: 0,
		lastPassCoverage: even ? 1 : Math.min(1, remainder / implementWidthFt)
	};
}
