import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import geographiclib from 'geographiclib-geodesic';
import type { Position } from 'geojson';
import JSZip from 'jszip';
import proj4 from 'proj4';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { IMPORT_LIMITS, ImportError, parseFieldFile, type ImportResult } from '../../src/lib/server/field-import';
import { closeGeometryPool } from '../../src/lib/server/geometry-pool';
import * as data from '../fixtures/import/fixture-data';
import { toShapefileRings, writeDbf, writeShp } from '../fixtures/import/shapefile-writer';

const fixture = (name: string) => new Uint8Array(readFileSync(new URL(`../fixtures/import/${name}`, import.meta.url)));
const json = (value: unknown) => new TextEncoder().encode(JSON.stringify(value));
const text = (value: string) => new TextEncoder().encode(value);
const polygonFile = (...rings: unknown[][]) => json({ type: 'Polygon', coordinates: rings });

async function refused(filename: string, bytes: Uint8Array): Promise<ImportError> {
	const outcome = await parseFieldFile(filename, bytes).then(
		() => 'accepted',
		(e: unknown) => e
	);
	expect(outcome).toBeInstanceOf(ImportError);
	return outcome as ImportError;
}

afterAll(closeGeometryPool);

function names(r: ImportResult): string[] {
	return r.shapes.features.map((f) => f.properties.name);
}

/** Metres between two [lng, lat] positions (GeographicLib Inverse, Karney 2013). */
function metresApart(p: Position, q: Position): number {
	return data.GEOD.Inverse(p[1], p[0], q[1], q[0]).s12 as number;
}

function zipOf(files: Record<string, Uint8Array | string>, compression: 'STORE' | 'DEFLATE' = 'DEFLATE'): Promise<Uint8Array> {
	const zip = new JSZip();
	for (const [name, content] of Object.entries(files)) zip.file(name, content);
	return zip.generateAsync({ type: 'uint8array', compression });
}

async function unzipFixture(name: string): Promise<Record<string, Uint8Array>> {
	const zip = await JSZip.loadAsync(fixture(name));
	const out: Record<string, Uint8Array> = {};
	for (const file of Object.values(zip.files)) out[file.name] = await file.async('uint8array');
	return out;
}

/** Offsets of every 4-byte little-endian `signature` in `bytes`. */
function offsetsOf(bytes: Uint8Array, signature: number): number[] {
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	const out: number[] = [];
	for (let i = 0; i + 4 <= bytes.length; i++) if (view.getUint32(i, true) === signature) out.push(i);
	return out;
}

