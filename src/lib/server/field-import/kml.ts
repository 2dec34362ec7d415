import { kml } from '@tmcw/togeojson';
import { DOMParser } from '@xmldom/xmldom';
import { ImportError, shortReason } from './errors';
import type { SourceFeature } from './shapes';

/** Decodes XML bytes by the encoding its declaration names (older KML is often Latin-1). */
function decodeXml(bytes: Uint8Array): string {
	const head = new TextDecoder('latin1').decode(bytes.subarray(0, 200));
	const declared = /^\s*<\?xml[^>]*encoding\s*=\s*["']([A-Za-z0-9._-]+)["']/.exec(head.replace(/^\uFEFF|^ï»¿/, ''))?.[1];
	try {
		return new TextDecoder(declared ?? 'utf-8').decode(bytes);
	} catch {
		return new TextDecoder('utf-8').decode(bytes);
	}
}

/**
 * Reads KML into features with @tmcw/togeojson. Its rings come out closed and MultiGeometry as
 * a GeometryCollection, which the polygon collector flattens.
 * @param fileLabel e.g. ".kml file", used in messages
 * @throws ImportError unreadable (not XML) or not_kml (XML of another kind)
 */
export function readKml(bytes: Uint8Array, fileLabel: string): SourceFeature[] {
	let doc: ReturnType<DOMParser['parseFromString']>;
	try {
		// Warnings are ignored; only fatal errors (malformed XML) stop the reading.
		doc = new DOMParser({ onError: () => undefined }).parseFromString(decodeXml(bytes), 'text/xml');
	} catch (e) {
		throw new ImportError('unreadable', `The file could not be read as KML: ${shortReason(e)}.`);
	}
	const root = doc.documentElement?.localName ?? doc.documentElement?.nodeName;
	if (root !== 'kml') {
		throw new ImportError('not_kml', `This ${fileLabel} is XML but not KML (its outermost element is <${root ?? '?'}>, not <kml>).`);
	}
	let features;
	try {
		features = kml(doc as unknown as Document).features;
	} catch (e) {
		throw new ImportError('unreadable', `The file could not be read as KML: ${shortReason(e)}.`);
	}
	return features.map((f, i) => ({ geometry: f.geometry ?? undefined, properties: (f.properties ?? {}) as Record<string, unknown>, sourceIndex: i }));
}
