// Page flow for the sheet: one cursor, page breaks decided before anything is drawn.
import { BOLD, REGULAR } from './fonts';
import { sanitizeText } from './text';

/**
 * US Letter in points: half-inch side margins, 0.4 in at the top, the footer 0.35 in from the
 * bottom edge (inside what office and farm-shop printers can print).
 */
export const PAGE = {
	width: 612,
	height: 792,
	left: 36,
	right: 576,
	top: 29,
	bottom: 738,
	footerY: 754,
	contentWidth: 540
} as const;

export const INK = '#000000';
export const PAPER = '#FFFFFF';
/** Background tint for alternate table rows; never used for text. */
export const ROW_TINT = '#EBEBEB';

export interface TextStyle {
	size: number;
	bold?: boolean;
	color?: string;
	align?: 'left' | 'right' | 'center';
	lineGap?: number;
}

export const BODY: TextStyle = { size: 11 };

export class SheetWriter {
	y: number = PAGE.top;
	/** 1-based number of the page being drawn. */
	page = 1;
	private pageStarters: (() => void)[] = [];

	constructor(
		readonly doc: PDFKit.PDFDocument,
		private readonly hasGlyph: (codePoint: number) => boolean
	) {}

	clean(text: unknown): string {
		return sanitizeText(text, this.hasGlyph);
	}

	private use(style: TextStyle): void {
		this.doc.font(style.bold ? BOLD : REGULAR).fontSize(style.size);
	}

	/** Height the text takes when wrapped to width. */
	measure(text: string, width: number, style: TextStyle): number {
		this.use(style);
		return this.doc.heightOfString(this.clean(text) || ' ', { width, lineGap: style.lineGap ?? 1 });
	}

	textWidth(text: string, style: TextStyle): number {
		this.use(style);
		return this.doc.widthOfString(this.clean(text));
	}

	/** Draws wrapped text with its top at y; returns the height used. Does not move the cursor. */
	write(text: string, x: number, y: number, width: number, style: TextStyle): number {
		const clean = this.clean(text);
		const height = this.measure(clean, width, style);
		this.use(style);
		this.doc.fillColor(style.color ?? INK).text(clean, x, y, {
			width,
			align: style.align ?? 'left',
			lineGap: style.lineGap ?? 1
		});
		return height;
	}

	/** One line, never wrapped and never paged (footers, map labels). */
	writeLine(text: string, x: number, y: number, style: TextStyle, width?: number): void {
		this.use(style);
		this.doc.fillColor(style.color ?? INK).text(this.clean(text), x, y, {
			lineBreak: false,
			width,
			align: style.align ?? 'left'
		});
	}

	/** The text cut with "…" so that it fits in width on one line. */
	fit(text: string, width: number, style: TextStyle): string {
		const clean = this.clean(text);
		if (this.textWidth(clean, style) <= width) return clean;
		const chars = [...clean];
		while (chars.length > 0 && this.textWidth(`${chars.join('')}…`, style) > width) chars.pop();
		return `${chars.join('').trimEnd()}…`;
	}

	/** Starts a new page when fewer than `height` points remain; returns true if it did. */
	ensure(height: number): boolean {
		if (this.y + height <= PAGE.bottom || this.y <= PAGE.top) return false;
		this.newPage();
		return true;
	}

	newPage(): void {
		this.doc.addPage();
		this.page += 1;
		this.y = PAGE.top;
		for (const start of this.pageStarters) start();
	}

	/** Runs `body` with `starter` drawn at the top of every page it breaks onto (repeated table headers). */
	withPageStarter(starter: () => void, body: () => void): void {
		this.pageStarters.push(starter);
		try {
			body();
		} finally {
			this.pageStarters.pop();
		}
	}

	/** Small "… (continued)" title at the top of a page a section runs onto. */
	continuedTitle(title: string): void {
		const style: TextStyle = { size: 12, bold: true };
		this.y += this.write(`${title} (continued)`, PAGE.left, this.y, PAGE.contentWidth, style) + 4;
	}

	gap(points: number): void {
		this.y = Math.min(this.y + points, PAGE.bottom);
	}

	/** Section heading kept on the same page as the next `keepWith` points of content. */
	heading(text: string, keepWith = 40): void {
		const style: TextStyle = { size: 12, bold: true };
		const height = this.measure(text, PAGE.contentWidth, style);
		this.ensure(4 + height + 4 + keepWith);
		if (this.y > PAGE.top) this.gap(4);
		this.write(text, PAGE.left, this.y, PAGE.contentWidth, style);
		this.y += height;
		this.doc.lineWidth(1.5).strokeColor(INK).moveTo(PAGE.left, this.y).lineTo(PAGE.right, this.y).stroke();
		this.y += 3;
	}

	/** Wrapped paragraph at the cursor, moved whole to the next page if it does not fit. */
	paragraph(text: string, style: TextStyle = BODY, indent = 0): void {
		const width = PAGE.contentWidth - indent;
		const height = this.measure(text, width, style);
		this.ensure(height);
		this.write(text, PAGE.left + indent, this.y, width, style);
		this.y += height + 3;
	}

	/** Empty square to tick by hand. */
	checkbox(x: number, y: number, size: number): void {
		this.doc.lineWidth(1.5).rect(x, y, size, size).fillAndStroke(PAPER, INK);
		this.doc.fillColor(INK);
	}
}
