// Field exports for other software: lanes and boundary as GeoJSON or a zipped Shapefile, and the
// boundary with the season's A-B line as ISO 11783-10 task data for guidance displays.
import JSZip from 'jszip';
import { zip as shapefileZip } from '@mapbox/shp-write';
import { rewind } from '@turf/turf';
import type { Feature, FeatureCollection, MultiPolygon, Polygon } from 'geojson';
import type { FarmAccess } from './access';
import { AppError, invalid } from './errors';
import { getBoundaryVersion, getField, type Field } from './fields';
import { getPlan, type Plan } from './plans';
import { isSeasonText } from './season';
import { taskDataXml } from '../exports/taskdata';

/** `?season=` as a crop year; missing or malformed is a 400 naming the parameter. */
export function seasonParam(url: URL, required = true): number | null {
	const raw = url.searchParams.get('season');
	if (raw === null || raw.trim() === '') {
		if (!required) return null;
		throw invalid('Say which season: add ?season= with a crop year, e.g. ?season=2027.', { season: ['Give a crop year (four digits).'] });
	}
	if (!isSeasonText(raw.trim())) throw invalid(`"${raw.slice(0, 20)}" is not a crop year; use four digits between 1900 and 2200.`, { season: ['Give a crop year (four digits).'] });
	return Number(raw.trim());
}

/** File-name part from user text: letters, digits and dashes only. */
export const fileSafe = (name: string) => name.replace(/[^A-Za-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'field';

/** The field and its adopted plan for the season; a season without one says so (404). */
export async function fieldWithSeasonPlan(access: FarmAccess, fieldId: string, season: number): Promise<{ field: Field; plan: Plan }> {
	const field = await getField(access, fieldId);
	try {
		const plan = await getPlan(access, fieldId, season);
		if (plan.boundaryVersion === field.boundaryVersion) return { field, plan };
		// The lanes were laid out on an earlier outline: export that outline with them.
		const outline = await getBoundaryVersion(access, fieldId, plan.boundaryVersion);
		return { field: { ...field, boundary: outline.boundary, exclusions: outline.exclusions, acres: outline.acres, boundaryVersion: outline.version }, plan };
	} catch (e) {
		if (e instanceof AppError && e.status === 404) {
			throw new AppError(404, `${field.name} has no adopted plan for ${season}, so there are no lanes to export. Adopt a plan for that season first.`, 'not_found');
		}
		throw e;
	}
}

type Props = Record<string, string | number | null>;

/** Boundary, no-plant areas and lanes of a season as one FeatureCollection (RFC 7946). */
export function seasonFeatures(field: Field, plan: Plan): FeatureCollection<Polygon | MultiPolygon, Props> {
	const features: Feature<Polygon | MultiPolygon, Props>[] = [
		{ type: 'Feature', properties: { layer: 'boundary', field: field.name, season: plan.season, acres: round(field.acres, 2) }, geometry: field.boundary }
	];
	for (const x of field.exclusions) {
		features.push({ type: 'Feature', properties: { layer: 'exclusion', field: field.name, name: x.name, kind: x.kind }, geometry: x.geometry });
	}
	for (const lane of plan.lanes) {
		features.push({
			type: 'Feature',
			properties: {
				layer: 'lane',
				field: field.name,
				season: plan.season,
				lane: lane.index + 1,
				kind: lane.kind,
				crop: lane.crop,
				width_ft: round(lane.widthFt, 2),
				rows: lane.rows,
				acres: round(lane.acres, 4),
				variety: lane.assignment?.variety ?? null
			},
			geometry: lane.geometry
		});
	}
	return { type: 'FeatureCollection', features };
}

const round = (n: number, digits: number) => Math.round(n * 10 ** digits) / 10 ** digits;

// Shapefile columns hold at most 10 characters per name and no nulls.
const SHAPE_COLUMNS: Record<string, string> = { layer: 'layer', field: 'field', season: 'season', acres: 'acres', name: 'name', kind: 'kind', lane: 'lane', crop: 'crop', width_ft: 'width_ft', rows: 'rows', variety: 'variety' };

function shapefileLayer(features: Feature<Polygon | MultiPolygon, Props>[]): FeatureCollection<MultiPolygon> {
	return {
		type: 'FeatureCollection',
		features: features.map((f) => {
			// Shapefiles wind outer rings clockwise, holes counter-clockwise (the reverse of RFC 7946).
			const g = rewind(f.geometry, { reverse: true }) as Polygon | MultiPolygon;
			const properties: Record<string, string | number> = {};
			for (const [k, v] of Object.entries(f.properties)) properties[SHAPE_COLUMNS[k] ?? k.slice(0, 10)] = v ?? '';
			return { type: 'Feature', properties, geometry: { type: 'MultiPolygon', coordinates: g.type === 'Polygon' ? [g.coordinates] : g.coordinates } };
		})
	};
}

/**
 * A zip holding three shapefiles (WGS84, with .prj): <field>-boundary, -exclusions (when any)
 * and -lanes, each polygon layer with its attributes.
 */
export async function seasonShapefileZip(field: Field, plan: Plan): Promise<Uint8Array> {
	const fc = seasonFeatures(field, plan);
	const out = new JSZip();
	const base = `${fileSafe(field.name)}-${plan.season}`;
	for (const layer of ['boundary', 'exclusion', 'lane'] as const) {
		const features = fc.features.filter((f) => f.properties.layer === layer);
		if (features.length === 0) continue;
		const name = `${base}-${layer === 'boundary' ? 'boundary' : `${layer}s`}`;
		const bytes = (await shapefileZip(shapefileLayer(features) as unknown as GeoJSON.FeatureCollection, {
			types: { multipolygon: name, polygon: name },
			outputType: 'uint8array',
			compression: 'STORE'
		})) as Uint8Array;
		const part = await JSZip.loadAsync(bytes);
		for (const [path, entry] of Object.entries(part.files)) {
			if (!entry.dir) out.file(path, await entry.async('uint8array'));
		}
	}
	return out.generateAsync({ type: 'uint8array', compression: 'DEFLATE' });
}

/**
 * ISO 11783-10 task data as a zip with TASKDATA/TASKDATA.XML. With a season, its adopted plan's
 * A-B line goes in as a guidance pattern (a season without one is a 404); without, the boundary only.
 */
export async function taskDataZip(access: FarmAccess, fieldId: string, season: number | null): Promise<{ field: Field; bytes: Uint8Array }> {
	const { field, plan } = season === null ? { field: await getField(access, fieldId), plan: null } : await fieldWithSeasonPlan(access, fieldId, season);
	const xml = taskDataXml({
		fieldName: field.name,
		farmName: access.farm.name,
		boundary: field.boundary,
		exclusions: field.exclusions.map((x) => ({ name: x.name, geometry: x.geometry })),
		guidance: plan?.guidance ?? null,
		season,
		acres: field.acres
	});
	const zip = new JSZip();
	zip.file('TASKDATA/TASKDATA.XML', xml);
	return { field, bytes: await zip.generateAsync({ type: 'uint8array', compression: 'DEFLATE' }) };
}
