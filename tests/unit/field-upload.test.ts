import { afterAll, describe, expect, it } from 'vitest';
import { readUploadedShapes } from '../../src/lib/server/field-upload';
import { AppError } from '../../src/lib/server/errors';
import { parseFieldFile, ImportError } from '../../src/lib/server/field-import';
import { closeGeometryPool } from '../../src/lib/server/geometry-pool';

afterAll(async () => {
	await closeGeometryPool();
});

const BOUNDARY = 'stripwright-test-boundary';
const MB = 1024 * 1024;

/** A multipart upload streamed in 64 KB pieces with no Content-Length, as a chunked client sends it. */
function chunkedUpload(fileBytes: number): { request: Request; sent: () => number } {
	const head = new TextEncoder().encode(`--${BOUNDARY}\r\nContent-Disposition: form-data; name="file"; filename="big.geojson"\r\nContent-Type: application/geo+json\r\n\r\n`);
	const piece = new Uint8Array(64 * 1024).fill(0x20);
	let sent = 0;
	let headSent = false;
	const body = new ReadableStream<Uint8Array>({
		pull(controller) {
			if (!headSent) {
				headSent = true;
				controller.enqueue(head);
				return;
			}
			if (sent >= fileBytes) {
				controller.enqueue(new TextEncoder().encode(`\r\n--${BOUNDARY}--\r\n`));
				controller.close();
				return;
			}
			sent += piece.byteLength;
			controller.enqueue(piece);
		}
	});
	const request = new Request('http://127.0.0.1/api/farms/x/fields/import', {
		method: 'POST',
		body,
		headers: { 'content-type': `multipart/form-data; boundary=${BOUNDARY}` },
		duplex: 'half'
	} as RequestInit);
	return { request, sent: () => sent };
}

describe('reading an uploaded boundary file', () => {
	it('a 50 MB chunked upload (no Content-Length) is a 413, and reading stops soon after 10 MB', async () => {
		const { request, sent } = chunkedUpload(50 * MB);
		expect(request.headers.get('content-length')).toBeNull();
		const outcome = await readUploadedShapes(request).then(() => null, (e: unknown) => e);
		expect(outcome).toBeInstanceOf(AppError);
		const e = outcome as AppError;
		expect(e.status).toBe(413);
		expect(e.code).toBe('too_large');
		expect(e.message).toBe('The file is larger than the limit: uploads are limited to 10.0 MB.');
		expect(sent()).toBeLessThan(11 * MB);
	});

	it('a small chunked upload is read whole', async () => {
		const square = JSON.stringify({ type: 'Polygon', coordinates: [[[-94.3, 43.7], [-94.29, 43.7], [-94.29, 43.71], [-94.3, 43.71], [-94.3, 43.7]]] });
		const enc = new TextEncoder();
		const parts = [`--${BOUNDARY}\r\nContent-Disposition: form-data; name="file"; filename="one.geojson"\r\nContent-Type: application/geo+json\r\n\r\n`, square, `\r\n--${BOUNDARY}--\r\n`];
		const body = new ReadableStream<Uint8Array>({
			start(c) {
				for (const p of parts) c.enqueue(enc.encode(p));
				c.close();
			}
		});
		const request = new Request('http://127.0.0.1/x', { method: 'POST', body, headers: { 'content-type': `multipart/form-data; boundary=${BOUNDARY}` }, duplex: 'half' } as RequestInit);
		const result = await readUploadedShapes(request);
		expect(result.format).toBe('geojson');
		expect(result.shapes.features).toHaveLength(1);
	});
});

describe('library messages stay out of import refusals', () => {
	it('GeoJSON nested 20,000 levels deep is refused in plain words, without the engine\'s "Maximum call stack size exceeded"', async () => {
		const depth = 20_000;
		const text = `{"type":"Feature","properties":{},"geometry":${'{"type":"GeometryCollection","geometries":['.repeat(depth)}{"type":"Polygon","coordinates":[[[0,0],[1,0],[1,1],[0,0]]]}${']}'.repeat(depth)}}`;
		const outcome = await parseFieldFile('deep.geojson', new TextEncoder().encode(text)).then(() => null, (e: unknown) => e);
		expect(outcome).toBeInstanceOf(ImportError);
		expect((outcome as ImportError).message).toBe('The file could not be read as GeoJSON: it is nested too deeply or is too large to read.');
	});
});
