// Reads one uploaded boundary file from a multipart request, enforcing the size limit as the body
// arrives, whether or not the client told us its length.
import { AppError } from './errors';
import { readBodyUpTo } from './read-body';
import { IMPORT_LIMITS, ImportError, parseFieldFile, type ImportResult } from './field-import';

// Room for the multipart framing and the form's other fields around the file itself.
const FRAMING_BYTES = 64 * 1024;

export async function readUploadedShapes(request: Request): Promise<ImportResult> {
	const declared = Number(request.headers.get('content-length') ?? 0);
	if (declared > IMPORT_LIMITS.maxUploadBytes + FRAMING_BYTES) throw tooLarge(declared);
	// A chunked upload declares no length: count as it arrives and stop at the limit.
	const body = await readAtMost(request, IMPORT_LIMITS.maxUploadBytes + FRAMING_BYTES);
	let data: FormData;
	try {
		data = await new Response(body, { headers: { 'content-type': request.headers.get('content-type') ?? '' } }).formData();
	} catch {
		throw new AppError(400, 'Send the file as multipart/form-data in a field named "file".', 'bad_upload');
	}
	const file = data.get('file');
	if (!(file instanceof File) || file.size === 0) {
		throw new AppError(400, 'Choose a GeoJSON, KML, zipped Shapefile or ISO 11783-10 task data file to import.', 'no_file', { file: ['Choose a file.'] });
	}
	if (file.size > IMPORT_LIMITS.maxUploadBytes) throw tooLarge(file.size);
	try {
		return await parseFieldFile(file.name, new Uint8Array(await file.arrayBuffer()));
	} catch (e) {
		if (e instanceof ImportError) throw new AppError(e.status, e.message, e.code, { file: [e.message] });
		throw e;
	}
}

/** The whole body, or a 413 as soon as it passes `limit` bytes (the rest is never buffered). */
async function readAtMost(request: Request, limit: number): Promise<Uint8Array<ArrayBuffer>> {
	let bytes: Uint8Array<ArrayBuffer> | null;
	try {
		// Stop reading at the limit, but do not cancel: cancelling destroys the socket before the 413 goes out.
		bytes = await readBodyUpTo(request.body, limit, 'release');
	} catch (e) {
		// The server's own body limit ends the stream early: that is the same refusal.
		if (isTooLarge(e)) throw tooLarge(null);
		throw new AppError(400, 'The upload was interrupted before it was complete; send the file again.', 'bad_upload');
	}
	if (!bytes) throw tooLarge(null);
	return bytes;
}

function isTooLarge(e: unknown): boolean {
	const status = (x: unknown) => (x as { status?: unknown } | null)?.status;
	return status(e) === 413 || status((e as { cause?: unknown } | null)?.cause) === 413;
}

/** The 413; `bytes` is the size when known (declared or counted whole), else null. */
function tooLarge(bytes: number | null) {
	const mb = (n: number) => (n / 1024 / 1024).toFixed(1);
	const limit = `uploads are limited to ${mb(IMPORT_LIMITS.maxUploadBytes)} MB`;
	const message = bytes === null ? `The file is larger than the limit: ${limit}.` : `The file is ${mb(bytes)} MB; ${limit}.`;
	return new AppError(413, message, 'too_large', { file: [message] });
}
