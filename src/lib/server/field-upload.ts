// Reads one uploaded boundary file from a multipart request, enforcing the size limit before
// the body is buffered where the client told us its length.
import { AppError } from './errors';
import { IMPORT_LIMITS, ImportError, parseFieldFile, type ImportResult } from './field-import';

export async function readUploadedShapes(request: Request): Promise<ImportResult> {
	const declared = Number(request.headers.get('content-length') ?? 0);
	if (declared > IMPORT_LIMITS.maxUploadBytes + 64 * 1024) throw tooLarge(declared);
	let data: FormData;
	try {
		data = await request.formData();
	} catch {
		throw new AppError(400, 'Send the file as multipart/form-data in a field named "file".', 'bad_upload');
	}
	const file = data.get('file');
	if (!(file instanceof File) || file.size === 0) {
		throw new AppError(400, 'Choose a GeoJSON, KML or zipped Shapefile to import.', 'no_file', { file: ['Choose a file.'] });
	}
	if (file.size > IMPORT_LIMITS.maxUploadBytes) throw tooLarge(file.size);
	try {
		return await parseFieldFile(file.name, new Uint8Array(await file.arrayBuffer()));
	} catch (e) {
		if (e instanceof ImportError) throw new AppError(e.status, e.message, e.code, { file: [e.message] });
		throw e;
	}
}

function tooLarge(bytes: number) {
	const mb = (n: number) => (n / 1024 / 1024).toFixed(1);
	const message = `The file is ${mb(bytes)} MB; uploads are limited to ${mb(IMPORT_LIMITS.maxUploadBytes)} MB.`;
	return new AppError(413, message, 'too_large', { file: [message] });
}
