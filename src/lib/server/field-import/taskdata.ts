// Reads ISO 11783-10 task data (TASKDATA.XML, bare or in a zip) into field outlines: each partfield
// (PFD) becomes one shape from its boundary polygons (PLN type 1), exterior line strings (LSG type 1)
// as outer rings and interior ones (type 2) as holes. Other polygons (obstacles, headlands …) and
// guidance lines are not outlines and are skipped with a note.
import { DOMParser } from '@xmldom/xmldom';
import { ImportError, shortReason } from './errors';
import type { SourceFeature } from './shapes';
import { baseName, isArchiveClutter, type ZipArchive } from './zip';

type El = {
	localName?: string | null;
	nodeName: string;
	getAttribute(name: string): string | null;
	childNodes: ArrayLike<unknown>;
};

const ROOT = 'ISO11783_TaskData';

function elementsNamed(parent: El, name: string): El[] {
	const out: El[] = [];
	for (let i = 0; i < parent.childNodes.length; i++) {
		const node = parent.childNodes[i] as El & { nodeType?: number };
		if (node.nodeType === 1 && (node.localName ?? node.nodeName) === name) out.push(node);
	}
	return out;
}

function readPoint(pnt: El, where: string): [number, number] {
	const lat = Number(pnt.getAttribute('C'));
	const lng = Number(pnt.getAttribute('D'));
	if (pnt.getAttribute('C') === null || pnt.getAttribute('D') === null || !Number.isFinite(lat) || !Number.isFinite(lng)) {
		throw new ImportError('invalid_geometry', `${where} has a point (PNT) without a numeric latitude (C) and longitude (D).`);
	}
	return [lng, lat];
}

function readRing(lsg: El, where: string): [number, number][] {
	const ring = elementsNamed(lsg, 'PNT').map((p) => readPoint(p, where));
	const [first, last] = [ring[0], ring[ring.length - 1]];
	// The standard leaves the closing point optional; GeoJSON needs it.
	if (ring.length > 0 && (first[0] !== last[0] || first[1] !== last[1])) ring.push(first);
	return ring;
}

/** Refuses DTDs outright: task data never needs one, and entity declarations are an attack surface. */
function refuseDeclarations(text: string, fileLabel: string) {
	if (/<!DOCTYPE|<!ENTITY/i.test(text)) {
		throw new ImportError('unreadable', `This ${fileLabel} declares a DTD or XML entities, which task data never needs; it was not read. Export it again from the display or farm software.`);
	}
}

/**
 * @param text the XML document
 * @param fileLabel how messages name the file, e.g. ".xml file"
 * @throws ImportError not_taskdata (another XML), no_polygons (no partfield boundary), unreadable
 */
export function readTaskDataXml(text: string, fileLabel: string): { features: SourceFeature[]; warnings: string[] } {
	refuseDeclarations(text, fileLabel);
	let doc;
	try {
		doc = new DOMParser({
			onError: (level: string, message: string) => {
				if (level === 'fatalError' || level === 'error') throw new Error(message);
			}
		}).parseFromString(text, 'text/xml');
	} catch (e) {
		throw new ImportError('unreadable', `The ${fileLabel} could not be read as XML: ${shortReason(e)}.`);
	}
	const root = doc.documentElement as unknown as El | null;
	const rootName = root ? (root.localName ?? root.nodeName) : null;
	if (!root || rootName !== ROOT) {
		throw new ImportError('not_taskdata', `This ${fileLabel} is XML but not ISO 11783-10 task data (its outermost element is <${rootName ?? '?'}>, not <${ROOT}>).`);
	}
	const warnings: string[] = [];
	const features: SourceFeature[] = [];
	let skippedPolygons = 0;
	for (const [i, pfd] of elementsNamed(root, 'PFD').entries()) {
		const name = pfd.getAttribute('C')?.trim() || pfd.getAttribute('A') || `Partfield ${i + 1}`;
		const polygons: [number, number][][][] = [];
		for (const pln of elementsNamed(pfd, 'PLN')) {
			if (pln.getAttribute('A') !== '1') {
				skippedPolygons++;
				continue;
			}
			const where = `Partfield "${name}"`;
			const lines = elementsNamed(pln, 'LSG');
			const exterior = lines.filter((l) => l.getAttribute('A') === '1');
			const interior = lines.filter((l) => l.getAttribute('A') === '2');
			if (exterior.length !== 1) {
				throw new ImportError('invalid_geometry', `${where} has a boundary polygon with ${exterior.length} exterior line strings (LSG type 1); it needs exactly one.`);
			}
			polygons.push([readRing(exterior[0], where), ...interior.map((l) => readRing(l, where))]);
		}
		if (polygons.length === 0) continue;
		features.push({
			geometry: polygons.length === 1 ? { type: 'Polygon', coordinates: polygons[0] } : { type: 'MultiPolygon', coordinates: polygons },
			properties: { name },
			sourceIndex: i
		});
	}
	if (features.length === 0) {
		throw new ImportError('no_polygons', `This ${fileLabel} holds no partfield boundary (PFD with a PLN of type 1), so there is no field outline to import.`);
	}
	if (skippedPolygons > 0) warnings.push(`${skippedPolygons} polygon${skippedPolygons === 1 ? '' : 's'} that are not partfield boundaries (obstacles, headlands, zones) were not imported.`);
	return { features, warnings };
}

/** The TASKDATA.XML entry of a zip, or null when the archive holds none. */
export function findTaskDataEntry(zip: ZipArchive) {
	return zip.entries.find((e) => !isArchiveClutter(e) && baseName(e) === 'taskdata.xml') ?? null;
}

export function readTaskDataZip(zip: ZipArchive, fileLabel: string): { features: SourceFeature[]; warnings: string[] } {
	const entry = findTaskDataEntry(zip);
	if (!entry) throw new ImportError('no_polygons', `This ${fileLabel} holds no TASKDATA.XML.`);
	return readTaskDataXml(new TextDecoder('utf-8').decode(zip.read(entry)), fileLabel);
}
