// Crop acreage report: acres by field and crop from a season's stored lanes, with the acres that
// count where rows stand wider than 40 in. Pure: the server reads lanes and planting records and
// passes them in. The local USDA Farm Service Agency office determines official acreage; this is
// the farm's own worksheet for the visit.
import { TZDate } from '@date-fns/tz';
import { creditedRowFraction } from '../agronomy/index';

export type LaneKindName = 'crop' | 'pasture' | 'cover' | 'buffer';

export interface AcreageLane {
	kind: LaneKindName;
	crop: string;
	widthFt: number;
	rows: number;
	acres: number;
}

export interface AcreageField {
	fieldId: string;
	fieldName: string;
	farmNumber: string | null;
	tractNumber: string | null;
	fieldNumber: string | null;
	landlord: string | null;
	lanes: AcreageLane[];
	/** Start of the first planting record per crop (crop name in lower case). */
	plantingStarts: Record<string, Date>;
}

export type Practice = 'strips' | 'wide rows' | 'solid' | 'pasture' | 'cover' | 'buffer';

export interface AcreageRow {
	fieldId: string;
	fieldName: string;
	crop: string;
	plantedAcres: number;
	creditedAcres: number;
	practice: Practice;
	intendedUse: string;
	/** Widest row spacing among the crop's lanes, inches; null where lanes have no rows. */
	rowSpacingIn: number | null;
	plantingDate: string | null;
	farmNumber: string | null;
	tractNumber: string | null;
	fieldNumber: string | null;
	landlord: string | null;
}

export interface AcreTotals {
	plantedAcres: number;
	creditedAcres: number;
}

export interface AcreageReport {
	season: number;
	rows: AcreageRow[];
	totals: Record<string, AcreTotals>;
	/** Landlord (or "Owned / no landlord") → crop → acres. */
	byLandlord: Record<string, Record<string, AcreTotals>>;
	warnings: string[];
}

export const NO_LANDLORD = 'No landlord named';

/** Acres to two decimals, as acreage reports carry them. */
export const roundAcres = (acres: number) => Math.round(acres * 100) / 100;

/**
 * Row spacing of a lane, inches: lane width over its rows (a twin pair counts as one row, so this
 * is the centre spacing of the pairs). Null for lanes without rows (pasture, cover, buffer).
 */
export function laneRowSpacingIn(lane: Pick<AcreageLane, 'widthFt' | 'rows'>): number | null {
	return lane.rows > 0 && lane.widthFt > 0 ? (lane.widthFt * 12) / lane.rows : null;
}

/**
 * Acres of a lane that count as planted to its crop: where rows are more than 40 in apart each row
 * is credited at most 40 in (7 CFR 718.108). Lanes without rows count whole.
 */
export function creditedLaneAcres(lane: AcreageLane): number {
	const spacing = lane.kind === 'crop' ? laneRowSpacingIn(lane) : null;
	return spacing === null ? lane.acres : lane.acres * creditedRowFraction(spacing);
}

/** What the crop is grown for, in the words of the acreage report (common practice). */
export function intendedUse(kind: LaneKindName): string {
	switch (kind) {
		case 'crop':
			return 'grain';
		case 'pasture':
			return 'grazing';
		case 'cover':
			return 'cover only';
		default:
			return 'left standing';
	}
}

function practiceOf(kind: LaneKindName, widest: number | null, cropsInField: number): Practice {
	if (kind === 'pasture' || kind === 'cover' || kind === 'buffer') return kind;
	if (widest !== null && widest > 40) return 'wide rows';
	return cropsInField > 1 ? 'strips' : 'solid';
}

