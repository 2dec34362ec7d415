// Landlord summary as a PDF: facts, the lane map, acres by crop, the season's records with products
// and rates as logged, and harvest results.
import type { SheetData, SheetLane } from '../sheet/types';
import { cropStyles } from './sheet-pdf/crop-style';
import { drawLaneMap } from './sheet-pdf/lane-map';
import { drawTable } from './sheet-pdf/table';
import { PAGE } from './sheet-pdf/writer';
import { drawParagraph, drawReportTitle, renderReportPdf } from './report-pdf';
import type { LandlordSummary } from './landlord';
import { dayInZone } from '../reports/acreage';
import { laneRanges } from '../reports/lanes';
import { RECORD_TYPE_LABELS, type RecordType } from '../schemas/records';

const ac = (n: number) => `${n.toFixed(2)} ac`;
const num = (n: number) => new Intl.NumberFormat('en-US', { maximumFractionDigits: 2 }).format(n);

export async function renderLandlordPdf(s: LandlordSummary, farmName: string, timeZone: string, printedAt = new Date()): Promise<Buffer> {
	const title = `${s.field.name} · ${s.season} season summary`;
	return renderReportPdf(title, `${farmName} · ${s.field.name} · ${s.season}`, printedAt, (w) => {
		const ids = [s.field.farmNumber && `farm ${s.field.farmNumber}`, s.field.tractNumber && `tract ${s.field.tractNumber}`, s.field.fieldNumber && `field ${s.field.fieldNumber}`].filter(Boolean).join(', ');
		drawReportTitle(
			w,
			title,
			`${farmName} · ${s.field.landlord ? `for ${s.field.landlord} · ` : ''}${ac(s.field.acres)} field${ids ? ` · ${ids}` : ''} · printed ${dayInZone(printedAt, timeZone)}`
		);
		if (s.plan) {
			const lanes = s.plan.lanes.map((l) => ({ ...l, rowSpacingIn: null, variety: null, populationPerAcre: null, trialLabel: null })) as SheetLane[];
			const data = { guidance: s.plan.guidance, boundary: s.field.boundary, exclusions: s.field.exclusions, lanes } as unknown as SheetData;
			w.ensure(300);
			w.y = drawLaneMap(w, data, cropStyles(lanes), { x: PAGE.left, y: w.y, width: PAGE.contentWidth, height: 230 }) + 8;
			drawTable(
				w,
				[{ header: 'Crop', width: 200 }, { header: 'Lanes', width: 80, align: 'right' }, { header: 'Planted', width: 120, align: 'right' }, { header: 'Credited', width: 120, align: 'right' }],
				s.byCrop.map((c) => [c.crop, String(c.lanes), ac(c.acres), ac(c.creditedAcres)]),
				{ title: 'Acres by crop', size: 10 }
			);
		} else {
			drawParagraph(w, `No plan was adopted for ${s.season}, so there are no lanes to show.`, 11);
		}
		w.gap(8);
		if (s.operations.length) {
			drawTable(
				w,
				[{ header: 'Dates', width: 90 }, { header: 'Work', width: 70 }, { header: 'Lanes', width: 70 }, { header: 'Acres', width: 60, align: 'right' }, { header: 'Products, rates and totals', width: 250 }],
				s.operations.map((o) => [
					o.startedOn === o.endedOn ? o.startedOn : `${o.startedOn} to ${o.endedOn}`,
					RECORD_TYPE_LABELS[o.type as RecordType] ?? o.type,
					laneRanges(o.lanes),
					ac(o.acres),
					o.products.length ? o.products.map((p) => `${p.name}${p.epaRegNo ? ` (EPA ${p.epaRegNo})` : ''}: ${num(p.rate)} ${p.rateUnit}, ${num(p.total)} ${p.totalUnit}`).join('; ') : '-'
				]),
				{ title: 'Season records', size: 9 }
			);
		} else {
			w.heading('Season records', 20);
			drawParagraph(w, `No records were logged on this field for ${s.season}.`, 10);
		}
		w.gap(8);
		if (s.harvest && s.harvest.length) {
			drawTable(
				w,
				[{ header: 'Crop', width: 120 }, { header: 'Weighed', width: 70, align: 'right' }, { header: 'Harvested', width: 100, align: 'right' }, { header: 'Bushels', width: 100, align: 'right' }, { header: 'Yield', width: 120, align: 'right' }],
				s.harvest.map((h) => [h.crop, `${h.entries} ${h.entries === 1 ? 'load' : 'loads'}`, ac(h.harvestedAcres), `${num(h.bushels)} bu`, `${num(h.bushelsPerAcre)} bu/ac at ${num(h.standardMoisturePct)} %`]),
				{ title: 'Harvest', size: 10 }
			);
		} else {
			w.heading('Harvest', 20);
			drawParagraph(w, `No harvest results were recorded for ${s.season}.`, 10);
		}
		w.gap(8);
		drawParagraph(w, 'This is a record of what was done, not a recommendation. Product rates are as logged; the label is the law.', 9);
	});
}