describe('GeoJSON', () => {
	it('keeps the two fields, skips the point and measures the quarter-quarter square at 40 acres', async () => {
		const r = await parseFieldFile('two-fields.geojson', fixture('two-fields.geojson'));
		expect(r.format).toBe('geojson');
		expect(names(r)).toEqual(['North Forty', 'Ridge Eighty']);
		expect(r.shapes.features.map((f) => f.properties.sourceIndex)).toEqual([0, 1]);
		expect(r.warnings).toEqual(['Skipped 1 point: only polygons can be field boundaries.']);
		// Arithmetic: 1,320 ft × 1,320 ft = 40 ac of 43,560 sq ft; built with geodesic Direct from 42°N 93.6°W.
		expect(r.shapes.features[0].properties.acres).toBe(40);
		// GeographicLib polygon area (Karney 2013) of the same corners, rounded like the output.
		expect(r.shapes.features[1].properties.acres).toBe(Math.round(data.geographicLibAcres([data.RIDGE_EIGHTY]) * 100) / 100);
		expect(r.shapes.features[1].properties.acres).toBe(80);
		expect(r.shapes.features[0].geometry).toEqual({ type: 'Polygon', coordinates: [data.NORTH_FORTY] });
	});

	it('accepts a bare Polygon and a Feature, naming unnamed shapes by their place in the file', async () => {
		const bare = await parseFieldFile('outline.json', polygonFile(data.NORTH_FORTY));
		expect(names(bare)).toEqual(['Shape 1']);
		const feature = await parseFieldFile('outline.geojson', json({ type: 'Feature', properties: { title: 'Lane Test Plot' }, geometry: { type: 'Polygon', coordinates: [data.NORTH_FORTY] } }));
		expect(names(feature)).toEqual(['Lane Test Plot']);
		const collection = await parseFieldFile(
			'outline.geojson',
			json({
				type: 'FeatureCollection',
				features: [
					{ type: 'Feature', properties: { NAME: 'Upper' }, geometry: { type: 'Point', coordinates: data.GATE } },
					{ type: 'Feature', properties: { owner_note: 'no name here' }, geometry: { type: 'Polygon', coordinates: [data.RIDGE_EIGHTY] } }
				]
			})
		);
		expect(names(collection)).toEqual(['Shape 2']);
		expect(collection.shapes.features[0].properties.sourceIndex).toBe(1);
	});

	it('flattens a GeometryCollection into one MultiPolygon and counts what it skipped', async () => {
		const r = await parseFieldFile(
			'parts.geojson',
			json({
				type: 'Feature',
				properties: { field: 'Split Field' },
				geometry: {
					type: 'GeometryCollection',
					geometries: [
						{ type: 'Polygon', coordinates: [data.NORTH_FORTY] },
						{ type: 'Polygon', coordinates: [data.RIDGE_EIGHTY] },
						{ type: 'LineString', coordinates: data.FENCE_LINE },
						{ type: 'MultiPoint', coordinates: data.MARKERS }
					]
				}
			})
		);
		expect(names(r)).toEqual(['Split Field']);
		expect(r.shapes.features[0].geometry).toEqual({ type: 'MultiPolygon', coordinates: [[data.NORTH_FORTY], [data.RIDGE_EIGHTY]] });
		expect(r.shapes.features[0].properties.acres).toBe(120);
		expect(r.warnings).toEqual(['Skipped 3 points and 1 line: only polygons can be field boundaries.']);
	});

	it('drops heights and repeated consecutive points, and turns rings to the right-hand rule', async () => {
		const [sw, se, ne, nw] = data.NORTH_FORTY;
		const clockwiseWithRepeatAndHeight = [sw, nw, nw, ne, se, sw].map(([lng, lat]) => [lng, lat, 312.5]);
		const r = await parseFieldFile('heights.geojson', polygonFile(clockwiseWithRepeatAndHeight));
		// RFC 7946 §3.1.6: exterior rings counter-clockwise.
		expect(r.shapes.features[0].geometry.coordinates).toEqual([[sw, se, ne, nw, sw]]);
		expect(r.shapes.features[0].properties.acres).toBe(40);
	});
});

describe('KML and KMZ', () => {
	it('reads both placemark polygons, the pond as a hole, and skips the well', async () => {
		const r = await parseFieldFile('two-fields.kml', fixture('two-fields.kml'));
		expect(r.format).toBe('kml');
		expect(names(r)).toEqual(['East Strips', 'Pond Field']);
		expect(r.warnings).toEqual(['Skipped 1 point: only polygons can be field boundaries.']);
		const [strips, pond] = r.shapes.features;
		expect(strips.properties.acres).toBe(80);
		expect(pond.geometry.coordinates).toHaveLength(2);
		// GeographicLib area (Karney 2013) of the outer ring minus the pond.
		const expected = data.geographicLibAcres([data.POND_FIELD, data.POND]);
		expect(expected).toBeCloseTo(40 - (300 * 200) / 43_560, 2);
		expect(pond.properties.acres).toBe(Math.round(expected * 100) / 100);
		expect(pond.properties.acres).toBe(38.62);
	});

	it('refuses a KML with only points and a line, counting them', async () => {
		const e = await refused('points-only.kml', fixture('points-only.kml'));
		expect([e.code, e.status]).toEqual(['no_polygons', 400]);
		expect(e.message).toBe('The KML file has no polygons: only 3 points and 1 line. A field boundary must be a closed outline (a polygon).');
	});

	it('reads a KMZ (zipped KML) the same way', async () => {
		const kmz = await zipOf({ 'doc.kml': fixture('two-fields.kml'), 'files/legend.txt': 'invented' });
		const r = await parseFieldFile('fields.KMZ', kmz);
		expect(r.format).toBe('kml');
		expect(names(r)).toEqual(['East Strips', 'Pond Field']);
		expect(r.shapes.features.map((f) => f.properties.acres)).toEqual([80, 38.62]);
	});

	it('refuses malformed XML and XML that is not KML', async () => {
		const broken = await refused('broken.kml', text('<kml><Document><Placemark></Document></kml>'));
		expect([broken.code, broken.status]).toEqual(['unreadable', 400]);
		expect(broken.message).toMatch(/^The file could not be read as KML: .*Placemark.*\.$/);
		const track = await refused('track.kml', text('<?xml version="1.0"?><gpx version="1.1"><trk/></gpx>'));
		expect([track.code, track.status]).toEqual(['not_kml', 400]);
		expect(track.message).toBe('This .kml file is XML but not KML (its outermost element is <gpx>, not <kml>).');
	});
});

