// Grazing figures for a group, a move and a lane, on the agronomy module's formulas. Pure.
// They work the user's numbers through published formulas; none of them is a recommendation.
import { animalUnits, dailyDryMatterLb, grazingDays, stockingDensity, AgronomyError } from '../agronomy/index';
import { DEFAULT_INTAKE, PUBLISHED_AU_EQUIVALENTS, WATER_PER_HEAD, type Species } from './species';

const SQ_FT_PER_ACRE = 43_560;

export interface GroupFigures {
	/** head × average weight ÷ 1,000 lb. */
	animalUnits: number;
	/** head × the published per-head equivalent, where a table lists the species. */
	publishedAnimalUnits: number | null;
	publishedEquivalentPerHead: number | null;
	publishedSource: string | null;
	water: { lowGal: number; highGal: number; source: string };
}

/** Animal units and daily water of a group; a group of 0 head has 0 of both. */
export function groupFigures(species: Species, head: number, averageWeightLb: number): GroupFigures {
	const published = PUBLISHED_AU_EQUIVALENTS[species] ?? null;
	const units = head === 0 ? 0 : animalUnits(species, head, averageWeightLb);
	return {
		animalUnits: units,
		publishedAnimalUnits: published ? head * published.perHead : null,
		publishedEquivalentPerHead: published?.perHead ?? null,
		publishedSource: published?.source ?? null,
		water: dailyWater(species, head)
	};
}

/**
 * Drinking water a group needs a day, US gallons, low and high end of the published figure.
 * @example dailyWater('sheep', 30) // { lowGal: 22.5, highGal: 60, … }
 */
export function dailyWater(species: Species, head: number): { lowGal: number; highGal: number; source: string } {
	const w = WATER_PER_HEAD[species];
	if (!w) throw new AgronomyError('unknown_species', 'species', `species must be one of ${Object.keys(WATER_PER_HEAD).join(', ')}; got ${JSON.stringify(species)}`);
	if (!Number.isInteger(head) || head < 0) throw new AgronomyError('not_integer', 'head', `head must be a whole number of 0 or more; got ${head}`);
	return { lowGal: head * w.lowGal, highGal: head * w.highGal, source: w.source };
}

export interface MoveFigureInput {
	species: Species;
	head: number;
	averageWeightLb: number;
	acres: number;
	forageLbPerAcre: number | null;
	utilization: number | null;
	intakePct: number | null;
	/** Planned days on the stretch (from the move's dates). */
	days: number;
}

export interface MoveFigures {
	animalUnits: number;
	stockingDensityAuPerAcre: number;
	intakePct: number;
	dailyDryMatterLb: number;
	/** Days the stretch feeds the group, or null without a forage figure. */
	grazingDays: number | null;
	/** Forage the group eats over the planned days, lb DM. */
	plannedDryMatterLb: number;
}

/** Stocking density, daily intake and grazing days of one move (NCAT ATTRA, Grazier's Math). */
export function moveFigures(p: MoveFigureInput): MoveFigures {
	const intakePct = p.intakePct ?? DEFAULT_INTAKE[p.species].pct;
	const units = animalUnits(p.species, p.head, p.averageWeightLb);
	const daily = dailyDryMatterLb(p.head, p.averageWeightLb, intakePct);
	const days =
		p.forageLbPerAcre == null
			? null
			: grazingDays({ acres: p.acres, forageLbPerAcre: p.forageLbPerAcre, utilization: p.utilization ?? 0.5, head: p.head, weightLb: p.averageWeightLb, intakePct });
	return {
		animalUnits: units,
		stockingDensityAuPerAcre: stockingDensity(units, p.acres),
		intakePct,
		dailyDryMatterLb: daily,
		grazingDays: days,
		plannedDryMatterLb: daily * p.days
	};
}

/**
 * Length of lane a group needs for a planned number of days: the grazing-days formula solved for
 * area (acres = days × daily intake ÷ (forage × utilization)), then area ÷ lane width.
 * Source: NCAT ATTRA, "Grazier's Math" (the same formula as `grazingDays`).
 *
 * @example stretchLengthFt({ days: 15.238, laneWidthFt: 10, forageLbPerAcre: 2400, utilization: 0.5, head: 30, weightLb: 150, intakePct: 3.5 }) // ≈ 8,712 ft (2 ac)
 */
export function stretchLengthFt(p: {
	days: number;
	laneWidthFt: number;
	forageLbPerAcre: number;
	utilization: number;
	head: number;
	weightLb: number;
	intakePct: number;
}): number {
	if (!Number.isFinite(p.days) || p.days <= 0) throw new AgronomyError('not_positive', 'days', `days must be more than 0; got ${p.days}`);
	if (!Number.isFinite(p.laneWidthFt) || p.laneWidthFt <= 0) throw new AgronomyError('not_positive', 'lane width', `lane width must be more than 0 ft; got ${p.laneWidthFt}`);
	if (!Number.isFinite(p.forageLbPerAcre) || p.forageLbPerAcre <= 0) {
		throw new AgronomyError('not_positive', 'forage above residual', `forage above residual must be more than 0 lb/ac; got ${p.forageLbPerAcre}`);
	}
	// One acre of this stretch feeds the group grazingDays(1 ac) days; scale to the planned days.
	const daysPerAcre = grazingDays({ acres: 1, forageLbPerAcre: p.forageLbPerAcre, utilization: p.utilization, head: p.head, weightLb: p.weightLb, intakePct: p.intakePct });
	const acres = p.days / daysPerAcre;
	return (acres * SQ_FT_PER_ACRE) / p.laneWidthFt;
}

/** Average width of a lane from its area and length (lanes clipped by a curved edge vary). */
export function laneWidthFt(acres: number, lengthFt: number): number {
	return lengthFt > 0 ? (acres * SQ_FT_PER_ACRE) / lengthFt : 0;
}
