// Field exports read back with independent readers: GeoJSON, a zipped Shapefile (shpjs) and
// ISO 11783-10 task data (xmldom, and our own field import, round trip within 1 cm).
import { describe, expect, it } from 'vitest';
import JSZip from 'jszip';
import { DOMParser } from '@xmldom/xmldom';
import { parseDbf, parseShp } from 'shpjs';
import type { Polygon, Position } from 'geojson';
import { db } from '$lib/server/db';
import { createField } from '$lib/server/fields';
import { savePlan } from '$lib/server/plans';
import { readFieldFile } from '$lib/server/field-import/read';
import { ImportError } from '$lib/server/field-import/errors';
import { GET as geojsonRoute } from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/export.geojson/+server';
import { GET as shapefileRoute } from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/export.shp.zip/+server';
import { GET as taskdataRoute } from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/taskdata.zip/+server';
import { POST as importRoute } from '../../src/routes/api/farms/[farmId]/fields/import/+server';
import type { SessionUser } from '$lib/server/auth';
import { makeFarmWithTeam } from './helpers';
import { reportFarm, routeEvent } from './report-setup';
import { rectangle } from '../fixtures/rectangle';

type Route = (event: ReturnType<typeof routeEvent>) => Response | Promise<Response>;
const get = (route: Route, user: SessionUser | null, farmId: string, fieldId: string, query = '?season=2027') =>
	route(routeEvent(user, `/api/farms/${farmId}/fields/${fieldId}/x${query}`, { farmId, fieldId }));

/** Largest distance in metres between matching positions (spherical metres per degree; enough for 1 cm). */
function maxOffsetMetres(a: Position[], b: Position[]): number {
	expect(a.length).toBe(b.length);
	let worst = 0;
	for (let i = 0; i < a.length; i++) {
		const dLat = (a[i][1] - b[i][1]) * 111_320;
		const dLng = (a[i][0] - b[i][0]) * 111_320 * Math.cos((a[i][1] * Math.PI) / 180);
		worst = Math.max(worst, Math.hypot(dLat, dLng));
	}
	return worst;
}

