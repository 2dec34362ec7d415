// Property tests over every upload parser: whatever bytes arrive, each parser answers with a result
// or its own clear error (never a library's exception), within a time bound per case, with memory
// bounded across the run. The number of cases run is printed.
import { afterAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import JSZip from 'jszip';
import sharp from 'sharp';
// The parser the geometry threads run, called in this thread so each case is timed on its own.
import { readFieldFile } from '$lib/server/field-import/read';
import { ImportError } from '$lib/server/field-import/errors';
import { preparePhoto } from '$lib/server/photos';
import { AppError } from '$lib/server/errors';
import { readHeaders, readYieldCsv, YieldFileError } from '$lib/harvest/yield-points';

const CASE_MS = 3000;
const counts: Record<string, number> = {};
afterAll(() => {
	console.log(`fuzzed parsers: ${Object.entries(counts).map(([k, n]) => `${k} ${n} cases`).join(', ')}`);
});

const fixture = (name: string) => new Uint8Array(readFileSync(`tests/fixtures/import/${name}`));
const enc = (s: string) => new TextEncoder().encode(s);

/** Runs one case: it must finish within CASE_MS and end in a result or an expected error class. */
async function bounded<T>(label: string, run: () => T | Promise<T>, expected: (e: unknown) => boolean) {
	counts[label] = (counts[label] ?? 0) + 1;
	const started = performance.now();
	try {
		await run();
	} catch (e) {
		if (!expected(e)) throw new Error(`${label}: unexpected ${(e as Error)?.constructor?.name}: ${(e as Error)?.message}`);
	}
	const ms = performance.now() - started;
	if (ms > CASE_MS) throw new Error(`${label}: one case took ${ms.toFixed(0)} ms`);
}

const isImportError = (e: unknown) => e instanceof ImportError && (e.status === 400 || e.status === 413);

/** A byte array with a few bytes of a valid file changed, cut or repeated. */
function mutated(base: Uint8Array) {
	return fc
		.record({
			edits: fc.array(fc.tuple(fc.nat(base.length - 1), fc.integer({ min: 0, max: 255 })), { maxLength: 12 }),
			cut: fc.option(fc.nat(base.length), { nil: undefined })
		})
		.map(({ edits, cut }) => {
			const out = base.slice(0, cut ?? base.length);
			for (const [i, v] of edits) if (i < out.length) out[i] = v;
			return out;
		});
}

const coord = fc.oneof(fc.double({ noNaN: false }), fc.double({ min: -181, max: 181 }), fc.constantFrom(0, -94.3, 43.7, 1e308, -1e308));
const ring = fc.array(fc.tuple(coord, coord), { minLength: 0, maxLength: 12 });
const geometry = fc.oneof(
	fc.record({ type: fc.constant('Polygon'), coordinates: fc.array(ring, { maxLength: 3 }) }),
	fc.record({ type: fc.constant('MultiPolygon'), coordinates: fc.array(fc.array(ring, { maxLength: 2 }), { maxLength: 3 }) }),
	fc.record({ type: fc.constantFrom('Point', 'LineString', 'GeometryCollection', 'Nope'), coordinates: fc.anything() }),
	fc.anything()
);
const geojson = fc.oneof(
	fc.record({ type: fc.constant('FeatureCollection'), features: fc.array(fc.record({ type: fc.constant('Feature'), properties: fc.option(fc.dictionary(fc.string(), fc.jsonValue())), geometry }), { maxLength: 5 }) }),
	fc.record({ type: fc.constant('Feature'), geometry }),
	geometry,
	fc.jsonValue()
);

describe('field files', { timeout: 120_000 }, () => {
	it('GeoJSON: structured nonsense and random text', async () => {
		await fc.assert(
			fc.asyncProperty(fc.oneof(geojson.map((g) => JSON.stringify(g)), fc.string({ maxLength: 400 }), fc.string({ unit: 'binary', maxLength: 200 })), async (text) => {
				await bounded('GeoJSON', () => readFieldFile('f.geojson', enc(text)), isImportError);
			}),
			{ numRuns: 400 }
		);
	});

	it('GeoJSON: a valid file with bytes changed or cut', async () => {
		await fc.assert(fc.asyncProperty(mutated(fixture('two-fields.geojson')), async (bytes) => bounded('GeoJSON (mutated)', () => readFieldFile('f.geojson', bytes), isImportError)), { numRuns: 300 });
	});

	it('KML and KMZ: a valid file with bytes changed or cut, zipped or not, and random bytes', async () => {
		const kml = fixture('two-fields.kml');
		await fc.assert(fc.asyncProperty(mutated(kml), async (bytes) => bounded('KML (mutated)', () => readFieldFile('f.kml', bytes), isImportError)), { numRuns: 300 });
		await fc.assert(
			fc.asyncProperty(mutated(kml), async (bytes) => {
				const zip = new JSZip();
				zip.file('doc.kml', bytes);
				const kmz = await zip.generateAsync({ type: 'uint8array' });
				await bounded('KMZ', () => readFieldFile('f.kmz', kmz), isImportError);
			}),
			{ numRuns: 100 }
		);
		await fc.assert(fc.asyncProperty(fc.uint8Array({ maxLength: 2000 }), async (bytes) => bounded('KML (random)', () => readFieldFile('f.kml', bytes), isImportError)), { numRuns: 200 });
	});

	it('zipped Shapefile: valid zips with bytes changed or cut, and random bytes', async () => {
		for (const name of ['wgs84-shapefile.zip', 'utm15n-shapefile.zip']) {
			await fc.assert(fc.asyncProperty(mutated(fixture(name)), async (bytes) => bounded('Shapefile (mutated)', () => readFieldFile('f.zip', bytes), isImportError)), { numRuns: 200 });
		}
		await fc.assert(fc.asyncProperty(fc.uint8Array({ maxLength: 2000 }), async (bytes) => bounded('Shapefile (random)', () => readFieldFile('f.zip', bytes), isImportError)), { numRuns: 200 });
		// Past the zip's own checks: the .shp, .dbf and .prj inside damaged, then zipped again.
		const inner = await JSZip.loadAsync(fixture('utm15n-shapefile.zip'));
		const parts: Record<string, Uint8Array> = {};
		for (const name of Object.keys(inner.files)) parts[name] = await inner.file(name)!.async('uint8array');
		const target = fc.constantFrom(...Object.keys(parts));
		await fc.assert(
			fc.asyncProperty(target.chain((name) => fc.tuple(fc.constant(name), mutated(parts[name]))), async ([name, bytes]) => {
				const zip = new JSZip();
				for (const [n, b] of Object.entries(parts)) zip.file(n, n === name ? bytes : b);
				await bounded('Shapefile (damaged inside)', async () => readFieldFile('f.zip', await zip.generateAsync({ type: 'uint8array' })), isImportError);
			}),
			{ numRuns: 300 }
		);
	});

	it('ISO 11783-10 task data: XML with random elements, attributes and numbers', async () => {
		const pnt = fc.record({ A: fc.constantFrom('2', '6', '7', 'x', ''), C: fc.oneof(fc.double().map(String), fc.string({ maxLength: 6 })), D: fc.oneof(fc.double().map(String), fc.string({ maxLength: 6 })) });
		const lsg = fc.record({ A: fc.constantFrom('1', '2', '5', '9'), points: fc.array(pnt, { maxLength: 8 }) });
		const xml = fc
			.record({
				root: fc.constantFrom('ISO11783_TaskData', 'Other'),
				version: fc.constantFrom('4', '3', 'x'),
				lsgs: fc.array(lsg, { maxLength: 4 }),
				junk: fc.string({ maxLength: 30 })
			})
			.map(({ root, version, lsgs, junk }) => {
				const esc = (s: string) => s.replace(/[<&"]/g, '');
				const body = lsgs.map((l) => `<LSG A="${l.A}">${l.points.map((p) => `<PNT A="${esc(p.A)}" C="${esc(p.C)}" D="${esc(p.D)}"/>`).join('')}</LSG>`).join('');
				return `<?xml version="1.0" encoding="UTF-8"?><${root} VersionMajor="${version}" VersionMinor="0"><PFD A="PFD1" C="F ${esc(junk)}" D="1"><PLN A="1">${body}</PLN></PFD></${root}>`;
			});
		await fc.assert(fc.asyncProperty(xml, async (text) => bounded('ISO 11783-10 XML', () => readFieldFile('TASKDATA.XML', enc(text)), isImportError)), { numRuns: 300 });
		await fc.assert(
			fc.asyncProperty(xml, async (text) => {
				const zip = new JSZip();
				zip.file('TASKDATA/TASKDATA.XML', text);
				await bounded('ISO 11783-10 zip', async () => readFieldFile('taskdata.zip', await zip.generateAsync({ type: 'uint8array' })), isImportError);
			}),
			{ numRuns: 100 }
		);
	});
});

describe('yield-monitor CSV', { timeout: 120_000 }, () => {
	const mapping = { longitude: 'lon', latitude: 'lat', yield: 'yield', massFlow: null, moisture: 'moist', swathWidth: 'swath', time: 'time', speed: null, swathUnit: 'ft', speedUnit: 'mph' };
	const cell = fc.oneof(fc.double().map(String), fc.string({ maxLength: 8 }), fc.constantFrom('', '-94.3', '43.7', '1,5', 'NaN', '2026-10-01T10:00:00Z', '"', '\n'));
	const csv = fc
		.record({
			header: fc.oneof(fc.constant(['lon', 'lat', 'yield', 'moist', 'swath', 'time']), fc.array(fc.string({ maxLength: 6 }), { maxLength: 7 })),
			rows: fc.array(fc.array(cell, { maxLength: 8 }), { maxLength: 30 }),
			sep: fc.constantFrom(',', ';', '\t')
		})
		.map(({ header, rows, sep }) => [header, ...rows].map((r) => r.join(sep)).join('\n'));

	it('any text: points or a clear file error', async () => {
		const isYieldError = (e: unknown) => e instanceof YieldFileError;
		await fc.assert(
			fc.asyncProperty(fc.oneof(csv, fc.string({ maxLength: 500 })), async (text) => {
				await bounded('yield CSV headers', () => readHeaders(text), isYieldError);
				await bounded('yield CSV', () => readYieldCsv(text, mapping as Parameters<typeof readYieldCsv>[1]), isYieldError);
			}),
			{ numRuns: 500 }
		);
	});
});

describe('photos', { timeout: 120_000 }, () => {
	it('random bytes, damaged images and non-images: a prepared photo or a clear 400/413', async () => {
		const jpeg = new Uint8Array(await sharp({ create: { width: 40, height: 30, channels: 3, background: '#6a8' } }).jpeg().toBuffer());
		const png = new Uint8Array(await sharp({ create: { width: 20, height: 20, channels: 4, background: '#123' } }).png().toBuffer());
		const isPhotoError = (e: unknown) => e instanceof AppError && (e.status === 400 || e.status === 413);
		await fc.assert(
			fc.asyncProperty(fc.oneof(mutated(jpeg), mutated(png), fc.uint8Array({ maxLength: 3000 })), fc.constantFrom('a.jpg', 'b.png', 'c.webp', 'd.txt', null), async (bytes, name) => {
				await bounded('photo', () => preparePhoto(bytes, name), isPhotoError);
			}),
			{ numRuns: 250 }
		);
	});
});

describe('memory', () => {
	it('stays bounded across the fuzzing above', () => {
		const heapMb = process.memoryUsage().heapUsed / 1024 / 1024;
		expect(heapMb).toBeLessThan(1024);
		expect(Object.values(counts).reduce((a, b) => a + b, 0)).toBeGreaterThan(3000);
	});
});
