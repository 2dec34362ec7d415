// What a restricted-use pesticide record must hold, and whether it was kept in time. Pure.
import { restrictionEndsInZone } from '../agronomy/index';

export interface RupProductLine {
	position: number;
	restrictedUse: boolean;
	productName: string;
	epaRegNo: string | null;
	total: number | null;
}

export interface RupRecord {
	products: RupProductLine[];
	/** Where: the field's name (and its farm/tract/field numbers when kept), with the lanes as mapped. */
	location: string | null;
	acres: number;
	crops: string[];
	endedAt: Date | null;
	applicator: string | null;
	applicatorCertNumber: string | null;
}

const blank = (s: string | null | undefined) => !s || !s.trim();

/** Whether any product line of the record is a restricted-use pesticide. */
export function isRestrictedUse(products: Pick<RupProductLine, 'restrictedUse'>[]): boolean {
	return products.some((p) => p.restrictedUse);
}

/**
 * Field errors for every element 7 CFR 110.3 requires of a restricted-use pesticide record that is
 * missing: product name and EPA registration number, total amount applied, location, size of the
 * area treated and the crop or site, the date, and the certified applicator's name and
 * certification number. Empty when the record holds them all, or holds no restricted-use product.
 * Keys are the API's input names.
 */
export function rupMissing(r: RupRecord): Record<string, string[]> {
	const fields: Record<string, string[]> = {};
	if (!isRestrictedUse(r.products)) return fields;
	const add = (key: string, message: string) => (fields[key] ??= []).push(message);
	const rule = 'a restricted-use pesticide record needs it (7 CFR 110.3)';
	if (blank(r.applicator)) add('applicator', `Name the certified applicator: ${rule}.`);
	if (blank(r.applicatorCertNumber)) add('applicatorCertNumber', `Give the applicator's certification number: ${rule}.`);
	for (const p of r.products) {
		if (!p.restrictedUse) continue;
		if (blank(p.productName)) add(`products.${p.position}.productId`, `The product has no name: ${rule}.`);
		if (blank(p.epaRegNo)) add(`products.${p.position}.productId`, `"${p.productName}" has no EPA registration number in the product list; add it there first: ${rule}.`);
		if (!(p.total != null && p.total > 0)) add(`products.${p.position}.rate`, `The total amount applied is missing: ${rule}.`);
	}
	if (blank(r.location)) add('laneIndexes', `The location treated is missing: ${rule}.`);
	if (!(r.acres > 0)) add('laneIndexes', `The size of the area treated is missing: ${rule}.`);
	if (!r.crops.some((c) => !blank(c))) add('laneIndexes', `The crop or site treated is missing: ${rule}.`);
	if (!r.endedAt) add('endedAt', `The date of application is missing: ${rule}.`);
	return fields;
}

/** Days allowed between the application and a complete record (7 CFR 110.3: within 14 days). */
export const RUP_RECORD_DAYS = 14;

/**
 * Whether a restricted-use record was completed late: the record first held every required
 * element (`completedAt`, kept when it was saved) after the same clock time 14 calendar days
 * past the end of the application, counted in the farm's time zone.
 */
export function rupRecordedLate(endedAt: Date, completedAt: Date, timeZone: string): boolean {
	return completedAt.getTime() > restrictionEndsInZone(endedAt, { days: RUP_RECORD_DAYS }, timeZone).getTime();
}
