// What the record book's pages read: the season's plan lanes, records, restrictions now, the
// farm's products and the seeding sheet's groups. One place, so every page asks the same way.
import type { FarmAccess } from './access';
import { AppError } from './errors';
import { getField } from './fields';
import { getPlan, type Plan } from './plans';
import { listRecords } from './records';
import { seasonRestrictions } from './restrictions';
import { listProducts } from './products';
import { lanesForTransport } from '../plans/coordinates';

export async function seasonPlanOrNull(access: FarmAccess, fieldId: string, season: number): Promise<Plan | null> {
	return getPlan(access, fieldId, season).catch((e) => {
		if (e instanceof AppError && e.status === 404) return null;
		throw e;
	});
}

/** Lanes as the map and the lane pickers need them (outlines to 1 cm). */
export function mapLanes(plan: Plan | null) {
	if (!plan) return [];
	return lanesForTransport(plan.lanes.map((l) => ({ index: l.index, kind: l.kind, crop: l.crop, acres: l.acres, widthFt: l.widthFt, geometry: l.geometry })));
}

/** Lanes of one seed choice on the plan (crop, variety, population): one planting record each. */
export interface SeedingGroup {
	crop: string;
	variety: string | null;
	populationPerAcre: number | null;
	laneIndexes: number[];
	acres: number;
}

export function seedingGroups(plan: Plan | null): SeedingGroup[] {
	if (!plan) return [];
	const groups = new Map<string, SeedingGroup>();
	for (const l of plan.lanes) {
		if (l.kind !== 'crop') continue;
		const variety = l.assignment?.variety ?? null;
		const population = l.assignment?.populationPerAcre ?? null;
		const key = `${l.crop}|${variety}|${population}`;
		const g = groups.get(key) ?? { crop: l.crop, variety, populationPerAcre: population, laneIndexes: [], acres: 0 };
		g.laneIndexes.push(l.index);
		g.acres += l.acres;
		groups.set(key, g);
	}
	return [...groups.values()];
}

export async function productOptions(access: FarmAccess) {
	return (await listProducts(access)).map((p) => ({ id: p.id, name: p.name, kind: p.kind, unit: p.unit, restrictedUse: p.restrictedUse, epaRegNo: p.epaRegNo, analysis: p.analysis }));
}

export async function seasonView(access: FarmAccess, fieldId: string, season: number) {
	const field = await getField(access, fieldId);
	const plan = await seasonPlanOrNull(access, fieldId, season);
	const [records, restrictions, products] = await Promise.all([
		listRecords(access, fieldId, season),
		plan ? seasonRestrictions(access, fieldId, season, new Date()) : Promise.resolve(null),
		productOptions(access)
	]);
	return {
		field: { id: field.id, name: field.name },
		season,
		hasPlan: Boolean(plan),
		lanes: mapLanes(plan),
		records,
		restrictions: restrictions ?? [],
		products
	};
}