describe('zipped shapefiles', () => {
	it('reads a WGS84 shapefile with names from FIELD_NAME and the hole kept', async () => {
		const r = await parseFieldFile('wgs84-shapefile.zip', fixture('wgs84-shapefile.zip'));
		expect(r.format).toBe('shapefile');
		expect(r.warnings).toEqual([]);
		expect(names(r)).toEqual(['Home Square', 'Wet Corner']);
		const [home, wet] = r.shapes.features;
		// Stored clockwise in the .shp; WGS84 coordinates pass unchanged, turned counter-clockwise.
		expect(home.geometry.coordinates).toEqual([data.HOME_SQUARE]);
		// Arithmetic: a 1,320 ft geodesic square is 40 ac of 43,560 sq ft (here from 42°N 93.56°W).
		expect(home.properties.acres).toBe(40);
		// GeographicLib area (Karney 2013): outer ring minus the wet spot.
		expect(wet.properties.acres).toBe(Math.round(data.geographicLibAcres([data.WET_CORNER_FIELD, data.WET_SPOT]) * 100) / 100);
		expect(wet.geometry.coordinates).toEqual([data.WET_CORNER_FIELD, data.WET_SPOT]);
	});

	describe('UTM zone 15N (NAD83) with a .prj', () => {
		let r: ImportResult;
		beforeAll(async () => {
			r = await parseFieldFile('utm15n-shapefile.zip', fixture('utm15n-shapefile.zip'));
		});

		it('converts to longitude/latitude and says so', () => {
			expect(names(r)).toEqual(['Meridian Square', 'West Rectangle']);
			expect(r.warnings).toEqual([
				"The shapefile's datum (NAD83) was taken as WGS84; the two can differ by a metre or two.",
				"The shapefile's coordinates were converted from NAD 1983 UTM Zone 15N to WGS84 longitude/latitude."
			]);
		});

		it('puts every corner within 0.5 m of proj4’s inverse of the stored grid coordinates', () => {
			// Basis: proj4's inverse transverse Mercator for the same WKT, distances by GeographicLib.
			const toLngLat = proj4(data.UTM15N_NAD83_PRJ, 'EPSG:4326');
			[data.MERIDIAN_SQUARE_UTM, data.WEST_RECTANGLE_UTM].forEach((grid, i) => {
				const ring = (r.shapes.features[i].geometry.coordinates as Position[][])[0];
				expect(ring).toHaveLength(5);
				for (const corner of grid) {
					const expected = toLngLat.forward([corner[0], corner[1]]);
					const nearest = Math.min(...ring.map((p) => metresApart(p, expected)));
					expect(nearest).toBeLessThan(0.5);
				}
			});
		});

		it('puts the corner on the central meridian where the meridian arc says, without proj4', () => {
			// Independent basis: on a transverse Mercator central meridian, easting = false easting and
			// northing = k0 × meridian arc from the equator (Snyder, USGS PP 1395, §8). The arc is walked
			// with GeographicLib Direct on the GRS80 ellipsoid (a = 6,378,137 m, 1/f = 298.257222101).
			const grs80 = new geographiclib.Geodesic.Geodesic(6_378_137, 1 / 298.257222101);
			const lat = grs80.Direct(0, -93, 0, 4_650_000 / 0.9996).lat2 as number;
			const ring = (r.shapes.features[0].geometry.coordinates as Position[][])[0];
			const nearest = Math.min(...ring.map((p) => metresApart(p, [-93, lat])));
			expect(nearest).toBeLessThan(0.01);
		});

		it('measures the grid square larger by the scale factor', () => {
			// Computed: A 1,320 ft grid square at the central meridian, where the scale factor is k0 = 0.9996:
			// true area = 40 ac / 0.9996² = 40.0320 ac.
			expect(r.shapes.features[0].properties.acres).toBe(Math.round((40 / 0.9996 ** 2) * 100) / 100);
			expect(r.shapes.features[0].properties.acres).toBe(40.03);
		});
	});

	it('reads a shapefile without a .prj as longitude/latitude when its numbers fit, with a warning', async () => {
		const files = await unzipFixture('wgs84-shapefile.zip');
		delete files['fields_wgs84.prj'];
		const r = await parseFieldFile('no-prj.zip', await zipOf(files));
		expect(names(r)).toEqual(['Home Square', 'Wet Corner']);
		expect(r.warnings).toEqual(['The shapefile has no .prj file; its coordinates were read as WGS84 longitude/latitude.']);
	});

	it('refuses projected coordinates with no .prj, and a .prj it cannot read', async () => {
		const files = await unzipFixture('utm15n-shapefile.zip');
		delete files['fields_utm15n.prj'];
		const noPrj = await refused('utm-no-prj.zip', await zipOf(files));
		expect([noPrj.code, noPrj.status]).toEqual(['unknown_projection', 400]);
		expect(noPrj.message).toBe(
			"The shapefile's coordinates are not longitude/latitude (e.g. 500000, 4650000) and it has no .prj to say what they are. Add the .prj file from the same export to the zip, or export it again in WGS84 longitude/latitude."
		);
		const garbled = await refused('utm-bad-prj.zip', await zipOf({ ...files, 'fields_utm15n.prj': 'PROJCS["Local",PROJECTION["Not_A_Projection"]]' }));
		expect([garbled.code, garbled.status]).toEqual(['unknown_projection', 400]);
		expect(garbled.message).toMatch(/^The shapefile's coordinate system could not be understood \(.+\), so its coordinates cannot be placed on the map\./);
		const local = await refused('utm-local.zip', await zipOf({ ...files, 'fields_utm15n.prj': 'LOCAL_CS["Site grid",UNIT["metre",1]]' }));
		expect(local.message).toBe(
			"The shapefile's coordinate system could not be understood (the .prj describes a local grid with no place on Earth), so its coordinates cannot be placed on the map. Export it again in WGS84 longitude/latitude (EPSG:4326), or include the .prj file your mapping program writes."
		);
	});

	it('refuses a zip without a shapefile, naming what it holds', async () => {
		const e = await refused('notes.zip', await zipOf({ 'notes.txt': 'invented', 'photo.jpg': 'x' }));
		expect([e.code, e.status]).toEqual(['no_shapefile', 400]);
		expect(e.message).toBe('This .zip file holds no shapefile (.shp): it holds notes.txt, photo.jpg. Zip the .shp together with its .shx, .dbf and .prj files.');
	});

	it('refuses a damaged .shp as unreadable', async () => {
		const files = await unzipFixture('wgs84-shapefile.zip');
		const e = await refused('cut.zip', await zipOf({ ...files, 'fields_wgs84.shp': files['fields_wgs84.shp'].slice(0, 60) }));
		expect([e.code, e.status]).toEqual(['unreadable', 400]);
		expect(e.message).toMatch(/^The file could not be read as (a )?shapefile: .+\.$/);
	});

	it('refuses a shapefile polygon whose ring is not closed rather than guessing the last edge', async () => {
		const open = data.HOME_SQUARE.slice(0, -1);
		const { shp } = writeShp([{ rings: toShapefileRings(open), attributes: {} }]);
		const dbf = writeDbf([{ name: 'FIELD_NAME', type: 'C', length: 20 }], [{ FIELD_NAME: 'Loose End' }]);
		const e = await refused('open.zip', await zipOf({ 'open.shp': shp, 'open.dbf': dbf, 'open.prj': data.WGS84_PRJ }));
		expect([e.code, e.status]).toEqual(['open_ring', 400]);
		// Written clockwise, so the ring runs from the north-west corner round to the south-west one.
		const [sw, , , nw] = data.HOME_SQUARE;
		expect(e.message).toBe(
			`Shape 1 ("Loose End"): its outer boundary is not closed: it starts at ${nw[0]}, ${Number(nw[1].toFixed(6))} but ends at ${sw[0]}, ${sw[1]}. An outline must end on its first position.`
		);
	});
});

describe('size limits', () => {
	it('refuses an upload over 10 MB with 413, and takes one of exactly 10 MB past the size check', async () => {
		const big = await refused('big.geojson', new Uint8Array(12 * 1024 * 1024).fill(0x20));
		expect([big.code, big.status]).toEqual(['too_large', 413]);
		expect(big.message).toBe('The file is 12.0 MB, over the 10 MB limit. Boundary files are usually far smaller: upload only the fields you need.');
		const atLimit = await refused('spaces.geojson', new Uint8Array(IMPORT_LIMITS.maxUploadBytes).fill(0x20));
		expect(atLimit.code).toBe('wrong_content');
	});

	describe('zip bombs', () => {
		let bomb: Uint8Array;
		beforeAll(async () => {
			// 60 MB of zeros deflates to well under 100 kB.
			bomb = await zipOf({ 'bomb.shp': new Uint8Array(60 * 1024 * 1024), 'bomb.prj': data.WGS84_PRJ });
			expect(bomb.length).toBeLessThan(IMPORT_LIMITS.maxUploadBytes);
		});

		it('refuses an archive whose declared sizes pass 50 MB, before inflating', async () => {
			const e = await refused('bomb.zip', bomb);
			expect([e.code, e.status]).toEqual(['zip_too_large', 413]);
			expect(e.message).toBe('The .zip file would expand to more than 50 MB when unpacked. Upload only the boundary files.');
		});

		it('stops inflating an archive that understates its sizes once it passes 50 MB', async () => {
			const lying = bomb.slice();
			const view = new DataView(lying.buffer);
			for (const at of offsetsOf(lying, 0x02014b50)) view.setUint32(at + 24, 1000, true); // central directory
			for (const at of offsetsOf(lying, 0x04034b50)) view.setUint32(at + 22, 1000, true); // local headers
			const e = await refused('bomb.zip', lying);
			expect([e.code, e.status]).toEqual(['zip_too_large', 413]);
			expect(e.message).toBe('The .zip file expands to more than 50 MB when unpacked (it says less than it holds).');
		});
	});

	it('refuses more than 200 entries, even when the archive trailer understates the count', async () => {
		const files = (n: number) => Object.fromEntries(Array.from({ length: n }, (_, i) => [`note-${String(i + 1).padStart(3, '0')}.txt`, 'x']));
		const many = await zipOf(files(201), 'STORE');
		const e = await refused('many.zip', many);
		expect([e.code, e.status]).toEqual(['zip_too_many_files', 413]);
		expect(e.message).toBe('The .zip file holds more than 200 files. Put only the boundary files (.shp, .shx, .dbf, .prj) in the archive.');

		const understated = many.slice();
		const trailer = offsetsOf(understated, 0x06054b50)[0];
		new DataView(understated.buffer).setUint16(trailer + 8, 5, true);
		new DataView(understated.buffer).setUint16(trailer + 10, 5, true);
		expect((await refused('many.zip', understated)).code).toBe('zip_too_many_files');

		// Exactly 200 entries pass the count check and fail later for holding no shapefile.
		expect((await refused('two-hundred.zip', await zipOf(files(200), 'STORE'))).code).toBe('no_shapefile');
	});
});

describe('content that does not match its name', () => {
	const PNG = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52]);

	it.each([
		['field.kml', PNG, 'This .kml file is not a KML file: it holds a PNG image.'],
		['field.zip', text('these are not the files you zipped'), 'This .zip file is not a zip archive: it holds plain text.'],
		['field.geojson', text('<kml></kml>'), 'This .geojson file is not a GeoJSON file: it holds an XML document.'],
		['field.kmz', text('{"type":"FeatureCollection","features":[]}'), 'This .kmz file is not a zip archive (KMZ): it holds a JSON document.'],
		['field.json', new Uint8Array([0x25, 0x50, 0x44, 0x46, 0x2d, 0x31]), 'This .json file is not a GeoJSON file: it holds a PDF document.']
	])('%s is refused with what it really holds', async (name, bytes, message) => {
		const e = await refused(name, bytes);
		expect([e.code, e.status, e.message]).toEqual(['wrong_content', 400, message]);
	});

	it('refuses JSON that is not GeoJSON, JSON that does not parse, unknown extensions and empty files', async () => {
		const settings = await refused('settings.json', json({ theme: 'dark', rows: 8 }));
		expect([settings.code, settings.status]).toEqual(['not_geojson', 400]);
		expect(settings.message).toBe('This .json file is JSON but not GeoJSON: it has no "type" of FeatureCollection, Feature or geometry. Export the boundary as a GeoJSON FeatureCollection.');
		const cut = await refused('cut.geojson', text('{"type":"FeatureCollection","features":[{'));
		expect([cut.code, cut.status]).toEqual(['unreadable', 400]);
		expect(cut.message).toMatch(/^The file could not be read as GeoJSON: .+\.$/);
		const csv = await refused('fields.csv', text('name,acres\nNorth,40'));
		expect([csv.code, csv.status, csv.message]).toEqual([
			'unsupported_format',
			400,
			'A .csv file cannot be imported. Upload a GeoJSON (.geojson or .json), KML (.kml or .kmz) or zipped shapefile (.zip).'
		]);
		const empty = await refused('empty.kml', new Uint8Array());
		expect([empty.code, empty.status, empty.message]).toEqual(['empty_file', 400, 'The .kml file is empty.']);
	});
});

