// Seed needed per crop and variety for a plan's lanes. Pure. Arithmetic, not a recommendation.
import { seedUnitEstimate, SEED_UNIT_PRESETS } from '../agronomy/index';
import type { LaneAssignment } from './types';

export interface SeedNeed {
	crop: string;
	variety: string | null;
	lanes: number;
	acres: number;
	/** Acres in lanes of this crop and variety with no population set. */
	acresWithoutPopulation: number;
	seeds: number;
	seedsPerUnit: number | null;
	exactUnits: number | null;
	wholeUnits: number | null;
}

/**
 * Sums acres × population per (crop, variety) and converts to seed units (corn 80,000 kernels,
 * soybean 140,000 seeds per unit: common practice; override with seedsPerUnit).
 * @example seedNeeds([{ crop: 'corn', kind: 'crop', acres: 80, assignment: { populationPerAcre: 34000, … } }]) // 34 units
 */
export function seedNeeds(
	lanes: { crop: string; kind: string; acres: number; assignment: Pick<LaneAssignment, 'variety' | 'populationPerAcre'> | null }[],
	seedsPerUnit: Partial<Record<string, number>> = {}
): SeedNeed[] {
	const groups = new Map<string, SeedNeed>();
	for (const lane of lanes) {
		if (lane.kind !== 'crop' && lane.kind !== 'cover') continue;
		const variety = lane.assignment?.variety ?? null;
		const key = `${lane.crop}\u0000${variety ?? ''}`;
		const g = groups.get(key) ?? { crop: lane.crop, variety, lanes: 0, acres: 0, acresWithoutPopulation: 0, seeds: 0, seedsPerUnit: null, exactUnits: null, wholeUnits: null };
		g.lanes += 1;
		g.acres += lane.acres;
		const population = lane.assignment?.populationPerAcre;
		if (population) g.seeds += lane.acres * population;
		else g.acresWithoutPopulation += lane.acres;
		groups.set(key, g);
	}
	for (const g of groups.values()) {
		const crop = g.crop.toLowerCase().replace(/s$/, '');
		const perUnit = seedsPerUnit[crop] ?? (crop in SEED_UNIT_PRESETS ? SEED_UNIT_PRESETS[crop as keyof typeof SEED_UNIT_PRESETS].seedsPerUnit : undefined);
		if (perUnit && g.seeds > 0) {
			const est = seedUnitEstimate({ acres: 1, seedsPerAcre: g.seeds, seedsPerUnit: perUnit });
			Object.assign(g, { seedsPerUnit: perUnit, exactUnits: est.exactUnits, wholeUnits: est.wholeUnits });
		}
	}
	return [...groups.values()].sort((a, b) => a.crop.localeCompare(b.crop) || (a.variety ?? '').localeCompare(b.variety ?? ''));
}
