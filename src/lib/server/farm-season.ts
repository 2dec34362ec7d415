// The whole farm in one season: every visible field's adopted plan, read as stored (lanes and
// plan totals), never laid out again. A fixed number of queries whatever the field count.
import type { Feature, FeatureCollection, MultiPolygon, Polygon } from 'geojson';
import type { Knex } from 'knex';
import { db } from './db';
import type { FarmAccess } from './access';
import { rotationMatrix, type Lane, type LaneKind } from '../geometry/index';
import type { RotationCell } from '../geometry/rotation';
import { cropChange, cropTotals, kindTotals, sumCropTotals, type CropAcres, type CropChange, type LaneGroup } from '../farm/totals';
import { sumRotations } from '../farm/rotation';

export type FieldSeasonStatus = 'adopted' | 'no_plan';

export interface FarmSeasonField {
	fieldId: string;
	name: string;
	status: FieldSeasonStatus;
	plantedAcres: number;
	byCrop: Record<string, CropAcres>;
}

/** The JSON of GET /api/farms/:farmId/seasons/:season. */
export interface FarmSeason {
	fields: FarmSeasonField[];
	totals: { byCrop: Record<string, CropAcres>; plantedAcres: number };
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Row = any;

interface VisibleField {
	id: string;
	name: string;
	acres: number;
}

/** The fields this member may see, by name; viewers only those granted to them. */
export async function visibleFields(access: FarmAccess, q: Knex = db()): Promise<VisibleField[]> {
	if (access.fieldScope !== null && access.fieldScope.length === 0) return [];
	const query = q('fields').where({ farm_id: access.farm.id }).whereNull('deleted_at').orderByRaw('lower(name), id').select('id', 'name', 'acres');
	if (access.fieldScope !== null) query.whereIn('id', access.fieldScope);
	return (await query).map((r) => ({ id: r.id, name: r.name, acres: Number(r.acres) }));
}

interface AdoptedPlanRow {
	id: string;
	field_id: string;
	planted_acres: number;
	headland_acres: number;
	excluded_acres: number;
	field_acres: number;
}

function adoptedPlans(access: FarmAccess, fieldIds: string[], season: number, q: Knex = db()): Promise<AdoptedPlanRow[]> {
	if (fieldIds.length === 0) return Promise.resolve([]);
	return q('plans')
		.where({ farm_id: access.farm.id, season, adopted: true })
		.whereNull('deleted_at')
		.whereIn('field_id', fieldIds)
		.select('id', 'field_id', 'planted_acres', 'headland_acres', 'excluded_acres', 'field_acres');
}

/** The stored lanes of the plans, grouped by field, crop and kind (one query). */
async function laneGroups(access: FarmAccess, planIds: string[], q: Knex = db()): Promise<LaneGroup[]> {
	if (planIds.length === 0) return [];
	const rows = await q('plan_lanes as l')
		.join('plans as p', 'p.id', 'l.plan_id')
		.where({ 'l.farm_id': access.farm.id })
		.whereIn('l.plan_id', planIds)
		.groupBy('p.field_id', 'l.crop', 'l.kind')
		.select('p.field_id', 'l.crop', 'l.kind')
		.sum({ acres: 'l.acres' })
		.count({ lanes: '*' });
	return (rows as Row[]).map((r) => ({ fieldId: r.field_id as string, crop: r.crop as string, kind: r.kind as LaneKind, acres: Number(r.acres), lanes: Number(r.lanes) }));
}

function seasonFromParts(fields: VisibleField[], plans: AdoptedPlanRow[], groups: LaneGroup[]): FarmSeason {
	const planOf = new Map(plans.map((p) => [p.field_id, p]));
	const out: FarmSeasonField[] = fields.map((f) => {
		const plan = planOf.get(f.id);
		if (!plan) return { fieldId: f.id, name: f.name, status: 'no_plan', plantedAcres: 0, byCrop: {} };
		return { fieldId: f.id, name: f.name, status: 'adopted', plantedAcres: Number(plan.planted_acres), byCrop: cropTotals(groups.filter((g) => g.fieldId === f.id)) };
	});
	return {
		fields: out,
		totals: { byCrop: sumCropTotals(out.map((f) => f.byCrop)), plantedAcres: out.reduce((s, f) => s + f.plantedAcres, 0) }
	};
}

/** Every visible field with its adopted plan's stored totals for the season, and the farm's totals. */
export async function farmSeason(access: FarmAccess, season: number): Promise<FarmSeason> {
	const fields = await visibleFields(access);
	const plans = await adoptedPlans(access, fields.map((f) => f.id), season);
	const groups = await laneGroups(access, plans.map((p) => p.id));
	return seasonFromParts(fields, plans, groups);
}

export interface LaneFeatureProperties {
	fieldId: string;
	fieldName: string;
	laneIndex: number;
	laneNumber: number;
	kind: LaneKind;
	crop: string;
	variety: string | null;
	acres: number;
}

/** Every visible field's adopted lanes as stored, in one query, as one FeatureCollection. */
export async function farmSeasonLanes(access: FarmAccess, season: number): Promise<FeatureCollection<Polygon | MultiPolygon, LaneFeatureProperties>> {
	const fields = await visibleFields(access);
	const features: Feature<Polygon | MultiPolygon, LaneFeatureProperties>[] = [];
	if (fields.length) {
		const names = new Map(fields.map((f) => [f.id, f.name]));
		const rows = await db()('plan_lanes as l')
			.join('plans as p', 'p.id', 'l.plan_id')
			.where({ 'p.farm_id': access.farm.id, 'p.season': season, 'p.adopted': true, 'l.farm_id': access.farm.id })
			.whereNull('p.deleted_at')
			.whereIn('p.field_id', fields.map((f) => f.id))
			.orderBy([{ column: 'p.field_id' }, { column: 'l.lane_index' }])
			.select('p.field_id', 'l.lane_index', 'l.kind', 'l.crop', 'l.variety', 'l.acres', 'l.geometry');
		for (const r of rows) {
			features.push({
				type: 'Feature',
				id: `${r.field_id}:${r.lane_index}`,
				geometry: r.geometry,
				properties: {
					fieldId: r.field_id,
					fieldName: names.get(r.field_id) ?? '',
					laneIndex: r.lane_index,
					laneNumber: r.lane_index + 1,
					kind: r.kind,
					crop: r.crop,
					variety: r.variety,
					acres: Number(r.acres)
				}
			});
		}
		// Fields in the order of their names, as the totals list them.
		const order = new Map(fields.map((f, i) => [f.id, i]));
		features.sort((a, b) => order.get(a.properties.fieldId)! - order.get(b.properties.fieldId)! || a.properties.laneIndex - b.properties.laneIndex);
	}
	return { type: 'FeatureCollection', features };
}

export interface SeasonSummary {
	season: number;
	fieldsShown: number;
	fieldsPlanned: number;
	plantedAcres: number;
	headlandAcres: number;
	excludedAcres: number;
	byCrop: Record<string, CropAcres>;
	byKind: Record<LaneKind, CropAcres>;
	previous: { season: number; plantedAcres: number; fieldsPlanned: number };
	change: CropChange[];
	/** Previous season's crop → this season's, acres, summed over fields planned in both. */
	rotation: RotationCell[];
	/** Fields whose rotation could not be compared (a broken stored lane), by name. */
	rotationSkipped: string[];
}

/** Stored lanes (crop and outline) of the plans, by field; one query. */
async function lanesByField(access: FarmAccess, planIds: string[]): Promise<Map<string, Pick<Lane, 'crop' | 'geometry'>[]>> {
	const byField = new Map<string, Pick<Lane, 'crop' | 'geometry'>[]>();
	if (planIds.length === 0) return byField;
	const rows = await db()('plan_lanes as l')
		.join('plans as p', 'p.id', 'l.plan_id')
		.where({ 'l.farm_id': access.farm.id })
		.whereIn('l.plan_id', planIds)
		.orderBy([{ column: 'p.field_id' }, { column: 'l.lane_index' }])
		.select('p.field_id', 'l.crop', 'l.geometry');
	for (const r of rows) {
		const list = byField.get(r.field_id) ?? [];
		list.push({ crop: r.crop, geometry: r.geometry });
		byField.set(r.field_id, list);
	}
	return byField;
}

/**
 * The season's totals for the farm page: acres by crop (planted, headland, excluded), lanes by
 * kind, the change from the season before, and what followed what (each field's rotation matrix
 * of stored lanes, summed over the fields planned in both seasons).
 */
export async function seasonSummary(access: FarmAccess, season: number): Promise<SeasonSummary> {
	const fields = await visibleFields(access);
	const ids = fields.map((f) => f.id);
	const [plans, previousPlans] = await Promise.all([adoptedPlans(access, ids, season), season > 1900 ? adoptedPlans(access, ids, season - 1) : Promise.resolve([])]);
	const [groups, previousGroups] = await Promise.all([laneGroups(access, plans.map((p) => p.id)), laneGroups(access, previousPlans.map((p) => p.id))]);
	const now = seasonFromParts(fields, plans, groups);
	const before = seasonFromParts(fields, previousPlans, previousGroups);

	const both = new Set(previousPlans.map((p) => p.field_id).filter((id) => plans.some((p) => p.field_id === id)));
	const inBoth = (list: AdoptedPlanRow[]) => list.filter((p) => both.has(p.field_id)).map((p) => p.id);
	const [lanesNow, lanesBefore] = await Promise.all([lanesByField(access, inBoth(plans)), lanesByField(access, inBoth(previousPlans))]);
	const matrices: RotationCell[][] = [];
	const rotationSkipped: string[] = [];
	for (const f of fields) {
		if (!both.has(f.id)) continue;
		try {
			matrices.push(rotationMatrix((lanesBefore.get(f.id) ?? []) as Lane[], (lanesNow.get(f.id) ?? []) as Lane[]));
		} catch {
			// A lane stored with a broken outline: the field is left out of the matrix and named.
			rotationSkipped.push(f.name);
		}
	}
	return {
		season,
		fieldsShown: fields.length,
		fieldsPlanned: plans.length,
		plantedAcres: now.totals.plantedAcres,
		headlandAcres: plans.reduce((s, p) => s + Number(p.headland_acres), 0),
		excludedAcres: plans.reduce((s, p) => s + Number(p.excluded_acres), 0),
		byCrop: now.totals.byCrop,
		byKind: kindTotals(groups),
		previous: { season: season - 1, plantedAcres: before.totals.plantedAcres, fieldsPlanned: previousPlans.length },
		change: cropChange(now.totals.byCrop, before.totals.byCrop),
		rotation: sumRotations(matrices),
		rotationSkipped
	};
}

/** Seasons in which any visible field has an adopted plan, oldest first. */
export async function plannedSeasons(access: FarmAccess): Promise<number[]> {
	const fields = await visibleFields(access);
	if (fields.length === 0) return [];
	const rows = await db()('plans')
		.where({ farm_id: access.farm.id, adopted: true })
		.whereNull('deleted_at')
		.whereIn('field_id', fields.map((f) => f.id))
		.distinct('season')
		.orderBy('season');
	return rows.map((r) => r.season as number);
}

export interface LaneRecord {
	id: string;
	type: string;
	startedAt: Date;
	endedAt: Date;
	products: string[];
}

/**
 * The last records logged on one lane of a field's season (newest first), with the names of the
 * products as they were recorded. Empty when the member may not see the field.
 */
export async function laneRecords(access: FarmAccess, fieldId: string, season: number, laneIndex: number, limit = 5): Promise<LaneRecord[]> {
	if (access.fieldScope !== null && !access.fieldScope.includes(fieldId)) return [];
	const ops = await db()('operations as o')
		.join('operation_lanes as ol', 'ol.operation_id', 'o.id')
		.where({ 'o.farm_id': access.farm.id, 'o.field_id': fieldId, 'o.season': season, 'ol.lane_index': laneIndex })
		.whereNull('o.deleted_at')
		.orderBy([{ column: 'o.started_at', order: 'desc' }, { column: 'o.id' }])
		.limit(limit)
		.select('o.id', 'o.type', 'o.started_at', 'o.ended_at');
	if (ops.length === 0) return [];
	const products = await db()('operation_products')
		.where({ farm_id: access.farm.id })
		.whereIn('operation_id', ops.map((o) => o.id))
		.orderBy(['operation_id', 'position'])
		.select('operation_id', 'product_name');
	return ops.map((o) => ({
		id: o.id,
		type: o.type,
		startedAt: new Date(o.started_at),
		endedAt: new Date(o.ended_at),
		products: products.filter((p) => p.operation_id === o.id).map((p) => p.product_name)
	}));
}

/** The visible fields with their current outlines, for the farm map. */
export async function fieldOutlines(access: FarmAccess): Promise<{ id: string; name: string; acres: number; boundary: Polygon | MultiPolygon }[]> {
	if (access.fieldScope !== null && access.fieldScope.length === 0) return [];
	const query = db()('fields').where({ farm_id: access.farm.id }).whereNull('deleted_at').orderByRaw('lower(name), id').select('id', 'name', 'acres', 'boundary');
	if (access.fieldScope !== null) query.whereIn('id', access.fieldScope);
	return (await query).map((r) => ({ id: r.id, name: r.name, acres: Number(r.acres), boundary: r.boundary }));
}
