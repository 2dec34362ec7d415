// Inter ships with the app as WOFF from @fontsource/inter (WOFF2 crashes the PDF font subsetter).
import { existsSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { inflateSync } from 'node:zlib';

// The fonts' own PostScript names: pdfkit then finds them in its cache instead of re-reading the
// font file on every switch between weights.
export const REGULAR = 'Inter-Regular';
export const BOLD = 'Inter-Bold';

const FILES = { regular: 'inter-latin-400-normal.woff', bold: 'inter-latin-700-normal.woff' } as const;

export interface SheetFonts {
	regular: Buffer;
	bold: Buffer;
}

let cached: SheetFonts | null = null;

function fontFolders(): string[] {
	const folders: string[] = [];
	try {
		// Resolved at run time, so the bundled production server still finds node_modules.
		const require = createRequire(import.meta.url);
		folders.push(join(dirname(require.resolve('@fontsource/inter/package.json')), 'files'));
	} catch {
		// fall through to the working directory
	}
	folders.push(join(process.cwd(), 'node_modules', '@fontsource', 'inter', 'files'));
	return folders;
}

/** Reads the two Inter weights once per process; throws a plain message when they are missing. */
export function loadSheetFonts(): SheetFonts {
	if (cached) return cached;
	const folders = fontFolders();
	const folder = folders.find((f) => existsSync(join(f, FILES.regular)) && existsSync(join(f, FILES.bold)));
	if (!folder) {
		throw new Error(`Seeding sheet fonts not found; looked in ${folders.join(', ')} (is @fontsource/inter installed?)`);
	}
	const regularPath = join(folder, FILES.regular);
	cached = {
		regular: woffToSfnt(readFileSync(regularPath)),
		bold: woffToSfnt(readFileSync(join(folder, FILES.bold)))
	};
	return cached;
}

/**
 * Unpacks a WOFF 1.0 file into the plain TrueType/OpenType font it wraps (W3C WOFF File Format 1.0).
 * The PDF font library re-inflates a WOFF table on every glyph it reads, which makes a long sheet
 * take seconds; the unpacked font renders the same glyphs in a fraction of the time.
 */
export function woffToSfnt(woff: Buffer): Buffer {
	if (woff.toString('latin1', 0, 4) !== 'wOFF') return woff;
	const flavor = woff.readUInt32BE(4);
	const numTables = woff.readUInt16BE(12);
	const tables = Array.from({ length: numTables }, (_, i) => {
		const entry = 44 + i * 20;
		const offset = woff.readUInt32BE(entry + 4);
		const compLength = woff.readUInt32BE(entry + 8);
		const origLength = woff.readUInt32BE(entry + 12);
		const raw = woff.subarray(offset, offset + compLength);
		return {
			tag: woff.readUInt32BE(entry),
			checksum: woff.readUInt32BE(entry + 16),
			data: compLength < origLength ? inflateSync(raw) : raw
		};
	});
	const pad4 = (n: number) => (n + 3) & ~3;
	const headerSize = 12 + numTables * 16;
	const size = tables.reduce((sum, t) => sum + pad4(t.data.length), headerSize);
	const out = Buffer.alloc(size);
	const power = 2 ** Math.floor(Math.log2(numTables));
	out.writeUInt32BE(flavor, 0);
	out.writeUInt16BE(numTables, 4);
	out.writeUInt16BE(power * 16, 6);
	out.writeUInt16BE(Math.log2(power), 8);
	out.writeUInt16BE(numTables * 16 - power * 16, 10);
	let offset = headerSize;
	tables.forEach((t, i) => {
		const record = 12 + i * 16;
		out.writeUInt32BE(t.tag, record);
		out.writeUInt32BE(t.checksum, record + 4);
		out.writeUInt32BE(offset, record + 8);
		out.writeUInt32BE(t.data.length, record + 12);
		t.data.copy(out, offset);
		offset += pad4(t.data.length);
	});
	return out;
}

interface GlyphSource {
	hasGlyphForCodePoint(codePoint: number): boolean;
}

/**
 * Which code points the current font can draw. Reads the embedded font pdfkit keeps on the
 * document; if that shape ever changes, falls back to printable Latin-1 and common punctuation.
 */
export function glyphCoverage(doc: PDFKit.PDFDocument): (codePoint: number) => boolean {
	const font = (doc as unknown as { _font?: { font?: Partial<GlyphSource> } })._font?.font;
	if (font && typeof font.hasGlyphForCodePoint === 'function') {
		const source = font as GlyphSource;
		const seen = new Map<number, boolean>();
		return (cp) => {
			let known = seen.get(cp);
			if (known === undefined) {
				known = cp === 0x20 || source.hasGlyphForCodePoint(cp);
				seen.set(cp, known);
			}
			return known;
		};
	}
	return (cp) => (cp >= 0x20 && cp < 0x7f) || (cp >= 0xa0 && cp <= 0xff) || (cp >= 0x2010 && cp <= 0x2026);
}
