// The crop acreage report as a PDF: rows by field and crop, totals by crop and by landlord, warnings.
import { dayInZone, type AcreageReport, type AcreTotals } from '../reports/acreage';
import { drawTable } from './sheet-pdf/table';
import { drawParagraph, drawReportTitle, renderReportPdf } from './report-pdf';

const ac = (n: number) => `${n.toFixed(2)} ac`;

export async function renderAcreagePdf(report: AcreageReport, farmName: string, timeZone: string, printedAt = new Date()): Promise<Buffer> {
	const title = `Crop acreage ${report.season}`;
	return renderReportPdf(`${title} - ${farmName}`, `${farmName} · ${title}`, printedAt, (w) => {
		drawReportTitle(w, title, `${farmName} · printed ${dayInZone(printedAt, timeZone)} · acres on the WGS84 ellipsoid from the adopted plans' lanes`);
		if (report.warnings.length) {
			w.heading('Warnings', 20);
			for (const warning of report.warnings) drawParagraph(w, `! ${warning}`, 10);
		}
		drawTable(
			w,
			[
				{ header: 'Farm/tract/field', width: 90 },
				{ header: 'Field', width: 80 },
				{ header: 'Crop', width: 62 },
				{ header: 'Use', width: 52 },
				{ header: 'Practice', width: 58 },
				{ header: 'Planted on', width: 64 },
				{ header: 'Planted', width: 62, align: 'right' },
				{ header: 'Credited', width: 62, align: 'right' }
			],
			report.rows.map((r) => [
				[r.farmNumber, r.tractNumber, r.fieldNumber].map((v) => v ?? '-').join(' / '),
				r.fieldName,
				r.crop,
				r.intendedUse,
				r.practice + (r.rowSpacingIn !== null && r.rowSpacingIn > 40 ? ` (${r.rowSpacingIn} in)` : ''),
				r.plantingDate ?? 'no record',
				ac(r.plantedAcres),
				ac(r.creditedAcres)
			]),
			{ title: 'Acres by field and crop', size: 9 }
		);
		w.gap(8);
		const totalsRows = (t: Record<string, AcreTotals>) =>
			Object.entries(t)
				.sort(([a], [b]) => a.localeCompare(b))
				.map(([crop, v]) => [crop, ac(v.plantedAcres), ac(v.creditedAcres)]);
		drawTable(w, [{ header: 'Crop', width: 200 }, { header: 'Planted', width: 100, align: 'right' }, { header: 'Credited', width: 100, align: 'right' }], totalsRows(report.totals), {
			title: 'Totals by crop',
			size: 10
		});
		for (const [landlord, totals] of Object.entries(report.byLandlord).sort(([a], [b]) => a.localeCompare(b))) {
			w.gap(6);
			drawTable(w, [{ header: 'Crop', width: 200 }, { header: 'Planted', width: 100, align: 'right' }, { header: 'Credited', width: 100, align: 'right' }], totalsRows(totals), {
				title: `Landlord: ${landlord}`,
				size: 10
			});
		}
		w.gap(8);
		drawParagraph(
			w,
			'Credited acres: where rows stand more than 40 in apart, each row is credited at most 40 in (7 CFR 718.108); this worksheet leaves out the allowance beyond the outside rows. It is the farm\'s own record for the acreage visit, not a determination: the local FSA office determines acreage.',
			9
		);
	});
}
