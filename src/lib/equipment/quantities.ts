import {
	gallonsForArea,
	NITROGEN_DENSITY_CAUTION,
	NITROGEN_PRODUCTS,
	poundsNitrogenPerAcre,
	poundsNitrogenTotal,
	SEED_UNIT_PRESETS,
	seedUnitEstimate,
	wholeUnitsToBuy,
	type NitrogenProductPreset
} from '../agronomy/index';
import type { LaneAssignment } from '../plans/types';
import { EquipmentError } from './errors';
import { isPlantingLane, resolveLanes, sameCrop, type LaneInput, type PlanLane } from './lanes';
import type { PassUnit } from './passes';
import { checkPlanter } from './planter';
import type { PlanterSetup } from './types';

/** A fertilizer product's analysis, when it is not one of the presets. */
export interface FertilizerAnalysis {
	name: string;
	percentN: number;
	poundsPerGallon: number;
}

/** The rate the farmer entered for one fertilizer line. */
export interface LineRate {
	gallonsPerAcre: number;
	/** A preset id ('uan-28' …) or an analysis; default: the preset named like the line's product. */
	product?: NitrogenProductPreset['id'] | FertilizerAnalysis;
}

export interface QuantityOptions {
	/** Seeds per unit by crop; corn 80,000 and soybean 140,000 otherwise (common practice). */
	seedsPerUnit?: Partial<Record<string, number>>;
	/** Units per bag or box by crop; 1 otherwise. */
	unitsPerBag?: Partial<Record<string, number>>;
	/** Entered rates by fertilizer line id; lines without one are left out (and noted). */
	rates?: Partial<Record<string, LineRate>>;
	/** When given, a line's acres follow the rows where it is on in these passes. */
	passes?: readonly { units: readonly PassUnit[] }[];
}

export interface VarietyQuantity {
	crop: string;
	variety: string | null;
	laneIndexes: number[];
	acres: number;
	/** Seeds ÷ acres over the variety's lanes. */
	averageSeedsPerAcre: number;
	seeds: number;
	seedsPerUnit: number | null;
	seedsPerUnitBasis: 'entered' | 'common practice' | null;
	unitsExact: number | null;
	unitsWhole: number | null;
	unitsPerBag: number;
	bags: number | null;
}

export interface FertilizerQuantity {
	lineId: string;
	lineName: string;
	product: string | null;
	/** The farmer's entered rate, not advice. */
	gallonsPerAcre: number;
	/** Acres where the line is on. */
	acres: number;
	laneIndexes: number[];
	gallons: number;
	percentN: number | null;
	poundsPerGallon: number | null;
	densityBasis: 'published' | 'entered' | null;
	poundsNPerAcre: number | null;
	poundsN: number | null;
}

export interface FieldQuantities {
	varieties: VarietyQuantity[];
	fertilizer: FertilizerQuantity[];
	totals: {
		acresAssigned: number;
		byCrop: Record<string, { acres: number; seeds: number; unitsExact: number | null; unitsWhole: number | null; bags: number | null }>;
		gallonsByProduct: Record<string, number>;
		poundsN: number;
	};
	/** What was left out and why, and density cautions. */
	notes: string[];
}

function presetSeedsPerUnit(crop: string): number | null {
	const c = crop.trim().toLowerCase();
	if (c === 'corn') return SEED_UNIT_PRESETS.corn.seedsPerUnit;
	if (c === 'soybean' || c === 'soybeans') return SEED_UNIT_PRESETS.soybean.seedsPerUnit;
	return null;
}

function byCropOption<T>(record: Partial<Record<string, T>> | undefined, crop: string): T | undefined {
	if (!record) return undefined;
	const key = Object.keys(record).find((k) => sameCrop(k, crop));
	return key === undefined ? undefined : record[key];
}

/**
 * Seed per crop and variety: seeds, units (exact and whole) and bags, from the entered populations.
 * Needs no planter, so the plan page and a sheet without a planter use it too. Lanes without a
 * population are left out and noted.
 *
 * Source: seed units = acres × seeds/ac ÷ seeds per unit (arithmetic); corn 80,000 and
 * soybean 140,000 seeds per unit are common practice (override per crop).
 * @example seedQuantities(lanes, assignments).varieties[0].unitsExact // 34 for 80 ac at 34,000
 */
