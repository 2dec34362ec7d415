// Acres a record covers and how much product went on them. Pure: no I/O.

const SQ_FT_PER_ACRE = 43_560;

/** A lane as the record copies it from the season's plan. */
export interface LaneForArea {
	laneIndex: number;
	acres: number;
	widthFt: number;
}

/** Part of a lane, by distance along it (ft from the lane's start end). */
export interface LanePart {
	fromFt: number;
	toFt: number;
}

/**
 * Mean length of a lane along the A-B line: its area over its width. For a lane cut by a crooked
 * boundary this is the length of a rectangle of the same area and width — the distance a pass
 * covers on average, which is what a part "from 0 to 600 ft" is measured against.
 */
export function laneLengthFt(lane: Pick<LaneForArea, 'acres' | 'widthFt'>): number {
	if (!(lane.widthFt > 0) || !(lane.acres > 0)) return 0;
	return (lane.acres * SQ_FT_PER_ACRE) / lane.widthFt;
}

/**
 * Acres of one lane a record covers: the whole lane, or the share (to − from) / length of it.
 * Throws a RangeError a person can act on when the part is empty or runs past the lane's end.
 */
export function laneAcresCovered(lane: LaneForArea, part?: LanePart | null): number {
	if (!part) return lane.acres;
	const length = laneLengthFt(lane);
	if (!(part.fromFt >= 0) || !(part.toFt > part.fromFt)) {
		throw new RangeError(`Lane ${lane.laneIndex + 1}: "from" must be 0 ft or more and "to" greater than "from".`);
	}
	// Half a foot of slack: lengths are rounded where people read them.
	if (part.toFt > length + 0.5) {
		throw new RangeError(`Lane ${lane.laneIndex + 1} is about ${Math.round(length).toLocaleString('en-US')} ft long; ${part.toFt} ft runs past its end.`);
	}
	return lane.acres * (Math.min(part.toFt, length) - part.fromFt) / length;
}

/** Sum of the covered acres of the chosen lanes. */
export function recordAcres(lanes: { lane: LaneForArea; part?: LanePart | null }[]): number {
	return lanes.reduce((sum, l) => sum + laneAcresCovered(l.lane, l.part), 0);
}

// Units a rate may be given in (per acre), grouped so totals can be shown in the unit people buy in.
const LIQUID_FL_OZ: Record<string, number> = { 'fl oz': 1, pt: 16, qt: 32, gal: 128 };
const WEIGHT_OZ: Record<string, number> = { oz: 1, lb: 16 };
export const RATE_UNITS = ['fl oz', 'pt', 'qt', 'gal', 'oz', 'lb', 'ton', 'seeds', 'units', 'bu'] as const;
export type RateBase = (typeof RATE_UNITS)[number];

/** "pt/ac" → "pt"; null for anything that is not one of {@link RATE_UNITS} per acre. */
export function rateBaseUnit(rateUnit: string): RateBase | null {
	const m = rateUnit.trim().match(/^(.+?)\s*\/\s*(ac|acre)$/i);
	if (!m) return null;
	const base = m[1].toLowerCase().replace(/\s+/g, ' ').replace(/^floz$/, 'fl oz');
	return (RATE_UNITS as readonly string[]).includes(base) ? (base as RateBase) : null;
}

export interface ProductTotal {
	/** rate × acres, in the rate's own unit (the API's `total`). */
	total: number;
	totalUnit: string;
	/** The same amount in the unit it is bought and loaded in: liquids in gal, dry weights in lb. */
	shown: { amount: number; unit: string };
}

/**
 * Total product for an area: rate × acres in the rate's unit, and the same amount in gallons
 * (fl oz, pt, qt) or pounds (oz) — 1.5 pt/ac × 80 ac = 120 pt = 15 gal. US liquid measure:
 * 128 fl oz = 8 pt = 4 qt = 1 gal; 16 oz = 1 lb (common practice). Units with no larger sibling
 * (ton, seeds, units, bu) are shown as they are.
 */
export function productTotal(rate: number, rateUnit: string, acres: number): ProductTotal {
	const base = rateBaseUnit(rateUnit);
	if (!base) throw new RangeError(`"${rateUnit}" is not a rate per acre we know (${RATE_UNITS.map((u) => `${u}/ac`).join(', ')}).`);
	if (!(rate > 0) || !Number.isFinite(rate)) throw new RangeError('A rate must be a number greater than 0.');
	if (!(acres >= 0)) throw new RangeError('Acres cannot be negative.');
	const total = rate * acres;
	let shown = { amount: total, unit: base as string };
	if (base in LIQUID_FL_OZ) shown = { amount: (total * LIQUID_FL_OZ[base]) / LIQUID_FL_OZ.gal, unit: 'gal' };
	else if (base in WEIGHT_OZ) shown = { amount: (total * WEIGHT_OZ[base]) / WEIGHT_OZ.lb, unit: 'lb' };
	return { total, totalUnit: base, shown };
}

/**
 * The highest rate per acre that still looks like a real application, per unit (common practice,
 * from memory: field sprays rarely exceed 64 fl oz or 4 qt of product per acre; liquid fertilizer
 * side-dress and carrier volumes stay under about 60 gal/ac; dry fertilizer under about 800 lb/ac;
 * manure under about 40 ton/ac; seeding rates under about 300,000 seeds/ac). Above it a record is
 * kept but carries a warning to check the number, since a decimal slip is the usual cause.
 */
export const PLAUSIBLE_MAX_PER_ACRE: Record<RateBase, number> = {
	'fl oz': 128,
	pt: 16,
	qt: 8,
	gal: 60,
	oz: 64,
	lb: 800,
	ton: 40,
	seeds: 300_000,
	units: 4,
	bu: 6
};

/** The refusal line: a rate this high per acre cannot be real whatever the unit. */
export const IMPOSSIBLE_RATE = 10_000_000;

/** A warning text when the rate is above the plausible maximum for its unit, else null. */
export function rateWarning(rate: number, rateUnit: string): string | null {
	const base = rateBaseUnit(rateUnit);
	if (!base) return null;
	const max = PLAUSIBLE_MAX_PER_ACRE[base];
	return rate > max ? `${rate.toLocaleString('en-US')} ${base}/ac is more than the usual most of ${max.toLocaleString('en-US')} ${base}/ac. Saved as entered; check the label and the number.` : null;
}

const FAMILY: Record<string, string> = { 'fl oz': 'volume', pt: 'volume', qt: 'volume', gal: 'volume', oz: 'weight', lb: 'weight', ton: 'weight' };

/**
 * A warning when the rate is measured in another kind of unit than the product (a liquid given in
 * lb/ac): turning one into the other needs the product's density, so the record keeps the rate as
 * given and asks for a check. Null when the kinds agree.
 */
export function unitMismatchWarning(productName: string, productUnit: string, rateUnit: string): string | null {
	const base = rateBaseUnit(rateUnit);
	if (!base) return null;
	const a = FAMILY[productUnit] ?? productUnit;
	const b = FAMILY[base] ?? base;
	return a === b ? null : `${productName} is measured in ${productUnit}, but this rate is in ${base}/ac. Saved as entered; check the unit.`;
}
