// First-page header, the STOP banner and the no-planter notice.
import type { SheetCheck, SheetData } from '../../sheet/types';
import { countOf, formatAcres, formatFeet, formatPrintedAt } from './text';
import { INK, PAGE, PAPER, SheetWriter, type TextStyle } from './writer';

export const NO_PLANTER = 'No planter set up for this farm yet: passes and row units are not shown.';

export function sheetTitle(data: Pick<SheetData, 'fieldName' | 'season'>): string {
	return `Seeding sheet — ${data.fieldName} ${data.season}`;
}

export function drawTitle(w: SheetWriter, data: SheetData): void {
	const title: TextStyle = { size: 20, bold: true };
	w.y += w.write(sheetTitle(data), PAGE.left, w.y, PAGE.contentWidth, title) + 6;
}

/** Farm, field, season, plan, acres, printed date and preparer as label/value rows in a column. */
export function drawFacts(
	w: SheetWriter,
	data: SheetData,
	column: { left: number; top: number; width: number },
	timeZone?: string
): number {
	// Short facts share a line, so the block stays beside the lane map.
	const facts: [string, string][][] = [
		[['Farm', data.farmName]],
		[['Field', data.fieldName], ['Season', String(data.season)]],
		[['Plan', data.planName]],
		[['Field acres', formatAcres(data.fieldAcres)], ['Planted acres', formatAcres(data.plantedAcres)]],
		[['Lanes', String(data.lanes.length)], ['Headland', formatFeet(data.headlandFt)]],
		[['Printed', formatPrintedAt(data.printedAt, timeZone)]],
		[['Prepared by', data.preparedBy]]
	];
	const value: TextStyle = { size: 9 };
	let y = column.top + 2;
	for (const row of facts) {
		y += w.write(row.map(([k, v]) => `${k}: ${v}`).join(' · '), column.left, y, column.width, value) + 1;
	}
	return y;
}

/**
 * Black band with the number of stop-level problems, then each one, said once per kind;
 * nothing when there are none.
 */
export function drawStopBanner(w: SheetWriter, groups: NonNullable<SheetData['checkGroups']>): void {
	const stops = groups.filter((c) => c.severity === 'stop');
	if (stops.length === 0) return;
	const band: TextStyle = { size: 16, bold: true, color: PAPER };
	const item: TextStyle = { size: 12, bold: true };
	const headline = `STOP: ${countOf(stops.length, 'problem')} to fix before planting`;
	const lines = stops.map((c) => c.summary);
	const bandHeight = w.measure(headline, PAGE.contentWidth - 16, band) + 10;
	const listHeight = lines.reduce((sum, t) => sum + w.measure(`• ${t}`, PAGE.contentWidth - 24, item) + 3, 0) + 8;
	w.ensure(bandHeight + Math.min(listHeight, 200));
	const top = w.y;
	const page = w.page;
	w.doc.rect(PAGE.left, top, PAGE.contentWidth, bandHeight).fill(INK);
	w.write(headline, PAGE.left + 8, top + 5, PAGE.contentWidth - 16, band);
	w.y = top + bandHeight + 5;
	for (const line of lines) w.paragraph(`• ${line}`, item, 12);
	const bottom = w.y + 2;
	if (w.page === page) {
		w.doc.lineWidth(3).strokeColor(INK).rect(PAGE.left, top, PAGE.contentWidth, bottom - top).stroke();
	}
	w.y = bottom + 8;
}

export function drawNotice(w: SheetWriter, text: string): void {
	const style: TextStyle = { size: 13, bold: true };
	const height = w.measure(text, PAGE.contentWidth - 20, style) + 14;
	w.ensure(height);
	w.doc.lineWidth(2).strokeColor(INK).rect(PAGE.left, w.y, PAGE.contentWidth, height).stroke();
	w.write(text, PAGE.left + 10, w.y + 7, PAGE.contentWidth - 20, style);
	w.y += height + 8;
}

/** "Unit 9 on lane 5 has fertilizer for the wrong crop (lane 5, unit 9)" style line. */
export function checkText(check: SheetCheck): string {
	const where = [
		check.laneIndex !== null ? `lane ${check.laneIndex + 1}` : '',
		check.unit !== null ? `unit ${check.unit}` : ''
	].filter(Boolean);
	return where.length ? `${check.message} (${where.join(', ')})` : check.message;
}
