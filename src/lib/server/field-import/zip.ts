// A small ZIP reader for uploads. It reads the central directory itself so that the entry count
// and the declared sizes are checked before anything is inflated, and it inflates with a hard
// output cap, so an archive that lies about its sizes still cannot expand past the limit.
import { crc32, inflateRawSync } from 'node:zlib';
import { ImportError } from './errors';
import { IMPORT_LIMITS, megabytes } from './limits';

export interface ZipEntry {
	name: string;
	method: number;
	encrypted: boolean;
	crc: number;
	compressedSize: number;
	declaredSize: number;
	localHeaderOffset: number;
}

export interface ZipArchive {
	entries: ZipEntry[];
	/** Inflates one entry; every call counts against the archive's shared byte budget. */
	read(entry: ZipEntry): Uint8Array;
}

const EOCD_SIGNATURE = 0x06054b50;
const CENTRAL_SIGNATURE = 0x02014b50;
const LOCAL_SIGNATURE = 0x04034b50;
const ZIP64_MARK = 0xffffffff;

export function looksLikeZip(bytes: Uint8Array): boolean {
	return bytes.length >= 4 && bytes[0] === 0x50 && bytes[1] === 0x4b && (bytes[2] === 3 || bytes[2] === 5) && (bytes[3] === 4 || bytes[3] === 6);
}

function damaged(what: string, detail: string): ImportError {
	return new ImportError('unreadable', `The ${what} could not be read as a zip archive: ${detail}.`);
}

function findEndOfCentralDirectory(view: DataView, what: string): number {
	const earliest = Math.max(0, view.byteLength - 22 - 0xffff);
	for (let at = view.byteLength - 22; at >= earliest; at--) {
		if (view.getUint32(at, true) === EOCD_SIGNATURE) return at;
	}
	throw damaged(what, 'its table of contents is missing (the file may be cut short)');
}

/**
 * Opens a ZIP archive and checks its entry count and declared uncompressed size.
 * @param what how messages name the archive, e.g. ".zip file" or ".kmz file"
 * @throws ImportError 413 zip_too_many_files / zip_too_large, 400 unreadable
 */
export function openZip(bytes: Uint8Array, what: string, limits = IMPORT_LIMITS): ZipArchive {
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	if (bytes.length < 22) throw damaged(what, 'it is too short');
	const eocd = findEndOfCentralDirectory(view, what);
	const declaredCount = view.getUint16(eocd + 10, true);
	const directoryOffset = view.getUint32(eocd + 16, true);
	const tooMany = () =>
		new ImportError(
			'zip_too_many_files',
			`The ${what} holds more than ${limits.maxZipEntries} files. Put only the boundary files (.shp, .shx, .dbf, .prj) in the archive.`,
			413
		);
	if (declaredCount > limits.maxZipEntries) throw tooMany();

	const entries: ZipEntry[] = [];
	let declaredTotal = 0;
	let at = directoryOffset;
	// Walk the records actually present rather than trusting the count in the trailer.
	while (at + 46 <= eocd && view.getUint32(at, true) === CENTRAL_SIGNATURE) {
		if (entries.length >= limits.maxZipEntries) throw tooMany();
		const flags = view.getUint16(at + 8, true);
		const nameLength = view.getUint16(at + 28, true);
		const extraLength = view.getUint16(at + 30, true);
		const commentLength = view.getUint16(at + 32, true);
		const nameBytes = bytes.subarray(at + 46, at + 46 + nameLength);
		const entry: ZipEntry = {
			name: new TextDecoder(flags & 0x800 ? 'utf-8' : 'latin1').decode(nameBytes),
			method: view.getUint16(at + 10, true),
			encrypted: (flags & 1) === 1,
			crc: view.getUint32(at + 16, true),
			compressedSize: view.getUint32(at + 20, true),
			declaredSize: view.getUint32(at + 24, true),
			localHeaderOffset: view.getUint32(at + 42, true)
		};
		// ZIP64 only exists for entries over 4 GB, far beyond anything we accept.
		if (entry.declaredSize === ZIP64_MARK || entry.compressedSize === ZIP64_MARK) {
			throw new ImportError('zip_too_large', `The ${what} declares a file over 4 GB; the limit for all files together is ${megabytes(limits.maxUnzippedBytes)}.`, 413);
		}
		declaredTotal += entry.declaredSize;
		if (declaredTotal > limits.maxUnzippedBytes) {
			throw new ImportError('zip_too_large', `The ${what} would expand to more than ${megabytes(limits.maxUnzippedBytes)} when unpacked. Upload only the boundary files.`, 413);
		}
		entries.push(entry);
		at += 46 + nameLength + extraLength + commentLength;
	}
	if (entries.length === 0 && declaredCount > 0) throw damaged(what, 'its table of contents is damaged');

	let inflatedSoFar = 0;
	const read = (entry: ZipEntry): Uint8Array => {
		if (entry.encrypted) throw new ImportError('unreadable', `The ${what} is password-protected (${entry.name}). Upload an archive without a password.`);
		const local = entry.localHeaderOffset;
		if (local + 30 > bytes.length || view.getUint32(local, true) !== LOCAL_SIGNATURE) throw damaged(what, `the entry ${entry.name} is damaged`);
		const start = local + 30 + view.getUint16(local + 26, true) + view.getUint16(local + 28, true);
		const end = start + entry.compressedSize;
		if (end > bytes.length) throw damaged(what, `the entry ${entry.name} is cut short`);
		const stored = bytes.subarray(start, end);
		const budget = limits.maxUnzippedBytes - inflatedSoFar;
		const tooLarge = () =>
			new ImportError('zip_too_large', `The ${what} expands to more than ${megabytes(limits.maxUnzippedBytes)} when unpacked (it says less than it holds).`, 413);
		let out: Uint8Array;
		if (entry.method === 0) {
			if (stored.length > budget) throw tooLarge();
			out = stored;
		} else if (entry.method === 8) {
			try {
				out = inflateRawSync(stored, { maxOutputLength: Math.max(1, budget) });
			} catch (e) {
				if ((e as { code?: string }).code === 'ERR_BUFFER_TOO_LARGE') throw tooLarge();
				throw damaged(what, `the entry ${entry.name} is damaged`);
			}
		} else {
			throw new ImportError('unreadable', `The ${what} uses a compression method this site cannot unpack (method ${entry.method} in ${entry.name}). Re-create it with ordinary "deflate" zip compression.`);
		}
		inflatedSoFar += out.length;
		if (inflatedSoFar > limits.maxUnzippedBytes) throw tooLarge();
		if ((crc32(out) >>> 0) !== entry.crc) throw damaged(what, `the entry ${entry.name} is damaged (checksum mismatch)`);
		return out;
	};
	return { entries, read };
}

/** Entry name without folders, in lower case, for matching by extension. */
export function baseName(entry: ZipEntry): string {
	return entry.name.split('/').pop()!.toLowerCase();
}

/** Folders created by archiving tools (e.g. resource forks) that never hold boundary data. */
export function isArchiveClutter(entry: ZipEntry): boolean {
	return entry.name.startsWith('__MACOSX/') || entry.name.endsWith('/') || baseName(entry).startsWith('._');
}
