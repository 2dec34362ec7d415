// What the farm needs for a season: seed by variety and fertilizer by product, summed over the
// fields' adopted plans. Arithmetic on the farmer's own entries, never a recommendation. Pure.
import Papa from 'papaparse';
import { SEED_UNIT_PRESETS, wholeUnitsToBuy } from '../agronomy/index';
import type { LaneKind } from '../geometry/index';

/** A stored lane with its assignment, as the adopted plan holds it. */
export interface SeedLane {
	fieldId: string;
	crop: string;
	kind: LaneKind;
	variety: string | null;
	acres: number;
	populationPerAcre: number | null;
}

/** A seed catalogue entry (the varieties table). */
export interface CatalogueVariety {
	crop: string;
	name: string;
	seedsPerUnit: number | null;
}

export type SeedsPerUnitBasis = 'catalogue' | 'common practice';

export interface SeedNeed {
	crop: string;
	variety: string | null;
	fields: number;
	lanes: number;
	acres: number;
	seeds: number;
	averageSeedsPerAcre: number;
	seedsPerUnit: number | null;
	basis: SeedsPerUnitBasis | null;
	unitsExact: number | null;
	/** Whole units to order, rounded up by `wholeUnitsToBuy`. */
	unitsToOrder: number | null;
}

/** Planting lanes with no seeding rate entered: left out of the amounts, listed so nobody misses them. */
export interface UnratedSeed {
	crop: string;
	variety: string | null;
	fields: number;
	lanes: number;
	acres: number;
}

const norm = (s: string) => s.trim().toLowerCase();
const isPlanted = (kind: LaneKind) => kind === 'crop' || kind === 'cover';

function presetSeedsPerUnit(crop: string): number | null {
	const c = norm(crop);
	if (c === 'corn') return SEED_UNIT_PRESETS.corn.seedsPerUnit;
	if (c === 'soybean' || c === 'soybeans') return SEED_UNIT_PRESETS.soybean.seedsPerUnit;
	return null;
}

/**
 * Seed per crop and variety over every lane of the season: acres, seeds (acres × the lane's
 * population), units and whole units to order. Seeds per unit come from the catalogue entry
 * with the same crop and name; otherwise corn 80,000 and soybean 140,000 (common practice);
 * otherwise unknown (units left empty).
 *
 * Source: units = acres × seeds/ac ÷ seeds per unit (arithmetic).
 * @example seedNeeds([{ fieldId: 'a', crop: 'corn', kind: 'crop', variety: 'hybrid A', acres: 80, populationPerAcre: 34000 }], [])
 *   // [{ crop: 'corn', variety: 'hybrid A', unitsExact: 34, unitsToOrder: 34, basis: 'common practice', … }]
 */
export function seedNeeds(lanes: readonly SeedLane[], catalogue: readonly CatalogueVariety[]): { seed: SeedNeed[]; unrated: UnratedSeed[] } {
	const perUnit = new Map(catalogue.filter((v) => v.seedsPerUnit !== null && v.seedsPerUnit > 0).map((v) => [`${norm(v.crop)}|${norm(v.name)}`, v.seedsPerUnit as number]));
	type Group = { crop: string; variety: string | null; fields: Set<string>; lanes: number; acres: number; seeds: number };
	const rated = new Map<string, Group>();
	const unrated = new Map<string, Group>();
	for (const lane of lanes) {
		if (!isPlanted(lane.kind) || !(lane.acres > 0)) continue;
		const key = `${norm(lane.crop)}|${lane.variety ? norm(lane.variety) : ''}`;
		const hasRate = lane.populationPerAcre !== null && lane.populationPerAcre > 0;
		const groups = hasRate ? rated : unrated;
		const g = groups.get(key) ?? { crop: lane.crop, variety: lane.variety, fields: new Set<string>(), lanes: 0, acres: 0, seeds: 0 };
		g.fields.add(lane.fieldId);
		g.lanes += 1;
		g.acres += lane.acres;
		if (hasRate) g.seeds += lane.acres * (lane.populationPerAcre as number);
		groups.set(key, g);
	}
	const order = (a: { crop: string; variety: string | null }, b: { crop: string; variety: string | null }) =>
		norm(a.crop) === norm(b.crop) ? (a.variety ?? '').localeCompare(b.variety ?? '') : norm(a.crop).localeCompare(norm(b.crop));
	const seed = [...rated.entries()].map(([key, g]): SeedNeed => {
		const catalogued = g.variety ? perUnit.get(key) : undefined;
		const preset = presetSeedsPerUnit(g.crop);
		const seedsPerUnit = catalogued ?? preset;
		const unitsExact = seedsPerUnit ? g.seeds / seedsPerUnit : null;
		return {
			crop: g.crop,
			variety: g.variety,
			fields: g.fields.size,
			lanes: g.lanes,
			acres: g.acres,
			seeds: g.seeds,
			averageSeedsPerAcre: g.seeds / g.acres,
			seedsPerUnit,
			basis: catalogued ? 'catalogue' : preset ? 'common practice' : null,
			unitsExact,
			unitsToOrder: unitsExact === null ? null : wholeUnitsToBuy(unitsExact)
		};
	});
	return {
		seed: seed.sort(order),
		unrated: [...unrated.values()].map((g) => ({ crop: g.crop, variety: g.variety, fields: g.fields.size, lanes: g.lanes, acres: g.acres })).sort(order)
	};
}

