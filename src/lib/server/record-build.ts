// Turns a record as sent into the rows to store: lanes copied from the season's adopted plan,
// product lines with their label data copied, totals, warnings and the restricted-use check.
// Every refusal is a 400 naming the input at fault.
import type { Knex } from 'knex';
import { TZDate } from '@date-fns/tz';
import { AppError, invalid } from './errors';
import type { FarmAccess } from './access';
import { laneAcresCovered, productTotal, rateWarning, unitMismatchWarning, type LanePart } from '../records/amounts';
import { rupMissing } from '../records/restricted-use';
import { laneListText } from '../records/format';

export { laneListText };

/** Completed work may be dated this far ahead of the server clock (clocks of phones drift). */
export const FUTURE_TOLERANCE_MS = 10 * 60_000;

export interface LaneCopy {
	laneIndex: number;
	kind: string;
	crop: string;
	laneAcres: number;
	acres: number;
	fromFt: number | null;
	toFt: number | null;
	geometry: unknown;
}

export interface ProductCopy {
	position: number;
	productId: string;
	productName: string;
	epaRegNo: string | null;
	restrictedUse: boolean;
	reiHours: number | null;
	phiDays: number | null;
	grazingDays: number | null;
	rate: number;
	rateUnit: string;
	total: number;
	totalUnit: string;
}

export interface RecordWarning {
	field: string;
	message: string;
}

const round = (n: number, places: number) => Math.round(n * 10 ** places) / 10 ** places;

/** End after start, not in the future, and within a year of the season either side. */
export function checkTimes(startedAt: Date, endedAt: Date, season: number, timeZone: string, now = new Date()) {
	const fields: Record<string, string[]> = {};
	if (endedAt.getTime() < startedAt.getTime()) fields.endedAt = ['The work cannot end before it started.'];
	if (endedAt.getTime() > now.getTime() + FUTURE_TOLERANCE_MS) {
		(fields.endedAt ??= []).push('This is a record of work done: its end cannot be in the future.');
	}
	const year = new TZDate(endedAt.getTime(), timeZone).getFullYear();
	if (year < season - 1 || year > season + 1) {
		(fields.endedAt ??= []).push(`Work ending in ${year} does not belong to the ${season} season (the year before, during or after it).`);
	}
	if (Object.keys(fields).length) throw invalid('The dates of this record do not add up; see fields.', fields);
}

/**
 * The adopted plan of the season and copies of the chosen lanes (with part-lane acres). Lanes the
 * plan does not have are refused by number; a season without an adopted plan is refused too.
 */
export async function copyLanes(
	q: Knex,
	access: FarmAccess,
	fieldId: string,
	season: number,
	laneIndexes: number[],
	parts: (LanePart & { laneIndex: number })[] = []
): Promise<{ planId: string; planVersion: number; lanes: LaneCopy[] }> {
	const plan = await q('plans')
		.where({ farm_id: access.farm.id, field_id: fieldId, season, adopted: true })
		.whereNull('deleted_at')
		.first('id', 'version');
	if (!plan) {
		throw new AppError(400, `There is no adopted plan for ${season} on this field, so there are no lanes to record on. Lay out and adopt the ${season} plan first.`, 'no_plan', {
			laneIndexes: [`No adopted ${season} plan.`]
		});
	}
	const wanted = [...new Set(laneIndexes)].sort((a, b) => a - b);
	const rows = await q('plan_lanes')
		.where({ plan_id: plan.id })
		.whereIn('lane_index', wanted)
		.orderBy('lane_index')
		.select('lane_index', 'kind', 'crop', 'acres', 'width_ft', 'geometry');
	const found = new Set(rows.map((r) => r.lane_index as number));
	const missing = wanted.filter((i) => !found.has(i));
	if (missing.length) {
		const count = Number((await q('plan_lanes').where({ plan_id: plan.id }).count('* as n').first())?.n ?? 0);
		const named = missing.map((i) => `${i} (lane ${i + 1})`).join(', ');
		const message = `Lane index${missing.length > 1 ? 'es' : ''} ${named} ${missing.length > 1 ? 'are' : 'is'} not in the ${season} plan, which has lanes 1 to ${count} (indexes 0 to ${count - 1}).`;
		throw invalid(message, { laneIndexes: [message] });
	}
	const partOf = new Map<number, LanePart>();
	const partErrors: string[] = [];
	for (const p of parts) {
		if (!found.has(p.laneIndex)) partErrors.push(`Lane ${p.laneIndex + 1} has a part but is not among the chosen lanes.`);
		else if (partOf.has(p.laneIndex)) partErrors.push(`Lane ${p.laneIndex + 1} has two parts; record them separately.`);
		else partOf.set(p.laneIndex, { fromFt: p.fromFt, toFt: p.toFt });
	}
	const lanes: LaneCopy[] = [];
	for (const r of rows) {
		const part = partOf.get(r.lane_index) ?? null;
		let acres = Number(r.acres);
		try {
			acres = laneAcresCovered({ laneIndex: r.lane_index, acres: Number(r.acres), widthFt: Number(r.width_ft) }, part);
		} catch (e) {
			if (!(e instanceof RangeError)) throw e;
			partErrors.push(e.message);
		}
		lanes.push({ laneIndex: r.lane_index, kind: r.kind, crop: r.crop, laneAcres: Number(r.acres), acres, fromFt: part?.fromFt ?? null, toFt: part?.toFt ?? null, geometry: r.geometry });
	}
	if (partErrors.length) throw invalid('A part of a lane is not right; see fields.', { laneParts: partErrors });
	return { planId: plan.id, planVersion: plan.version, lanes };
}

