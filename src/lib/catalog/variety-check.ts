// Lane assignments against the farm's seed catalogue. Pure: no I/O, runs in the browser and the server.
import { seedUnitEstimate } from '../agronomy/seeding';

/** What a plan needs to know of a catalogue variety. */
export interface CatalogueVariety {
	id: string;
	crop: string;
	name: string;
	relativeMaturity: number | null;
	seedsPerUnit: number | null;
}

const key = (s: string) => s.trim().toLowerCase().replace(/\s+/g, ' ');

/** Crop names compared the way people write them: "Corn", "corn " and "corn" are one crop. */
export function sameCrop(a: string, b: string): boolean {
	return key(a) === key(b);
}

/** Catalogue entries carrying this name, in any crop. */
export function entriesNamed(catalogue: readonly CatalogueVariety[], name: string): CatalogueVariety[] {
	const k = key(name);
	return catalogue.filter((v) => key(v.name) === k);
}

/** The catalogue entry of this crop and name, if there is one. */
export function catalogueVariety(catalogue: readonly CatalogueVariety[], crop: string, name: string | null): CatalogueVariety | null {
	if (!name) return null;
	return entriesNamed(catalogue, name).find((v) => sameCrop(v.crop, crop)) ?? null;
}

export function mismatchMessage(laneIndex: number, laneCrop: string, variety: CatalogueVariety): string {
	return `Lane ${laneIndex + 1} is a ${laneCrop} lane, but "${variety.name}" is a ${variety.crop} variety in the seed catalogue. Choose a ${laneCrop} variety, or change the lane's crop.`;
}

export interface AssignmentToCheck {
	laneIndex: number;
	variety: string | null;
	varietyId?: string | null;
}

/**
 * Checks each assignment's variety against its lane's crop. A catalogue variety (by id, or by a
 * name that only another crop's entry carries) of another crop is refused; a name the catalogue
 * does not know is free text and passes. Returns each assignment's variety name (an id becomes
 * the catalogue name) and field errors keyed `assignments.<i>.variety` / `.varietyId`.
 */
export function checkAssignmentVarieties(
	lanes: readonly { index: number; crop: string }[],
	assignments: readonly AssignmentToCheck[],
	catalogue: readonly CatalogueVariety[]
): { varieties: (string | null)[]; fields: Record<string, string[]> } {
	const laneCrop = new Map(lanes.map((l) => [l.index, l.crop]));
	const fields: Record<string, string[]> = {};
	const varieties = assignments.map((a, i) => {
		const crop = laneCrop.get(a.laneIndex);
		if (a.varietyId) {
			const entry = catalogue.find((v) => v.id === a.varietyId);
			if (!entry) {
				fields[`assignments.${i}.varietyId`] = ['This variety is not in the farm\'s seed catalogue (it may have been deleted). Pick another, or type the name.'];
				return a.variety;
			}
			if (crop !== undefined && !sameCrop(entry.crop, crop)) fields[`assignments.${i}.variety`] = [mismatchMessage(a.laneIndex, crop, entry)];
			return entry.name;
		}
		if (!a.variety || crop === undefined) return a.variety;
		const named = entriesNamed(catalogue, a.variety);
		if (named.length && !named.some((v) => sameCrop(v.crop, crop))) fields[`assignments.${i}.variety`] = [mismatchMessage(a.laneIndex, crop, named[0])];
		return a.variety;
	});
	return { varieties, fields };
}

/** One line of the seed table before the catalogue is consulted. */
export interface SeedNeed {
	crop: string;
	variety: string | null;
	acres: number;
	seeds: number;
	seedsPerUnit: number | null;
	unitsExact: number | null;
	unitsWhole: number | null;
}

/**
 * The seed table with the catalogue's word on each line: the variety's own crop and its seeds
 * per unit (the seller's count entered in the catalogue) replace the per-crop preset.
 */
export function withCatalogueUnits<T extends SeedNeed>(needs: readonly T[], catalogue: readonly CatalogueVariety[]): (T & { fromCatalogue: boolean })[] {
	return needs.map((n) => {
		const entry = catalogueVariety(catalogue, n.crop, n.variety) ?? (n.variety ? (entriesNamed(catalogue, n.variety)[0] ?? null) : null);
		if (!entry) return { ...n, fromCatalogue: false };
		if (!entry.seedsPerUnit || !(n.seeds > 0)) return { ...n, crop: entry.crop, fromCatalogue: true };
		const estimate = seedUnitEstimate({ acres: n.acres, seedsPerAcre: n.seeds / n.acres, seedsPerUnit: entry.seedsPerUnit });
		return { ...n, crop: entry.crop, seedsPerUnit: entry.seedsPerUnit, unitsExact: estimate.exactUnits, unitsWhole: estimate.wholeUnits, fromCatalogue: true };
	});
}
