// What the record book's pages read: the season's plan lanes, records, restrictions now, the
// farm's products and the seeding sheet's groups. One place, so every page asks the same way.
import type { FarmAccess } from './access';
import { AppError } from './errors';
import { getField, listFields } from './fields';
import { db } from './db';
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

/** The farm's record book at a glance: each field's seasons with plans and records, and the latest records. */
export async function farmRecordBook(access: FarmAccess) {
	const fields = await listFields(access);
	const ids = fields.map((f) => f.id);
	if (!ids.length) return { fields: [], seasons: [], cells: {}, recent: [] };
	const [plans, counts, recentRows] = await Promise.all([
		db()('plans').where({ farm_id: access.farm.id, adopted: true }).whereIn('field_id', ids).whereNull('deleted_at').select('field_id', 'season'),
		db()('operations').where({ farm_id: access.farm.id }).whereIn('field_id', ids).whereNull('deleted_at').groupBy('field_id', 'season').select('field_id', 'season').count('* as n'),
		db()('operations').where({ farm_id: access.farm.id }).whereIn('field_id', ids).whereNull('deleted_at').orderBy('ended_at', 'desc').limit(10).select('id', 'field_id', 'season', 'type', 'ended_at', 'acres')
	]);
	const cells: Record<string, { plan: boolean; records: number }> = {};
	for (const p of plans) cells[`${p.field_id}|${p.season}`] = { plan: true, records: 0 };
	for (const c of counts) (cells[`${c.field_id}|${c.season}`] ??= { plan: false, records: 0 }).records = Number(c.n);
	const seasons = [...new Set([...plans.map((p) => p.season as number), ...counts.map((c) => c.season as number)])].sort((a, b) => b - a);
	const names = new Map(fields.map((f) => [f.id, f.name]));
	return {
		fields: fields.map((f) => ({ id: f.id, name: f.name })),
		seasons,
		cells,
		recent: recentRows.map((r) => ({ id: r.id, fieldId: r.field_id, fieldName: names.get(r.field_id) ?? '', season: r.season, type: r.type, endedAt: new Date(r.ended_at).toISOString(), acres: Number(r.acres) }))
	};
}