export function seedQuantities(
	lanes: readonly (LaneInput | PlanLane)[],
	assignments: readonly LaneAssignment[],
	options: Pick<QuantityOptions, 'seedsPerUnit' | 'unitsPerBag'> = {},
	notes: string[] = []
): { varieties: VarietyQuantity[]; notes: string[] } {
	const byIndex = new Map(resolveLanes(lanes).map((l) => [l.index, l]));
	const acresOf = (lane: PlanLane): number => {
		if (lane.acres === null || !(lane.acres >= 0)) throw new EquipmentError('invalid-lane', `Lane ${lane.index + 1} has no acres; lay the plan out again before computing amounts.`);
		return lane.acres;
	};
	const groups = new Map<string, { crop: string; variety: string | null; lanes: number[]; acres: number; seeds: number }>();
	for (const a of assignments) {
		const lane = byIndex.get(a.laneIndex);
		if (!lane) {
			notes.push(`An assignment names lane ${a.laneIndex + 1}, which is not in this plan; it was left out.`);
			continue;
		}
		if (!isPlantingLane(lane.kind)) continue;
		if (a.populationPerAcre === null || !(a.populationPerAcre > 0)) {
			notes.push(`Lane ${lane.index + 1} (${lane.crop}) has no seeding rate entered; it is left out of the seed amounts.`);
			continue;
		}
		const key = `${lane.crop.trim().toLowerCase()}|${a.variety ?? ''}`;
		const g = groups.get(key) ?? { crop: lane.crop, variety: a.variety, lanes: [], acres: 0, seeds: 0 };
		const acres = acresOf(lane);
		g.lanes.push(lane.index);
		g.acres += acres;
		g.seeds += acres * a.populationPerAcre;
		groups.set(key, g);
	}
	const varieties: VarietyQuantity[] = [...groups.values()].map((g) => {
		const entered = byCropOption(options.seedsPerUnit, g.crop);
		const seedsPerUnit = entered ?? presetSeedsPerUnit(g.crop);
		const unitsPerBag = byCropOption(options.unitsPerBag, g.crop) ?? 1;
		if (!(unitsPerBag > 0)) throw new EquipmentError('invalid-rate', `Units per bag for ${g.crop} must be more than zero, got ${String(unitsPerBag)}.`);
		const base = { crop: g.crop, variety: g.variety, laneIndexes: g.lanes.sort((x, y) => x - y), acres: g.acres, averageSeedsPerAcre: g.seeds / g.acres, unitsPerBag };
		if (seedsPerUnit === null) {
			notes.push(`No seeds-per-unit figure for ${g.crop}; enter the seller's count to get units.`);
			return { ...base, seeds: g.seeds, seedsPerUnit: null, seedsPerUnitBasis: null, unitsExact: null, unitsWhole: null, bags: null };
		}
		const estimate = seedUnitEstimate({ acres: g.acres, seedsPerAcre: g.seeds / g.acres, seedsPerUnit });
		return {
			...base,
			seeds: estimate.seeds,
			seedsPerUnit: estimate.seedsPerUnit,
			seedsPerUnitBasis: entered !== undefined ? 'entered' : 'common practice',
			unitsExact: estimate.exactUnits,
			unitsWhole: estimate.wholeUnits,
			bags: wholeUnitsToBuy(estimate.exactUnits / unitsPerBag)
		};
	});

	return { varieties, notes };
}

/**
 * Seed and fertilizer amounts for a field: per variety seeds, units (exact and whole) and bags;
 * per fertilizer line gallons (entered gal/ac × acres where the line is on) and pounds of N
 * (lb/gal × %N); totals per field. Arithmetic only, through the agronomy helpers: rates are the
 * farmer's, never a recommendation.
 *
 * Sources: seed units = acres × seeds/ac ÷ seeds per unit (arithmetic); seeds per unit
 * corn 80,000 / soybean 140,000 are common practice (override per crop); lb N/ac = gal/ac ×
 * lb/gal × %N ÷ 100 (J. Camberato, Purdue Extension 2023).
 *
 * Where a line is on: from `options.passes` when given (share of each lane's rows the line runs on);
 * otherwise from the planter: the share of units carrying the lane's crop that have the line on.
 *
 * @throws EquipmentError('invalid-lane') for an assigned lane without acres; 'invalid-rate' for a bad rate
 * @example
 * seedAndFertilizerQuantities(lanes, assignments, planter, { rates: { n: { gallonsPerAcre: 20, product: 'uan-28' } } })
 *   .fertilizer[0].poundsNPerAcre // 59.36
 */
