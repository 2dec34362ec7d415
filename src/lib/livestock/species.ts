// What the grazing figures assume for each species, with where each number comes from. Pure.
import type { GrazingSpecies } from '../agronomy/index';

export type Species = GrazingSpecies;
export const SPECIES: readonly Species[] = ['sheep', 'goat', 'hog', 'poultry', 'cattle'];

export const SPECIES_LABELS: Record<Species, string> = {
	sheep: 'Sheep',
	goat: 'Goats',
	hog: 'Hogs',
	poultry: 'Poultry',
	cattle: 'Cattle'
};

export interface PublishedEquivalent {
	perHead: number;
	source: string;
}

/**
 * Animal-unit equivalents per head where forage tables list them. Source: USDA-NRCS National Range
 * and Pasture Handbook (values from memory: verify against the current edition). Hogs and poultry
 * are not in forage animal-unit tables.
 */
export const PUBLISHED_AU_EQUIVALENTS: Partial<Record<Species, PublishedEquivalent>> = {
	cattle: { perHead: 1.0, source: 'USDA-NRCS National Range and Pasture Handbook (cow with calf; from memory)' },
	sheep: { perHead: 0.2, source: 'USDA-NRCS National Range and Pasture Handbook (mature sheep; from memory)' },
	goat: { perHead: 0.15, source: 'USDA-NRCS National Range and Pasture Handbook (mature goat; from memory)' }
};

export interface IntakeDefault {
	pct: number;
	source: string;
}

/**
 * Forage dry matter eaten a day, % of body weight, used when a move does not say. Ruminants from
 * NCAT ATTRA "Grazier's Math" (beef 2.5–3.0, dry ewes 2.5, lactating ewes 4.5, goats 4–5); hogs
 * and poultry on pasture eat mostly ration, so their forage share is a low common-practice guess.
 */
export const DEFAULT_INTAKE: Record<Species, IntakeDefault> = {
	cattle: { pct: 2.75, source: 'NCAT ATTRA, Grazier’s Math (beef 2.5–3.0 %)' },
	sheep: { pct: 3.5, source: 'NCAT ATTRA, Grazier’s Math (ewes 2.5 % dry to 4.5 % lactating)' },
	goat: { pct: 4.5, source: 'NCAT ATTRA, Grazier’s Math (goats 4–5 %)' },
	hog: { pct: 1, source: 'common practice (most of a pastured hog’s feed is ration)' },
	poultry: { pct: 0.5, source: 'common practice (most of a pastured bird’s feed is ration)' }
};

/**
 * Days a stretch should rest before the group comes back (common practice, no single published
 * figure: regrowth of cool-season pasture and the life cycle of sheep and goat stomach worms are
 * the usual reasons given).
 */
export const REST_TARGET_DAYS: Record<Species, { days: number; source: string }> = {
	cattle: { days: 30, source: 'common practice (regrowth of cool-season pasture)' },
	sheep: { days: 40, source: 'common practice (regrowth, and breaking the stomach-worm cycle)' },
	goat: { days: 40, source: 'common practice (regrowth, and breaking the stomach-worm cycle)' },
	hog: { days: 60, source: 'common practice (rooting damage needs longer to heal)' },
	poultry: { days: 30, source: 'common practice (manure load and regrowth)' }
};

export interface WaterFigure {
	/** US gallons per head per day, low and high end of the published range. */
	lowGal: number;
	highGal: number;
	source: string;
}

/**
 * Drinking water per head per day. Hot weather, lactation and dry feed push the need to the high
 * end or past it: give free access to clean water whatever the figure says.
 */
export const WATER_PER_HEAD: Record<Species, WaterFigure> = {
	cattle: { lowGal: 10, highGal: 15, source: 'J. Renewable Energy (Hindawi) 2017, art. 8504283, Table 1: cattle 10–15 gal/day' },
	sheep: { lowGal: 0.75, highGal: 2, source: 'Lincoln University (J. Pennington, 2014): 150-lb ewes 0.75–1.5 gal/day; J. Renewable Energy 2017, Table 1: 2 gal/day' },
	goat: { lowGal: 2, highGal: 2, source: 'J. Renewable Energy (Hindawi) 2017, art. 8504283, Table 1: each goat 2 gal/day' },
	hog: { lowGal: 2, highGal: 5, source: 'growing–finishing pigs 2–5 gal/day (from memory: extension tables; verify)' },
	poultry: { lowGal: 0.06, highGal: 0.12, source: 'J. Renewable Energy (Hindawi) 2017, art. 8504283, Table 1: 6–12 gal per 100 chickens a day' }
};
