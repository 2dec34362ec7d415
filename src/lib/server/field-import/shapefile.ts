import type { Geometry, Position } from 'geojson';
import { parseDbf, parseShp } from 'shpjs';
import { ImportError, shortReason } from './errors';
import { shapefileReprojection } from './projection';
import type { SourceFeature } from './shapes';
import { baseName, isArchiveClutter, type ZipArchive, type ZipEntry } from './zip';

function unreadable(detail: string): ImportError {
	return new ImportError('unreadable', `The file could not be read as a shapefile: ${detail}.`);
}

function mapPositions(g: Geometry, f: (p: Position) => Position): Geometry {
	switch (g.type) {
		case 'Point':
			return { ...g, coordinates: f(g.coordinates) };
		case 'MultiPoint':
		case 'LineString':
			return { ...g, coordinates: g.coordinates.map(f) };
		case 'MultiLineString':
		case 'Polygon':
			return { ...g, coordinates: g.coordinates.map((r) => r.map(f)) };
		case 'MultiPolygon':
			return { ...g, coordinates: g.coordinates.map((p) => p.map((r) => r.map(f))) };
		case 'GeometryCollection':
			return { ...g, geometries: g.geometries.map((m) => mapPositions(m, f)) };
	}
}

function storedPositions(geometries: (Geometry | null)[]): Position[] {
	const out: Position[] = [];
	const visit = (g: Geometry): void => {
		if (g.type === 'GeometryCollection') g.geometries.forEach(visit);
		else if (g.type === 'Point') out.push(g.coordinates);
		else if (g.type === 'MultiPoint' || g.type === 'LineString') out.push(...g.coordinates);
		else if (g.type === 'MultiLineString' || g.type === 'Polygon') g.coordinates.forEach((r) => out.push(...r));
		else g.coordinates.forEach((p) => p.forEach((r) => out.push(...r)));
	};
	geometries.forEach((g) => g && visit(g));
	return out;
}

function asDataView(bytes: Uint8Array): DataView {
	return new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
}

interface Layer {
	shp: ZipEntry;
	dbf?: ZipEntry;
	prj?: ZipEntry;
	cpg?: ZipEntry;
}

function layersOf(zip: ZipArchive, fileLabel: string): Layer[] {
	const entries = zip.entries.filter((e) => !isArchiveClutter(e));
	const stem = (e: ZipEntry) => e.name.slice(0, e.name.lastIndexOf('.')).toLowerCase();
	const sibling = (shp: ZipEntry, ext: string) => entries.find((e) => stem(e) === stem(shp) && baseName(e).endsWith(ext));
	const layers = entries
		.filter((e) => baseName(e).endsWith('.shp'))
		.sort((a, b) => a.name.localeCompare(b.name))
		.map((shp) => ({ shp, dbf: sibling(shp, '.dbf'), prj: sibling(shp, '.prj'), cpg: sibling(shp, '.cpg') }));
	if (layers.length === 0) {
		const names = entries.slice(0, 5).map((e) => e.name);
		const holds = names.length ? `it holds ${names.join(', ')}${entries.length > 5 ? ', …' : ''}` : 'it is empty';
		throw new ImportError('no_shapefile', `This ${fileLabel} holds no shapefile (.shp): ${holds}. Zip the .shp together with its .shx, .dbf and .prj files.`);
	}
	return layers;
}

/**
 * A damaged .dbf header can claim millions of records; the parser would then loop and allocate
 * for each of them (a minute and hundreds of MB for a 200-byte file). Refuse a header whose
 * records do not fit in the file. dBase header: records at bytes 4–7, header length 8–9,
 * record length 10–11, little-endian.
 */
function checkDbfHeader(bytes: Uint8Array, name: string) {
	if (bytes.length < 32) throw unreadable(`its attribute table ${name} is cut short (${bytes.length} bytes)`);
	const view = asDataView(bytes);
	const records = view.getUint32(4, true);
	const headerLength = view.getUint16(8, true);
	const recordLength = view.getUint16(10, true);
	if (headerLength < 33 || recordLength < 1 || headerLength + records * recordLength > bytes.length + 1) {
		throw unreadable(`its attribute table ${name} is damaged: its header claims ${records} records of ${recordLength} bytes, more than the ${bytes.length}-byte file holds`);
	}
}

/**
 * Reads every shapefile layer in a zip archive, converting coordinates to WGS84 longitude/latitude
 * as the layer's .prj says.
 * @throws ImportError unreadable, no_shapefile, unknown_projection
 */
export function readShapefileZip(zip: ZipArchive, fileLabel: string): { features: SourceFeature[]; warnings: string[] } {
	const layers = layersOf(zip, fileLabel);
	const features: SourceFeature[] = [];
	const warnings = new Set<string>();
	if (layers.length > 1) warnings.add(`The archive holds ${layers.length} shapefiles; shapes from all of them were read.`);
	for (const layer of layers) {
		let geometries: (Geometry | null)[];
		try {
			geometries = parseShp(asDataView(zip.read(layer.shp)));
		} catch (e) {
			if (e instanceof ImportError) throw e;
			throw unreadable(`${layer.shp.name}: ${shortReason(e)}`);
		}
		let records: Record<string, unknown>[] = [];
		if (layer.dbf) {
			const cpg = layer.cpg ? new TextDecoder().decode(zip.read(layer.cpg)).trim() : undefined;
			try {
				const dbf = zip.read(layer.dbf);
				checkDbfHeader(dbf, layer.dbf.name);
				records = parseDbf(asDataView(dbf), cpg);
			} catch (e) {
				if (e instanceof ImportError) throw e;
				throw unreadable(`its attribute table ${layer.dbf.name}: ${shortReason(e)}`);
			}
		} else {
			warnings.add('The shapefile has no .dbf attribute table, so its shapes have no names.');
		}
		const prj = layer.prj ? new TextDecoder().decode(zip.read(layer.prj)) : undefined;
		const { toLngLat, warnings: projectionWarnings } = shapefileReprojection(prj, storedPositions(geometries));
		projectionWarnings.forEach((w) => warnings.add(w));
		geometries.forEach((g, i) => {
			features.push({
				geometry: g && toLngLat ? mapPositions(g, toLngLat) : (g ?? undefined),
				properties: records[i] ?? {},
				sourceIndex: features.length
			});
		});
	}
	return { features, warnings: [...warnings] };
}
