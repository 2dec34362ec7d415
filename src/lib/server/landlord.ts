// Landlord summary of one field and season: the outline and lanes, acres by crop, the season's
// records with products and rates as they were logged, and harvest results. Read through the field
// access rules, so a viewer sees it only for a field granted to them.
import type { MultiPolygon, Polygon } from 'geojson';
import { db } from './db';
import type { FarmAccess } from './access';
import { getField } from './fields';
import type { Exclusion } from '../fields/shape';
import { creditedLaneAcres, dayInZone, roundAcres } from '../reports/acreage';

export interface SummaryLane {
	index: number;
	kind: 'crop' | 'pasture' | 'cover' | 'buffer';
	crop: string;
	widthFt: number;
	rows: number;
	acres: number;
	geometry: Polygon | MultiPolygon;
}

export interface SummaryOperation {
	type: string;
	startedOn: string;
	endedOn: string;
	acres: number;
	lanes: number[];
	crops: string[];
	products: { name: string; epaRegNo: string | null; rate: number; rateUnit: string; total: number; totalUnit: string }[];
	applicator: string | null;
	notes: string | null;
}

export interface SummaryHarvest {
	crop: string;
	entries: number;
	harvestedAcres: number;
	bushels: number;
	bushelsPerAcre: number;
	standardMoisturePct: number;
}

export interface LandlordSummary {
	season: number;
	field: {
		id: string;
		name: string;
		landlord: string | null;
		farmNumber: string | null;
		tractNumber: string | null;
		fieldNumber: string | null;
		acres: number;
		boundary: Polygon | MultiPolygon;
		exclusions: Exclusion[];
	};
	plan: { guidance: { a: [number, number]; b: [number, number] }; plantedAcres: number; lanes: SummaryLane[] } | null;
	byCrop: { crop: string; lanes: number; acres: number; creditedAcres: number }[];
	operations: SummaryOperation[];
	/** Null when the farm keeps no harvest records yet. */
	harvest: SummaryHarvest[] | null;
}

async function harvestByCrop(access: FarmAccess, fieldId: string, season: number): Promise<SummaryHarvest[] | null> {
	if (!(await db().schema.hasTable('harvest_entries'))) return null;
	const rows = await db()('harvest_entries')
		.where({ farm_id: access.farm.id, field_id: fieldId, season })
		.whereNull('deleted_at')
		.groupBy('crop', 'standard_moisture_pct')
		.orderBy('crop')
		.select('crop', 'standard_moisture_pct', db().raw('count(*)::int as entries'), db().raw('sum(harvested_acres) as acres'), db().raw('sum(bushels) as bushels'));
	return rows.map((r) => {
		const acres = Number(r.acres);
		const bushels = Number(r.bushels);
		return {
			crop: r.crop,
			entries: r.entries,
			harvestedAcres: roundAcres(acres),
			bushels: Math.round(bushels * 10) / 10,
			bushelsPerAcre: acres > 0 ? Math.round((bushels / acres) * 10) / 10 : 0,
			standardMoisturePct: Number(r.standard_moisture_pct)
		};
	});
}

/** The summary; a field this member may not see answers 404 like a missing one. */
export async function landlordSummary(access: FarmAccess, fieldId: string, season: number): Promise<LandlordSummary> {
	const field = await getField(access, fieldId);
	const planRow = await db()('plans')
		.where({ farm_id: access.farm.id, field_id: fieldId, season, adopted: true })
		.whereNull('deleted_at')
		.first('id', 'guidance', 'planted_acres', 'boundary_version');
	const [laneRows, outline, opRows, harvest] = await Promise.all([
		planRow ? db()('plan_lanes').where({ plan_id: planRow.id }).orderBy('lane_index').select('lane_index', 'kind', 'crop', 'width_ft', 'rows', 'acres', 'geometry') : [],
		planRow && planRow.boundary_version !== field.boundaryVersion
			? db()('field_boundary_versions').where({ field_id: fieldId, farm_id: access.farm.id, version: planRow.boundary_version }).first('boundary', 'exclusions', 'acres')
			: null,
		db()('operations').where({ farm_id: access.farm.id, field_id: fieldId, season }).whereNull('deleted_at').orderBy('started_at').select('id', 'type', 'started_at', 'ended_at', 'acres', 'applicator', 'notes'),
		harvestByCrop(access, fieldId, season)
	]);
	const ids = opRows.map((o) => o.id);
	const [opLanes, opProducts] = ids.length
		? await Promise.all([
				db()('operation_lanes').whereIn('operation_id', ids).orderBy('lane_index').select('operation_id', 'lane_index', 'crop'),
				db()('operation_products').whereIn('operation_id', ids).orderBy('position').select('operation_id', 'product_name', 'epa_reg_no', 'rate', 'rate_unit', 'total', 'total_unit')
			])
		: [[], []];
	const lanes: SummaryLane[] = laneRows.map((l) => ({ index: l.lane_index, kind: l.kind, crop: l.crop, widthFt: Number(l.width_ft), rows: l.rows, acres: Number(l.acres), geometry: l.geometry }));
	const crops = new Map<string, { lanes: number; acres: number; credited: number }>();
	for (const l of lanes) {
		const c = crops.get(l.crop) ?? { lanes: 0, acres: 0, credited: 0 };
		c.lanes += 1;
		c.acres += l.acres;
		c.credited += creditedLaneAcres(l);
		crops.set(l.crop, c);
	}
	const zone = access.farm.timeZone;
	return {
		season,
		field: {
			id: field.id,
			name: field.name,
			landlord: field.landlord,
			farmNumber: field.farmNumber,
			tractNumber: field.tractNumber,
			fieldNumber: field.fieldNumber,
			acres: Number(outline?.acres ?? field.acres),
			boundary: outline?.boundary ?? field.boundary,
			exclusions: outline?.exclusions ?? field.exclusions
		},
		plan: planRow ? { guidance: planRow.guidance, plantedAcres: Number(planRow.planted_acres), lanes } : null,
		byCrop: [...crops.entries()]
			.sort(([a], [b]) => a.localeCompare(b))
			.map(([crop, c]) => ({ crop, lanes: c.lanes, acres: roundAcres(c.acres), creditedAcres: roundAcres(c.credited) })),
		operations: opRows.map((o) => {
			const own = opLanes.filter((l) => l.operation_id === o.id);
			return {
				type: o.type,
				startedOn: dayInZone(new Date(o.started_at), zone),
				endedOn: dayInZone(new Date(o.ended_at), zone),
				acres: roundAcres(Number(o.acres)),
				lanes: own.map((l) => l.lane_index + 1),
				crops: [...new Set(own.map((l) => l.crop as string))].sort(),
				products: opProducts
					.filter((p) => p.operation_id === o.id)
					.map((p) => ({ name: p.product_name, epaRegNo: p.epa_reg_no, rate: Number(p.rate), rateUnit: p.rate_unit, total: Number(p.total), totalUnit: p.total_unit })),
				applicator: o.applicator,
				notes: o.notes
			};
		}),
		harvest
	};
}