/** A field with a hole (a farmstead inside it) and a planned season. */
async function fieldWithHole() {
	const s = await reportFarm();
	const outer = rectangle(1000, 1200, -94.31, 43.93).coordinates[0];
	const hole = rectangle(200, 200, -94.3085, 43.9312).coordinates[0].slice().reverse();
	const boundary: Polygon = { type: 'Polygon', coordinates: [outer, hole] };
	const field = await createField(s.access, { name: 'Farmstead 40', boundary, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
	const plan = await savePlan(s.access, field.id, 2027, {
		guidance: { a: outer[0] as [number, number], b: outer[3] as [number, number] },
		pattern: [{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }, { kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 }],
		offsetFt: 0, headlandFt: 0, version: 0, variant: 'main', assignments: [], notes: null, rebase: false
	});
	return { ...s, field, plan, boundary };
}

describe('lanes and boundary as GeoJSON', () => {
	it('holds the boundary and every stored lane with its acres, and parses back as RFC 7946', async () => {
		const s = await reportFarm();
		const res = await get(geojsonRoute, s.members.owner, s.farm.id, s.wide.id);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('application/geo+json');
		const fc = JSON.parse(await res.text());
		expect(fc.type).toBe('FeatureCollection');
		const lanes = fc.features.filter((f: { properties: { layer: string } }) => f.properties.layer === 'lane');
		const stored = await db()('plan_lanes').where({ plan_id: s.widePlan.id }).orderBy('lane_index');
		expect(lanes.map((f: { properties: { lane: number; crop: string } }) => [f.properties.lane, f.properties.crop])).toEqual(stored.map((l) => [l.lane_index + 1, l.crop]));
		expect(lanes.map((f: { properties: { acres: number } }) => f.properties.acres)).toEqual(stored.map((l) => Math.round(Number(l.acres) * 1e4) / 1e4));
		expect(lanes[0].geometry).toEqual(stored[0].geometry);
		const boundary = fc.features.filter((f: { properties: { layer: string } }) => f.properties.layer === 'boundary');
		expect(boundary).toHaveLength(1);
		expect(boundary[0].geometry).toEqual(s.wide.boundary);
		expect(fc.crs).toBeUndefined();
	});

	it('answers an empty season with a clear 404 and another farm with 404', async () => {
		const s = await reportFarm();
		const empty = await get(geojsonRoute, s.members.owner, s.farm.id, s.wide.id, '?season=2030');
		expect(empty.status).toBe(404);
		expect((await empty.json()).error.message).toBe('Wide rows has no adopted plan for 2030, so there are no lanes to export. Adopt a plan for that season first.');
		const other = await makeFarmWithTeam();
		expect((await get(geojsonRoute, other.members.owner, s.farm.id, s.wide.id)).status).toBe(404);
		expect((await get(geojsonRoute, other.members.owner, other.farm.id, s.wide.id)).status).toBe(404);
		await db()('memberships').where({ farm_id: s.farm.id, user_id: s.members.viewer.id }).update({ field_scope: [s.strips.id] });
		expect((await get(geojsonRoute, s.members.viewer, s.farm.id, s.wide.id)).status).toBe(404);
		expect((await get(geojsonRoute, s.members.viewer, s.farm.id, s.strips.id)).status).toBe(200);
		expect((await get(geojsonRoute, s.members.owner, s.farm.id, s.wide.id, '')).status).toBe(400);
	});
});

describe('zipped Shapefile', () => {
	it('reads back with shpjs: boundary and lanes layers, their attributes and corners', async () => {
		const s = await fieldWithHole();
		const res = await get(shapefileRoute, s.members.advisor, s.farm.id, s.field.id);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('application/zip');
		const zip = await JSZip.loadAsync(await res.arrayBuffer());
		const names = Object.keys(zip.files).sort();
		expect(names).toEqual(
			['boundary', 'lanes'].flatMap((l) => ['dbf', 'prj', 'shp', 'shx'].map((x) => `Farmstead-40-2027-${l}.${x}`))
		);
		const layer = async (name: string) => {
			const shp = await zip.file(`Farmstead-40-2027-${name}.shp`)!.async('uint8array');
			const dbf = await zip.file(`Farmstead-40-2027-${name}.dbf`)!.async('uint8array');
			return { geometries: parseShp(shp), rows: parseDbf(dbf) };
		};
		const lanes = await layer('lanes');
		expect(lanes.rows.map((r) => [r.lane, r.crop])).toEqual(s.plan.lanes.map((l) => [l.index + 1, l.crop]));
		expect(lanes.geometries).toHaveLength(s.plan.lanes.length);
		const boundary = await layer('boundary');
		const g = boundary.geometries[0] as Polygon;
		expect(g.type).toBe('Polygon');
		// shpjs reads one outer ring and the farmstead hole, within a millimetre of what was stored.
		expect(g.coordinates).toHaveLength(2);
		const sameRing = (got: Position[], want: Position[]) => {
			const sortKey = (p: Position) => `${p[0].toFixed(7)},${p[1].toFixed(7)}`;
			expect(new Set(got.map(sortKey))).toEqual(new Set(want.map(sortKey)));
		};
		sameRing(g.coordinates[0], s.boundary.coordinates[0]);
		sameRing(g.coordinates[1], s.boundary.coordinates[1]);
		expect(boundary.rows[0].field).toBe('Farmstead 40');
	});
});

describe('ISO 11783-10 task data', () => {
	it('lays out TASKDATA/TASKDATA.XML as the contract says', async () => {
		const s = await fieldWithHole();
		const res = await get(taskdataRoute, s.members.crew, s.farm.id, s.field.id);
		expect(res.status).toBe(200);
		const zip = await JSZip.loadAsync(await res.arrayBuffer());
		expect(Object.keys(zip.files).filter((n) => !zip.files[n].dir)).toEqual(['TASKDATA/TASKDATA.XML']);
		const doc = new DOMParser().parseFromString(await zip.file('TASKDATA/TASKDATA.XML')!.async('string'), 'text/xml');
		const root = doc.documentElement!;
		expect([root.nodeName, root.getAttribute('VersionMajor')]).toEqual(['ISO11783_TaskData', '4']);
		const kids = (el: Element, name: string) => Array.from(el.childNodes).filter((n) => n.nodeName === name) as Element[];
		const [pfd] = kids(root as unknown as Element, 'PFD');
		expect(pfd.getAttribute('C')).toBe('Farmstead 40');
		const [pln] = kids(pfd, 'PLN');
		expect(pln.getAttribute('A')).toBe('1');
		const lsgs = kids(pln, 'LSG');
		expect(lsgs.map((l) => l.getAttribute('A'))).toEqual(['1', '2']);
		const first = kids(lsgs[0], 'PNT')[0];
		expect([Number(first.getAttribute('D')), Number(first.getAttribute('C'))]).toEqual(s.boundary.coordinates[0][0].map((v) => Number(v.toFixed(9))));
		const [ggp] = kids(pfd, 'GGP');
		const [gpn] = kids(ggp, 'GPN');
		expect(gpn.getAttribute('C')).toBe('1');
		const [line] = kids(gpn, 'LSG');
		expect(line.getAttribute('A')).toBe('5');
		const ends = kids(line, 'PNT').map((p) => [p.getAttribute('A'), Number(p.getAttribute('D')), Number(p.getAttribute('C'))]);
		expect(ends).toEqual([
			['6', Number(s.plan.guidance.a[0].toFixed(9)), Number(s.plan.guidance.a[1].toFixed(9))],
			['7', Number(s.plan.guidance.b[0].toFixed(9)), Number(s.plan.guidance.b[1].toFixed(9))]
		]);
	});

	it('round trip: the field import reads the zip and the bare XML back to the same outline within 1 cm', async () => {
		const s = await fieldWithHole();
		const bytes = new Uint8Array(await (await get(taskdataRoute, s.members.owner, s.farm.id, s.field.id)).arrayBuffer());
		const fromZip = readFieldFile('taskdata.zip', bytes);
		expect(fromZip.format).toBe('taskdata');
		expect(fromZip.shapes.features.map((f) => f.properties.name)).toEqual(['Farmstead 40']);
		const g = fromZip.shapes.features[0].geometry as Polygon;
		expect(g.coordinates).toHaveLength(2);
		expect(maxOffsetMetres(g.coordinates[0], s.boundary.coordinates[0])).toBeLessThan(0.01);
		expect(maxOffsetMetres(g.coordinates[1], s.boundary.coordinates[1])).toBeLessThan(0.01);
		expect(fromZip.shapes.features[0].properties.acres).toBeCloseTo(s.field.acres, 1);

		const xml = await (await JSZip.loadAsync(bytes)).file('TASKDATA/TASKDATA.XML')!.async('uint8array');
		const bare = readFieldFile('TASKDATA.XML', xml);
		expect(bare.format).toBe('taskdata');
		expect(maxOffsetMetres((bare.shapes.features[0].geometry as Polygon).coordinates[0], s.boundary.coordinates[0])).toBeLessThan(0.01);

		// The import route answers like any other import.
		const form = new FormData();
		form.append('file', new File([bytes], 'taskdata.zip', { type: 'application/zip' }));
		const url = `/api/farms/${s.farm.id}/fields/import`;
		const event = routeEvent(s.members.manager, url, { farmId: s.farm.id });
		event.request = new Request(new URL(`http://127.0.0.1${url}`), { method: 'POST', body: form });
		const answer = await importRoute(event);
		expect(answer.status).toBe(200);
		const body = await answer.json();
		expect([body.type, body.format, body.features.length, body.features[0].properties.name]).toEqual(['FeatureCollection', 'taskdata', 1, 'Farmstead 40']);
	});

	it('without a season carries the boundary alone; an empty season is a clear 404', async () => {
		const s = await reportFarm();
		const res = await get(taskdataRoute, s.members.owner, s.farm.id, s.strips.id, '');
		const xml = await (await JSZip.loadAsync(await res.arrayBuffer())).file('TASKDATA/TASKDATA.XML')!.async('string');
		expect(xml).toContain('<PLN A="1"');
		expect(xml).not.toContain('<GGP');
		const empty = await get(taskdataRoute, s.members.owner, s.farm.id, s.strips.id, '?season=2029');
		expect(empty.status).toBe(404);
		expect((await empty.json()).error.message).toBe('Strips has no adopted plan for 2029, so there are no lanes to export. Adopt a plan for that season first.');
	});

	it('refuses malformed task data with clear messages', () => {
		const refuse = (name: string, text: string) => {
			try {
				readFieldFile(name, new TextEncoder().encode(text));
			} catch (e) {
				expect(e).toBeInstanceOf(ImportError);
				return [(e as ImportError).code, (e as ImportError).message];
			}
			throw new Error('expected a refusal');
		};
		expect(refuse('TASKDATA.XML', '<?xml version="1.0"?><kml><Document/></kml>')).toEqual([
			'not_taskdata',
			'This .xml file is XML but not ISO 11783-10 task data (its outermost element is <kml>, not <ISO11783_TaskData>).'
		]);
		expect(refuse('TASKDATA.XML', '<ISO11783_TaskData VersionMajor="4"><PFD A="PFD1" C="x" D="1"/></ISO11783_TaskData>')).toEqual([
			'no_polygons',
			'This .xml file holds no partfield boundary (PFD with a PLN of type 1), so there is no field outline to import.'
		]);
		const laughs = '<?xml version="1.0"?><!DOCTYPE d [<!ENTITY a "aaaaaaaaaa"><!ENTITY b "&a;&a;&a;&a;&a;">]><ISO11783_TaskData VersionMajor="4"><PFD A="PFD1" C="&b;" D="1"/></ISO11783_TaskData>';
		expect(refuse('TASKDATA.XML', laughs)).toEqual([
			'unreadable',
			'This .xml file declares a DTD or XML entities, which task data never needs; it was not read. Export it again from the display or farm software.'
		]);
		expect(refuse('TASKDATA.XML', '<ISO11783_TaskData><PFD')[0]).toBe('unreadable');
		const noExterior = '<ISO11783_TaskData VersionMajor="4"><PFD A="PFD1" C="x" D="1"><PLN A="1"><LSG A="2"><PNT A="2" C="43.9" D="-94.2"/></LSG></PLN></PFD></ISO11783_TaskData>';
		expect(refuse('TASKDATA.XML', noExterior)).toEqual([
			'invalid_geometry',
			'Partfield "x" has a boundary polygon with 0 exterior line strings (LSG type 1); it needs exactly one.'
		]);
	});
});