/** One fertilizer line's amount on one field, as the equipment module computes it. */
export interface FieldFertilizer {
	fieldId: string;
	product: string | null;
	lineName: string;
	gallonsPerAcre: number;
	acres: number;
	gallons: number;
	poundsN: number | null;
}

export interface FertilizerNeed {
	product: string;
	fields: number;
	acres: number;
	gallons: number;
	/** Null when any field's line has no analysis to count pounds of N from. */
	poundsN: number | null;
	/** The entered rates (gal/ac) seen across fields, lowest first. */
	ratesGallonsPerAcre: number[];
}

/** Sums fertilizer per product (or line name when no product is named) over the fields. */
export function fertilizerNeeds(lines: readonly FieldFertilizer[]): FertilizerNeed[] {
	const groups = new Map<string, FertilizerNeed & { fieldIds: Set<string> }>();
	for (const l of lines) {
		if (!(l.acres > 0)) continue;
		const name = l.product ?? l.lineName;
		const key = norm(name);
		const g = groups.get(key) ?? { product: name, fields: 0, acres: 0, gallons: 0, poundsN: 0, ratesGallonsPerAcre: [], fieldIds: new Set<string>() };
		g.fieldIds.add(l.fieldId);
		g.acres += l.acres;
		g.gallons += l.gallons;
		g.poundsN = g.poundsN === null || l.poundsN === null ? null : g.poundsN + l.poundsN;
		if (!g.ratesGallonsPerAcre.includes(l.gallonsPerAcre)) g.ratesGallonsPerAcre.push(l.gallonsPerAcre);
		groups.set(key, g);
	}
	return [...groups.values()]
		.map(({ fieldIds, ...g }) => ({ ...g, fields: fieldIds.size, ratesGallonsPerAcre: g.ratesGallonsPerAcre.sort((a, b) => a - b) }))
		.sort((a, b) => a.product.localeCompare(b.product));
}

const fixed = (n: number | null, digits: number) => (n === null ? '' : n.toFixed(digits));

/** The needs as CSV (RFC 4180), one row per item, with units in the column names. */
export function needsCsv(season: number, seed: readonly SeedNeed[], unrated: readonly UnratedSeed[], fertilizer: readonly FertilizerNeed[]): string {
	const header = ['season', 'item', 'crop', 'variety_or_product', 'fields', 'lanes', 'acres_ac', 'average_seeds_per_ac', 'seeds', 'seeds_per_unit', 'seeds_per_unit_basis', 'units_exact', 'units_to_order', 'gallons_gal', 'pounds_n_lb', 'note'];
	const rows: (string | number)[][] = [];
	for (const s of seed) {
		rows.push([season, 'seed', s.crop, s.variety ?? '', s.fields, s.lanes, s.acres.toFixed(2), Math.round(s.averageSeedsPerAcre), Math.round(s.seeds), s.seedsPerUnit ?? '', s.basis ?? '', fixed(s.unitsExact, 2), s.unitsToOrder ?? '', '', '', s.seedsPerUnit ? '' : 'no seeds-per-unit figure: add it to the seed catalogue']);
	}
	for (const u of unrated) {
		rows.push([season, 'seed without a rate', u.crop, u.variety ?? '', u.fields, u.lanes, u.acres.toFixed(2), '', '', '', '', '', '', '', '', 'no seeding rate entered on these lanes']);
	}
	for (const f of fertilizer) {
		rows.push([season, 'fertilizer', '', f.product, f.fields, '', f.acres.toFixed(2), '', '', '', '', '', '', f.gallons.toFixed(1), fixed(f.poundsN, 1), `entered rates ${f.ratesGallonsPerAcre.join(', ')} gal/ac`]);
	}
	// Cells starting with = + - @ would run as formulas in a spreadsheet: quote them as text.
	return Papa.unparse({ fields: header, data: rows }, { escapeFormulae: true, newline: '\r\n' });
}