export function seedAndFertilizerQuantities(
	lanes: readonly (LaneInput | PlanLane)[],
	assignments: readonly LaneAssignment[],
	planter: PlanterSetup,
	options: QuantityOptions = {}
): FieldQuantities {
	const checked = checkPlanter(planter);
	const planLanes = resolveLanes(lanes);
	const byIndex = new Map(planLanes.map((l) => [l.index, l]));
	const notes: string[] = [];
	const acresOf = (lane: PlanLane): number => {
		if (lane.acres === null || !(lane.acres >= 0)) throw new EquipmentError('invalid-lane', `Lane ${lane.index + 1} has no acres; lay the plan out again before computing amounts.`);
		return lane.acres;
	};

	const { varieties } = seedQuantities(planLanes, assignments, options, notes);

	// Fertilizer, per line with an entered rate.
	const fertilizer: FertilizerQuantity[] = [];
	let presetDensityUsed = false;
	for (const line of checked.lines.values()) {
		const rate = options.rates?.[line.id];
		if (!rate) {
			notes.push(`No rate entered for ${line.name}; it is left out of the fertilizer amounts.`);
			continue;
		}
		const product = resolveProduct(rate, line.product);
		let acres = 0;
		const laneIndexes: number[] = [];
		for (const lane of planLanes) {
			if (!isPlantingLane(lane.kind) || lane.rowPositionsIn.length === 0) continue;
			const share = lineShare(line.id, lane, checked.units, options.passes);
			if (share <= 0) continue;
			acres += acresOf(lane) * share;
			laneIndexes.push(lane.index);
		}
		const gallons = acres > 0 ? gallonsForArea(acres, rate.gallonsPerAcre) : 0;
		let nitrogen: Pick<FertilizerQuantity, 'percentN' | 'poundsPerGallon' | 'densityBasis' | 'poundsNPerAcre' | 'poundsN'> = { percentN: null, poundsPerGallon: null, densityBasis: null, poundsNPerAcre: null, poundsN: null };
		if (product) {
			const perAcre = poundsNitrogenPerAcre(rate.gallonsPerAcre, product.poundsPerGallon, product.percentN);
			nitrogen = {
				percentN: product.percentN,
				poundsPerGallon: product.poundsPerGallon,
				densityBasis: product.basis,
				poundsNPerAcre: perAcre,
				poundsN: acres > 0 ? poundsNitrogenTotal(acres, rate.gallonsPerAcre, product.poundsPerGallon, product.percentN) : 0
			};
			if (product.basis !== 'entered') presetDensityUsed = true;
		} else {
			notes.push(`${line.name}: no analysis for ${line.product ?? 'its product'}; enter its %N and lb/gal from the product label or SDS to get pounds of N.`);
		}
		fertilizer.push({ lineId: line.id, lineName: line.name, product: product?.name ?? line.product, gallonsPerAcre: rate.gallonsPerAcre, acres, laneIndexes, gallons, ...nitrogen });
	}
	if (presetDensityUsed) notes.push(NITROGEN_DENSITY_CAUTION);

	const byCrop: FieldQuantities['totals']['byCrop'] = {};
	for (const v of varieties) {
		const key = v.crop.trim().toLowerCase();
		const t = byCrop[key] ?? { acres: 0, seeds: 0, unitsExact: 0, unitsWhole: 0, bags: 0 };
		t.acres += v.acres;
		t.seeds += v.seeds;
		t.unitsExact = t.unitsExact === null || v.unitsExact === null ? null : t.unitsExact + v.unitsExact;
		t.unitsWhole = t.unitsWhole === null || v.unitsWhole === null ? null : t.unitsWhole + v.unitsWhole;
		t.bags = t.bags === null || v.bags === null ? null : t.bags + v.bags;
		byCrop[key] = t;
	}
	const gallonsByProduct: Record<string, number> = {};
	for (const f of fertilizer) {
		const key = f.product ?? f.lineName;
		gallonsByProduct[key] = (gallonsByProduct[key] ?? 0) + f.gallons;
	}
	return {
		varieties,
		fertilizer,
		totals: {
			acresAssigned: varieties.reduce((s, v) => s + v.acres, 0),
			byCrop,
			gallonsByProduct,
			poundsN: fertilizer.reduce((s, f) => s + (f.poundsN ?? 0), 0)
		},
		notes
	};
}

function resolveProduct(rate: LineRate, lineProduct: string | null): { name: string; percentN: number; poundsPerGallon: number; basis: 'published' | 'entered' } | null {
	if (typeof rate.gallonsPerAcre !== 'number' || !Number.isFinite(rate.gallonsPerAcre) || rate.gallonsPerAcre < 0) {
		throw new EquipmentError('invalid-rate', `The rate must be zero or more gallons per acre, got ${String(rate.gallonsPerAcre)}.`);
	}
	if (rate.product && typeof rate.product === 'object') return { ...rate.product, basis: 'entered' };
	const preset = typeof rate.product === 'string'
		? NITROGEN_PRODUCTS.find((p) => p.id === rate.product)
		: NITROGEN_PRODUCTS.find((p) => lineProduct !== null && p.name.toLowerCase() === lineProduct.trim().toLowerCase());
	if (typeof rate.product === 'string' && !preset) {
		throw new EquipmentError('invalid-rate', `There is no product preset "${rate.product}"; use ${NITROGEN_PRODUCTS.map((p) => p.id).join(', ')} or enter the analysis.`);
	}
	return preset ? { name: preset.name, percentN: preset.percentN, poundsPerGallon: preset.poundsPerGallon, basis: preset.basis } : null;
}

/** Share (0–1) of a lane's rows the line runs on. */
function lineShare(lineId: string, lane: PlanLane, units: PlanterSetup['rowUnits'], passes: QuantityOptions['passes']): number {
	if (passes) {
		const rows = new Set<number>();
		for (const p of passes) for (const u of p.units) {
			if (u.on && u.laneIndex === lane.index && u.rowNumber !== null && u.fertilizerOn.includes(lineId)) rows.add(u.rowNumber);
		}
		return rows.size / lane.rowPositionsIn.length;
	}
	const carrying = units.filter((u) => u.seed && sameCrop(u.seed.crop, lane.crop));
	if (carrying.length === 0) return 0;
	return carrying.filter((u) => (u.fertilizerOn ?? []).includes(lineId)).length / carrying.length;
}