/** A calendar day (yyyy-mm-dd) in the farm's time zone. */
export function dayInZone(instant: Date, timeZone: string): string {
	const d = new TZDate(instant.getTime(), timeZone);
	const pad = (n: number) => String(n).padStart(2, '0');
	return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}`;
}

function add(into: Record<string, AcreTotals>, crop: string, planted: number, credited: number) {
	const t = (into[crop] ??= { plantedAcres: 0, creditedAcres: 0 });
	t.plantedAcres += planted;
	t.creditedAcres += credited;
}

function roundTotals(t: Record<string, AcreTotals>): Record<string, AcreTotals> {
	return Object.fromEntries(Object.entries(t).map(([k, v]) => [k, { plantedAcres: roundAcres(v.plantedAcres), creditedAcres: roundAcres(v.creditedAcres) }]));
}

/**
 * Builds the report: one row per field and crop (in field order, crops by name), totals per crop
 * and per landlord summed from the unrounded lane acres, and a warning for every field whose
 * crops have no planting record.
 *
 * @example
 * buildAcreageReport(2027, [field], 'America/Chicago').totals.corn.creditedAcres
 */
export function buildAcreageReport(season: number, fields: AcreageField[], timeZone: string): AcreageReport {
	const rows: AcreageRow[] = [];
	const totals: Record<string, AcreTotals> = {};
	const byLandlord: Record<string, Record<string, AcreTotals>> = {};
	const warnings: string[] = [];
	for (const field of fields) {
		const groups = new Map<string, AcreageLane[]>();
		for (const lane of field.lanes) {
			const crop = lane.crop.trim() || lane.kind;
			const list = groups.get(crop) ?? [];
			list.push(lane);
			groups.set(crop, list);
		}
		const unplanted: string[] = [];
		for (const [crop, lanes] of [...groups.entries()].sort(([a], [b]) => a.localeCompare(b))) {
			const kind = lanes.some((l) => l.kind === 'crop') ? 'crop' : lanes[0].kind;
			const planted = lanes.reduce((s, l) => s + l.acres, 0);
			const credited = lanes.reduce((s, l) => s + creditedLaneAcres(l), 0);
			const spacings = lanes.filter((l) => l.kind === 'crop').map(laneRowSpacingIn).filter((s): s is number => s !== null);
			const widest = spacings.length ? Math.max(...spacings) : null;
			const start = field.plantingStarts[crop.toLowerCase()];
			if (kind === 'crop' && !start) unplanted.push(crop);
			rows.push({
				fieldId: field.fieldId,
				fieldName: field.fieldName,
				crop,
				plantedAcres: roundAcres(planted),
				creditedAcres: roundAcres(credited),
				practice: practiceOf(kind, widest, groups.size),
				intendedUse: intendedUse(kind),
				rowSpacingIn: widest === null ? null : Math.round(widest * 10) / 10,
				plantingDate: start ? dayInZone(start, timeZone) : null,
				farmNumber: field.farmNumber,
				tractNumber: field.tractNumber,
				fieldNumber: field.fieldNumber,
				landlord: field.landlord
			});
			add(totals, crop, planted, credited);
			add((byLandlord[field.landlord?.trim() || NO_LANDLORD] ??= {}), crop, planted, credited);
		}
		if (unplanted.length) {
			warnings.push(`${field.fieldName}: no planting record for ${unplanted.join(', ')} in ${season}; log the planting in the record book so the report carries its date.`);
		}
	}
	return {
		season,
		rows,
		totals: roundTotals(totals),
		byLandlord: Object.fromEntries(Object.entries(byLandlord).map(([k, v]) => [k, roundTotals(v)])),
		warnings
	};
}

const CSV_COLUMNS: [keyof AcreageRow, string][] = [
	['farmNumber', 'Farm number'],
	['tractNumber', 'Tract number'],
	['fieldNumber', 'Field number'],
	['fieldName', 'Field'],
	['landlord', 'Landlord'],
	['crop', 'Crop'],
	['intendedUse', 'Intended use'],
	['practice', 'Practice'],
	['rowSpacingIn', 'Row spacing (in)'],
	['plantingDate', 'Planting date'],
	['plantedAcres', 'Planted (ac)'],
	['creditedAcres', 'Credited (ac)']
];

/** A spreadsheet cell: quoted when needed, and text that a spreadsheet would run as a formula defused. */
export function csvCell(value: unknown): string {
	let text = value === null || value === undefined ? '' : String(value);
	if (/^[=+\-@\t\r]/.test(text) && typeof value === 'string') text = `'${text}`;
	return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** The report as CSV (RFC 4180, CRLF line ends): a header, one line per row, then crop totals. */
export function acreageCsv(report: AcreageReport): string {
	const lines = [CSV_COLUMNS.map(([, label]) => csvCell(label)).join(',')];
	for (const row of report.rows) lines.push(CSV_COLUMNS.map(([key]) => csvCell(row[key])).join(','));
	for (const [crop, t] of Object.entries(report.totals).sort(([a], [b]) => a.localeCompare(b))) {
		lines.push(CSV_COLUMNS.map(([key]) => csvCell(key === 'fieldName' ? 'Total' : key === 'crop' ? crop : key === 'plantedAcres' ? t.plantedAcres : key === 'creditedAcres' ? t.creditedAcres : '')).join(','));
	}
	return lines.join('\r\n') + '\r\n';
}