/** Sum of the lane copies' acres, as stored (4 places). */
export function acresOf(lanes: Pick<LaneCopy, 'acres'>[]): number {
	return round(lanes.reduce((s, l) => s + l.acres, 0), 4);
}

/**
 * Product lines with the label data of each product as it stands now, totals for `acres`, and
 * warnings for rates above the usual most. A product of another farm, a deleted one or an unknown
 * id are refused alike, on the line that names it.
 */
export async function copyProducts(q: Knex, access: FarmAccess, lines: { productId: string; rate: number; rateUnit: string }[], acres: number): Promise<{ products: ProductCopy[]; warnings: RecordWarning[] }> {
	if (!lines.length) return { products: [], warnings: [] };
	const ids = [...new Set(lines.map((l) => l.productId))];
	const rows = await q('products')
		.where({ farm_id: access.farm.id })
		.whereIn('id', ids)
		.whereNull('deleted_at')
		.select('id', 'name', 'unit', 'epa_reg_no', 'restricted_use', 'rei_hours', 'phi_days', 'grazing_days');
	const byId = new Map(rows.map((r) => [r.id as string, r]));
	const fields: Record<string, string[]> = {};
	lines.forEach((l, i) => {
		if (!byId.has(l.productId)) fields[`products.${i}.productId`] = ['No such product in this farm\'s product list. Pick one from the list (or add it there first).'];
	});
	if (Object.keys(fields).length) throw invalid('A product line names a product this farm does not have; see fields.', fields);
	const warnings: RecordWarning[] = [];
	const products = lines.map((l, i): ProductCopy => {
		const p = byId.get(l.productId)!;
		const t = productTotal(l.rate, l.rateUnit, acres);
		const warning = rateWarning(l.rate, l.rateUnit);
		if (warning) warnings.push({ field: `products.${i}.rate`, message: warning });
		const mismatch = unitMismatchWarning(p.name, p.unit, l.rateUnit);
		if (mismatch) warnings.push({ field: `products.${i}.rateUnit`, message: mismatch });
		return {
			position: i,
			productId: l.productId,
			productName: p.name,
			epaRegNo: p.epa_reg_no,
			restrictedUse: p.restricted_use,
			reiHours: p.rei_hours == null ? null : Number(p.rei_hours),
			phiDays: p.phi_days,
			grazingDays: p.grazing_days,
			rate: l.rate,
			rateUnit: `${t.totalUnit}/ac`,
			total: round(t.total, 4),
			totalUnit: t.totalUnit
		};
	});
	return { products, warnings };
}

/** Totals of stored product lines again for new acres; the label copies stay as they were logged. */
export function retotal(products: ProductCopy[], acres: number): ProductCopy[] {
	return products.map((p) => ({ ...p, total: round(productTotal(p.rate, p.rateUnit, acres).total, 4) }));
}

/** Where the work was, in words for the restricted-use record: the field, its numbers, the lanes. */
export function locationText(field: { name: string; farmNumber: string | null; tractNumber: string | null; fieldNumber: string | null }, lanes: Pick<LaneCopy, 'laneIndex'>[]): string {
	const numbers = [field.farmNumber && `farm ${field.farmNumber}`, field.tractNumber && `tract ${field.tractNumber}`, field.fieldNumber && `field ${field.fieldNumber}`].filter(Boolean);
	return `${field.name}${numbers.length ? ` (${numbers.join(', ')})` : ''}, ${laneListText(lanes.map((l) => l.laneIndex))}`;
}

/** Refuses a restricted-use record that lacks any element the federal rule requires. */
export function requireRupComplete(input: { products: ProductCopy[]; location: string; acres: number; lanes: LaneCopy[]; endedAt: Date; applicator: string | null; applicatorCertNumber: string | null }) {
	const fields = rupMissing({
		products: input.products.map((p) => ({ position: p.position, restrictedUse: p.restrictedUse, productName: p.productName, epaRegNo: p.epaRegNo, total: p.total })),
		location: input.location,
		acres: input.acres,
		crops: input.lanes.map((l) => l.crop),
		endedAt: input.endedAt,
		applicator: input.applicator,
		applicatorCertNumber: input.applicatorCertNumber
	});
	if (Object.keys(fields).length) {
		throw new AppError(400, 'A restricted-use pesticide record must hold every element 7 CFR 110.3 requires; see fields.', 'rup_incomplete', fields);
	}
}
