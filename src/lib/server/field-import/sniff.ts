// Recognises what a file really holds from its first bytes, so a file whose name says one thing
// and whose bytes say another is refused with a message naming both.
import { looksLikeZip } from './zip';

export type ContentKind = 'zip' | 'png' | 'jpeg' | 'gif' | 'pdf' | 'gzip' | 'xml' | 'json' | 'text' | 'binary';

const DESCRIPTIONS: Record<ContentKind, string> = {
	zip: 'a zip archive',
	png: 'a PNG image',
	jpeg: 'a JPEG image',
	gif: 'a GIF image',
	pdf: 'a PDF document',
	gzip: 'a gzip-compressed file',
	xml: 'an XML document',
	json: 'a JSON document',
	text: 'plain text',
	binary: 'binary data'
};

export function describeContent(kind: ContentKind): string {
	return DESCRIPTIONS[kind];
}

function startsWith(bytes: Uint8Array, signature: number[]): boolean {
	return signature.every((b, i) => bytes[i] === b);
}

export function sniffContent(bytes: Uint8Array): ContentKind {
	if (looksLikeZip(bytes)) return 'zip';
	if (startsWith(bytes, [0x89, 0x50, 0x4e, 0x47])) return 'png';
	if (startsWith(bytes, [0xff, 0xd8, 0xff])) return 'jpeg';
	if (startsWith(bytes, [0x47, 0x49, 0x46, 0x38])) return 'gif';
	if (startsWith(bytes, [0x25, 0x50, 0x44, 0x46])) return 'pdf';
	if (startsWith(bytes, [0x1f, 0x8b])) return 'gzip';
	// Control characters never appear in text formats; invalid UTF-8 alone does not mean binary,
	// since older KML files may be Latin-1.
	const text = new TextDecoder().decode(bytes.subarray(0, 4096));
	if (/[\u0000-\u0008\u000e-\u001f]/.test(text)) return 'binary';
	const first = text.trimStart()[0];
	if (first === '<') return 'xml';
	if (first === '{' || first === '[') return 'json';
	return 'text';
}
