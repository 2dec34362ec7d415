// The cab seeding sheet as a printable PDF (US Letter, portrait, large type, black on white).
import PDFDocument from 'pdfkit';
import type { SheetData } from '../sheet/types';
import { checkGroupsOf } from '../sheet/condensed';
import { cropStyles, type CropStyle } from './sheet-pdf/crop-style';
import { BOLD, REGULAR, glyphCoverage, loadSheetFonts } from './sheet-pdf/fonts';
import { NO_PLANTER, drawFacts, drawNotice, drawStopBanner, drawTitle, sheetTitle } from './sheet-pdf/header';
import { drawLaneMap } from './sheet-pdf/lane-map';
import {
	drawAppendix,
	drawCautions,
	drawChecks,
	drawHazardsAndQuantities,
	drawLanesTable,
	drawPasses,
	drawRowUnits,
	drawSignOff
} from './sheet-pdf/sections';
import { PAGE, SheetWriter } from './sheet-pdf/writer';

export { NO_PLANTER } from './sheet-pdf/header';

export interface SheetPdfOptions {
	/** IANA zone for the printed date, e.g. "America/Chicago"; the server's zone when left out. */
	timeZone?: string;
	/** Add the full lists (every finding, lane and pass) after the two-sided sheet. */
	appendix?: boolean;
}

/**
 * Renders the seeding sheet: one sheet of paper, front and back, for fields up to 100 lanes.
 * Content order: header, STOP banner, lane map, lanes, row units, passes, checks, hazards,
 * quantities, sign-off line, cautions, then the appendix of full lists when asked; every page
 * carries the field, season and "Page N of M" in its footer.
 *
 * @example
 * const pdf = await renderSheetPdf(sheet);
 * return new Response(pdf, { headers: { 'content-type': 'application/pdf' } });
 */
export async function renderSheetPdf(sheet: SheetData, options: SheetPdfOptions = {}): Promise<Buffer> {
	const fonts = loadSheetFonts();
	const doc = new PDFDocument({
		size: 'LETTER',
		layout: 'portrait',
		// Our own layout keeps content above PAGE.bottom; a zero bottom margin stops pdfkit from
		// adding pages on its own when the footer is written.
		margins: { top: PAGE.top, left: PAGE.left, right: PAGE.width - PAGE.right, bottom: 0 },
		bufferPages: true,
		// pdfkit opens any font source here (its typing says path only); a buffer keeps pdfkit from
		// loading its built-in Helvetica metrics, which a bundled server may not carry.
		font: fonts.regular as unknown as string,
		info: {
			Title: sheetTitle(sheet),
			Author: 'Stripwright',
			Creator: 'Stripwright',
			Producer: 'Stripwright',
			CreationDate: sheet.printedAt,
			ModDate: sheet.printedAt
		}
	});
	doc.registerFont(REGULAR, fonts.regular);
	doc.registerFont(BOLD, fonts.bold);
	doc.font(REGULAR);

	const chunks: Buffer[] = [];
	const done = new Promise<Buffer>((resolve, reject) => {
		doc.on('data', (chunk: Buffer) => chunks.push(chunk));
		doc.on('end', () => resolve(Buffer.concat(chunks)));
		doc.on('error', reject);
	});

	try {
		const w = new SheetWriter(doc, glyphCoverage(doc));
		const styles = cropStyles(sheet.lanes);

		drawTitle(w, sheet);
		drawStopBanner(w, checkGroupsOf(sheet));
		if (!sheet.equipment) drawNotice(w, NO_PLANTER);
		drawTopBlock(w, sheet, styles, options.timeZone);
		drawLanesTable(w, sheet, styles);
		if (sheet.equipment) {
			drawRowUnits(w, sheet.equipment);
			drawPasses(w, sheet);
		}
		drawChecks(w, sheet, { appendix: options.appendix });
		drawHazardsAndQuantities(w, sheet);
		drawSignOff(w);
		drawCautions(w, sheet);
		if (options.appendix) drawAppendix(w, sheet, styles);
		drawFooters(w, sheet);
	} catch (error) {
		doc.end();
		await done.catch(() => undefined);
		throw error;
	}
	doc.end();
	return done;
}

/** Facts on the left, lane map with its legend on the right. */
function drawTopBlock(w: SheetWriter, sheet: SheetData, styles: Map<string, CropStyle>, timeZone?: string): void {
	const factsWidth = 200;
	const gap = 14;
	const mapHeight = 60;
	w.ensure(mapHeight + 40);
	const top = w.y;
	const factsBottom = drawFacts(w, sheet, { left: PAGE.left, top, width: factsWidth }, timeZone);
	const mapLeft = PAGE.left + factsWidth + gap;
	const mapBottom = drawLaneMap(w, sheet, styles, { x: mapLeft, y: top, width: PAGE.right - mapLeft, height: mapHeight });
	w.y = Math.max(factsBottom, mapBottom) + 4;
}

function drawFooters(w: SheetWriter, sheet: SheetData): void {
	const { start, count } = w.doc.bufferedPageRange();
	const style = { size: 11 };
	const where = `${sheet.fieldName} · ${sheet.season} · ${sheet.planName}`;
	for (let i = start; i < start + count; i++) {
		w.doc.switchToPage(i);
		w.doc.lineWidth(0.8).strokeColor('#000000').moveTo(PAGE.left, PAGE.footerY - 4).lineTo(PAGE.right, PAGE.footerY - 4).stroke();
		w.writeLine(w.fit(where, PAGE.contentWidth - 120, style), PAGE.left, PAGE.footerY, style);
		w.writeLine(`Page ${i - start + 1} of ${count}`, PAGE.right - 110, PAGE.footerY, { ...style, bold: true, align: 'right' }, 110);
	}
}
