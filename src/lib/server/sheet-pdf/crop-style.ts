// How each crop looks on the printed lane map: a fill, a black pattern and a letter code, so the
// crops stay apart on a black-and-white printout too.
import type { SheetLane } from '../../sheet/types';
import { INK } from './writer';

export type PatternKind = 'solid' | 'rising' | 'dots' | 'falling' | 'grid' | 'across' | 'upright';

export interface CropStyle {
	crop: string;
	code: string;
	fill: string;
	pattern: PatternKind;
}

/** Our own palette: fills of clearly different lightness, each paired with its own pattern. */
const PALETTE: { fill: string; pattern: PatternKind }[] = [
	{ fill: '#F4CF4A', pattern: 'solid' },
	{ fill: '#5DBB7A', pattern: 'rising' },
	{ fill: '#F08A3C', pattern: 'dots' },
	{ fill: '#B79AE0', pattern: 'falling' },
	{ fill: '#6FC3E8', pattern: 'grid' },
	{ fill: '#FFFFFF', pattern: 'across' },
	{ fill: '#C9A27A', pattern: 'upright' }
];

const cropKey = (crop: string) => crop.trim().toLowerCase();

function codeFor(crop: string, taken: Set<string>): string {
	const words = crop
		.trim()
		.split(/[^\p{L}\p{N}]+/u)
		.filter(Boolean);
	const first = (words[0] ?? '?')[0].toUpperCase();
	const candidates = [
		first,
		words.length > 1 ? first + words[1][0].toUpperCase() : '',
		(words[0] ?? '').slice(0, 2).replace(/^./, (c) => c.toUpperCase())
	];
	for (const candidate of candidates) if (candidate && !taken.has(candidate)) return candidate;
	for (let n = 2; ; n++) if (!taken.has(`${first}${n}`)) return `${first}${n}`;
}

/** One style per crop, in the order crops first appear across the field (left to right). */
export function cropStyles(lanes: SheetLane[]): Map<string, CropStyle> {
	const styles = new Map<string, CropStyle>();
	const taken = new Set<string>();
	for (const lane of [...lanes].sort((a, b) => a.index - b.index)) {
		const key = cropKey(lane.crop);
		if (styles.has(key)) continue;
		const code = codeFor(lane.crop, taken);
		taken.add(code);
		styles.set(key, { crop: lane.crop.trim() || '?', code, ...PALETTE[styles.size % PALETTE.length] });
	}
	return styles;
}

export function styleOf(styles: Map<string, CropStyle>, crop: string): CropStyle {
	return styles.get(cropKey(crop)) ?? { crop, code: '?', fill: '#FFFFFF', pattern: 'solid' };
}

export interface Box {
	x: number;
	y: number;
	width: number;
	height: number;
}

/** Strokes the style's pattern over box; call inside a clip. */
export function paintPattern(doc: PDFKit.PDFDocument, pattern: PatternKind, box: Box, step = 5): void {
	const { x, y, width, height } = box;
	doc.save().lineWidth(0.6).strokeColor(INK).fillColor(INK);
	switch (pattern) {
		case 'rising':
		case 'falling':
		case 'grid':
			for (let t = -height; t <= width; t += step) {
				if (pattern !== 'falling') doc.moveTo(x + t, y + height).lineTo(x + t + height, y);
				if (pattern !== 'rising') doc.moveTo(x + t, y).lineTo(x + t + height, y + height);
			}
			doc.stroke();
			break;
		case 'across':
			for (let py = y + step / 2; py < y + height; py += step) doc.moveTo(x, py).lineTo(x + width, py);
			doc.stroke();
			break;
		case 'upright':
			for (let px = x + step / 2; px < x + width; px += step) doc.moveTo(px, y).lineTo(px, y + height);
			doc.stroke();
			break;
		case 'dots':
			for (let px = x + step / 2; px < x + width; px += step)
				for (let py = y + step / 2; py < y + height; py += step) doc.circle(px, py, 0.9);
			doc.fill();
			break;
		case 'solid':
			break;
	}
	doc.restore();
}

/** Small square showing a crop's fill and pattern, outlined in black. */
export function drawSwatch(doc: PDFKit.PDFDocument, style: CropStyle, x: number, y: number, size: number): void {
	doc.save();
	doc.rect(x, y, size, size).fill(style.fill);
	doc.rect(x, y, size, size).clip();
	paintPattern(doc, style.pattern, { x, y, width: size, height: size }, 3.5);
	doc.restore();
	doc.lineWidth(0.8).strokeColor(INK).rect(x, y, size, size).stroke();
}
