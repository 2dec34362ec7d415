// Printable reports (acreage, landlord summary): US Letter, the same embedded Inter fonts and page
// writer as the seeding sheet, black on white, a footer with the report name and page numbers.
import PDFDocument from 'pdfkit';
import { BOLD, REGULAR, glyphCoverage, loadSheetFonts } from './sheet-pdf/fonts';
import { PAGE, SheetWriter } from './sheet-pdf/writer';

export interface ReportPdf {
	w: SheetWriter;
	/** Writes the footers and returns the finished file. */
	finish(): Promise<Buffer>;
	/** Ends the document after a failure, so its stream does not dangle. */
	abandon(): Promise<void>;
}

export function openReportPdf(title: string, footer: string, printedAt: Date): ReportPdf {
	const fonts = loadSheetFonts();
	const doc = new PDFDocument({
		size: 'LETTER',
		layout: 'portrait',
		margins: { top: PAGE.top, left: PAGE.left, right: PAGE.width - PAGE.right, bottom: 0 },
		bufferPages: true,
		font: fonts.regular as unknown as string,
		info: { Title: title, Author: 'Stripwright', Creator: 'Stripwright', Producer: 'Stripwright', CreationDate: printedAt, ModDate: printedAt }
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
	const w = new SheetWriter(doc, glyphCoverage(doc));
	return {
		w,
		finish() {
			const { start, count } = doc.bufferedPageRange();
			const style = { size: 10 };
			for (let i = start; i < start + count; i++) {
				doc.switchToPage(i);
				doc.lineWidth(0.8).strokeColor('#000000').moveTo(PAGE.left, PAGE.footerY - 4).lineTo(PAGE.right, PAGE.footerY - 4).stroke();
				w.writeLine(w.fit(footer, PAGE.contentWidth - 120, style), PAGE.left, PAGE.footerY, style);
				w.writeLine(`Page ${i - start + 1} of ${count}`, PAGE.right - 110, PAGE.footerY, { ...style, bold: true, align: 'right' }, 110);
			}
			doc.end();
			return done;
		},
		async abandon() {
			doc.end();
			await done.catch(() => undefined);
		}
	};
}

/** Runs `draw` on a fresh report and returns the PDF; a failure ends the document cleanly. */
export async function renderReportPdf(title: string, footer: string, printedAt: Date, draw: (w: SheetWriter) => void): Promise<Buffer> {
	const pdf = openReportPdf(title, footer, printedAt);
	try {
		draw(pdf.w);
	} catch (e) {
		await pdf.abandon();
		throw e;
	}
	return pdf.finish();
}

/** Title block: the report name large, then a line of facts. */
export function drawReportTitle(w: SheetWriter, title: string, facts: string): void {
	w.y += w.write(title, PAGE.left, w.y, PAGE.contentWidth, { size: 20, bold: true }) + 2;
	w.y += w.write(facts, PAGE.left, w.y, PAGE.contentWidth, { size: 11 }) + 8;
}

/** A wrapped paragraph at the cursor. */
export function drawParagraph(w: SheetWriter, text: string, size = 10): void {
	const height = w.measure(text, PAGE.contentWidth, { size });
	w.ensure(height + 4);
	w.y += w.write(text, PAGE.left, w.y, PAGE.contentWidth, { size }) + 4;
}