describe('shape checks refuse the whole upload', () => {
	const goodThen = (geometry: unknown, name = 'Bad One') =>
		json({
			type: 'FeatureCollection',
			features: [
				{ type: 'Feature', properties: { name: 'Fine Field' }, geometry: { type: 'Polygon', coordinates: [data.NORTH_FORTY] } },
				{ type: 'Feature', properties: { name }, geometry }
			]
		});

	it('a self-crossing bowtie, naming the shape and where it crosses', async () => {
		const bowtie = [[-93.6, 42], [-93.59, 42.01], [-93.59, 42], [-93.6, 42.01], [-93.6, 42]];
		const e = await refused('bowtie.geojson', goodThen({ type: 'Polygon', coordinates: [bowtie] }, 'Bowtie'));
		expect([e.code, e.status]).toEqual(['self_intersection', 400]);
		// The diagonals of the 0.01° box cross at its centre.
		expect(e.message).toBe('Shape 2 ("Bowtie") crosses itself near longitude -93.595000, latitude 42.005001. Fix the outline so its edges do not cross.');
	});

	it('an open ring (RFC 7946 §3.1.6 requires closed rings)', async () => {
		const e = await refused('open.geojson', goodThen({ type: 'Polygon', coordinates: [data.RIDGE_EIGHTY.slice(0, -1)] }));
		expect([e.code, e.status]).toEqual(['open_ring', 400]);
		const last = data.RIDGE_EIGHTY[3];
		expect(e.message).toBe(
			`Shape 2 ("Bad One"): its outer boundary is not closed: it starts at -93.59, 42 but ends at ${Number(last[0].toFixed(6))}, ${Number(last[1].toFixed(6))}. An outline must end on its first position.`
		);
	});

	it('rings with fewer than 4 positions or fewer than 3 distinct corners', async () => {
		const [a, b] = data.NORTH_FORTY;
		const short = await refused('short.geojson', goodThen({ type: 'Polygon', coordinates: [[a, b, a]] }));
		expect([short.code, short.status, short.message]).toEqual([
			'too_few_positions',
			400,
			'Shape 2 ("Bad One"): its outer boundary has only 3 positions; an outline needs at least 3 corners plus the first corner repeated at the end (4 positions).'
		]);
		const repeats = await refused('repeats.geojson', goodThen({ type: 'MultiPolygon', coordinates: [[data.RIDGE_EIGHTY], [[a, b, b, a]]] }));
		expect(repeats.message).toBe("Shape 2 (\"Bad One\"): part 2's outer boundary has only 2 distinct corners; an outline needs at least 3.");
	});

	it('a polygon of 0 acres', async () => {
		// Three points on one meridian: a geodesic, so the outline encloses nothing.
		const flat = [[-93.6, 42], [-93.6, 42.01], [-93.6, 42.02], [-93.6, 42]];
		const e = await refused('flat.geojson', goodThen({ type: 'Polygon', coordinates: [flat] }));
		expect([e.code, e.status, e.message]).toEqual([
			'zero_area',
			400,
			'Shape 2 ("Bad One") encloses no area (0 acres): its corners lie on one line or almost on top of each other.'
		]);
	});

	it('a polygon over 20,000 acres', async () => {
		// A 6-mile square: 36 sq mi × 640 ac ≈ 23,040 ac nominal (43 U.S.C. §751).
		const township = data.rectangleRing([-93.6, 42], 6 * 5280, 6 * 5280);
		const acres = Math.round(data.geographicLibAcres([township]));
		expect(acres).toBeGreaterThan(23_000);
		const e = await refused('township.geojson', goodThen({ type: 'Polygon', coordinates: [township] }, 'Whole Township'));
		expect([e.code, e.status, e.message]).toEqual([
			'area_too_large',
			400,
			`Shape 2 ("Whole Township") encloses ${acres.toLocaleString('en-US')} acres, more than the 20,000-acre limit for one field. Split it into several fields.`
		]);
	});

	it('projected coordinates and swapped latitude/longitude', async () => {
		const utm = data.WEST_RECTANGLE_UTM;
		const projected = await refused('projected.geojson', polygonFile(utm));
		expect([projected.code, projected.status, projected.message]).toEqual([
			'projected_coordinates',
			400,
			"The GeoJSON file's coordinates look projected (e.g. 452310, 4875320 in Shape 1), not longitude/latitude. Export the file again in WGS84 longitude/latitude (EPSG:4326)."
		]);
		const swapped = await refused('swapped.geojson', polygonFile(data.NORTH_FORTY.map(([lng, lat]) => [lat, lng])));
		expect([swapped.code, swapped.status, swapped.message]).toEqual([
			'swapped_coordinates',
			400,
			"The GeoJSON file's coordinates look swapped: Shape 1 has 42, -93.6, which reads as latitude, longitude. Boundary files list longitude first, then latitude; export the file again with that order."
		]);
		const inKml = await refused(
			'projected.kml',
			text(`<kml><Placemark><Polygon><outerBoundaryIs><LinearRing><coordinates>${utm.map((p) => p.join(',')).join(' ')}</coordinates></LinearRing></outerBoundaryIs></Polygon></Placemark></kml>`)
		);
		expect(inKml.code).toBe('projected_coordinates');
		expect(inKml.message).toMatch(/^The KML file's coordinates look projected \(e\.g\. 452310, 4875320 in Shape 1\)/);
	});

	it('coordinates that are not numbers', async () => {
		const e = await refused('words.geojson', polygonFile([[-93.6, 42], ['east', 42], [-93.59, 42.01], [-93.6, 42]]));
		expect([e.code, e.status, e.message]).toEqual(['invalid_geometry', 400, 'Shape 1 is not a valid polygon: a corner is not a pair of numbers (["east",42]).']);
	});
});

describe('only ImportError ever escapes', () => {
	const samples = ['two-fields.geojson', 'two-fields.kml', 'wgs84-shapefile.zip', 'utm15n-shapefile.zip'].map((name) => [name, fixture(name)] as const);

	it('for fixtures cut short or with bytes overwritten', async () => {
		await fc.assert(
			fc.asyncProperty(
				fc.constantFrom(...samples),
				fc.nat(),
				fc.array(fc.tuple(fc.nat(), fc.integer({ min: 0, max: 255 })), { maxLength: 8 }),
				async ([name, bytes], cut, edits) => {
					const damaged = bytes.slice(0, 1 + (cut % bytes.length));
					for (const [at, value] of edits) damaged[at % damaged.length] = value;
					const outcome = await parseFieldFile(name, damaged).then(
						() => 'accepted',
						(e: unknown) => e
					);
					if (outcome !== 'accepted') expect(outcome).toBeInstanceOf(ImportError);
				}
			),
			{ numRuns: 300 }
		);
	});

	it('for random bytes under every extension', async () => {
		await fc.assert(
			fc.asyncProperty(fc.constantFrom('a.geojson', 'a.json', 'a.kml', 'a.kmz', 'a.zip'), fc.uint8Array({ minLength: 1, maxLength: 300 }), async (name, bytes) => {
				await expect(parseFieldFile(name, bytes)).rejects.toBeInstanceOf(ImportError);
			}),
			{ numRuns: 200 }
		);
	});
});

describe('outlines the import refuses before any heavy check', () => {
	it('refuses a shape with more than 50,000 points with 413, naming the shape', async () => {
		const ring: Position[] = [];
		for (let i = 0; i < 50_001; i++) ring.push([-93.9 + 0.004 * Math.cos((2 * Math.PI * i) / 50_001), 44.1 + 0.003 * Math.sin((2 * Math.PI * i) / 50_001)]);
		ring.push(ring[0]);
		const e = await refused('big.geojson', json({ type: 'Feature', properties: { name: 'Back forty' }, geometry: { type: 'Polygon', coordinates: [ring] } }));
		expect(e.code).toBe('too_many_vertices');
		expect(e.status).toBe(413);
		expect(e.message).toBe('Shape 1 ("Back forty") has 50,002 points; a field may have at most 50,000. Simplify the outline (thin its points to about 0.1 m) and export it again.');
	});

	it('refuses a shape across the 180th meridian in its own words', async () => {
		const e = await refused('island.geojson', polygonFile([[179.998, -17.01], [-179.998, -17.01], [-179.998, -17], [179.998, -17], [179.998, -17.01]]));
		expect(e.code).toBe('crosses_antimeridian');
		expect(e.status).toBe(400);
		expect(e.message).toBe('Shape 1 crosses the 180th meridian (the date line) near latitude -17.0100; a field must lie on one side of it. Split it there into two fields.');
	});

	it('refuses a shape around the South Pole', async () => {
		const ring: Position[] = [];
		for (let lng = -180; lng < 180; lng += 45) ring.push([lng, -89.5]);
		ring.push(ring[0]);
		const e = await refused('cap.geojson', polygonFile(ring));
		expect(e.code).toBe('encloses_pole');
		expect(e.message).toBe('Shape 1 goes all the way around the South Pole; a field outline must not enclose a pole.');
	});
});
